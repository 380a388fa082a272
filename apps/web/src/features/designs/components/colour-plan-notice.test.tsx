import { screen } from '@testing-library/react';
import { solveColourPlan } from '@kerfwright/geometry';
import { describe, expect, it, vi } from 'vitest';
import { renderWithProviders } from '../../../testing/render-app';
import { ColourPlanNotice } from './colour-plan-notice';

// The four faces of a tetrahedron all share edges with each other (derived): no two may match.
const tetrahedron = {
  faceCount: 4,
  faceVertices: [
    [0, 1, 2],
    [0, 1, 3],
    [0, 2, 3],
    [1, 2, 3],
  ],
  rule: 'neighbour-distinct' as const,
};

describe('colour plan notice', () => {
  it('offers the fewest colours the engine found for the rule', async () => {
    const plan = solveColourPlan({ ...tetrahedron, count: 2, countCap: 0 });
    expect(plan.feasible).toBe(false);
    const onUse = vi.fn();
    const { user } = renderWithProviders(
      <ColourPlanNotice
        message={plan.message ?? ''}
        fewest={plan.fewestColours ?? null}
        maxColours={6}
        onUseColours={onUse}
      />,
    );
    // The rule is named as the form names it; the engine's wording and rule id stay out of sight.
    const notice = screen.getByTestId('colour-plan-notice');
    expect(notice).toHaveTextContent(
      '“Neighbours differ” cannot be met with 2 colours: it needs at least 4.',
    );
    expect(notice).not.toHaveTextContent(/no plan exists|neighbour-distinct/);
    await user.click(screen.getByRole('button', { name: 'Use 4 colours' }));
    expect(onUse).toHaveBeenCalledWith(4);
  });

  it('offers nothing the form would refuse', () => {
    renderWithProviders(
      <ColourPlanNotice
        message={'no plan exists: rule "vertex-distinct" cannot be met with 1 colour; it needs at least 8'}
        fewest={8}
        maxColours={6}
        onUseColours={() => undefined}
      />,
    );
    expect(screen.getByTestId('colour-plan-notice')).toHaveTextContent(
      '“All pieces around a vertex differ” cannot be met with 1 colour: it needs at least 8.',
    );
    expect(screen.queryByRole('button')).not.toBeInTheDocument();
  });

  it('shows a reason of another shape as a plain sentence', () => {
    renderWithProviders(<ColourPlanNotice message="no plan exists" fewest={null} maxColours={6} />);
    expect(screen.getByTestId('colour-plan-notice')).toHaveTextContent(
      'The colour rule cannot be met with these colours.',
    );
  });
});
