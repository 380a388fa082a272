import { render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { useScrollFocus } from './use-scroll-focus';

function Box({ label }: { label: string }) {
  const focus = useScrollFocus(label);
  return (
    <div data-testid="box" {...focus}>
      <table aria-label={label} />
    </div>
  );
}

/** jsdom lays nothing out: the box's content is said to be `contentPx` wide in a box of 320 px. */
function layOut(contentPx: number) {
  vi.spyOn(HTMLElement.prototype, 'scrollWidth', 'get').mockReturnValue(contentPx);
  vi.spyOn(HTMLElement.prototype, 'clientWidth', 'get').mockReturnValue(320);
}

describe('useScrollFocus', () => {
  afterEach(() => vi.restoreAllMocks());

  // axe-core's rule scrollable-region-focusable (WCAG 2.1, 2.1.1): a box that scrolls must be reachable by keyboard.
  it('makes a box whose content is wider than it a named region the keyboard can focus', () => {
    layOut(600);
    render(<Box label="History" />);
    const box = screen.getByTestId('box');
    expect(box).toHaveAttribute('tabindex', '0');
    expect(screen.getByRole('region', { name: 'History' })).toBe(box);
  });

  it('leaves a box whose content fits out of the tab order', () => {
    layOut(320);
    render(<Box label="History" />);
    const box = screen.getByTestId('box');
    expect(box).not.toHaveAttribute('tabindex');
    expect(screen.queryByRole('region')).toBeNull();
  });
});

describe('useScrollFocus on a box shown later', () => {
  afterEach(() => vi.restoreAllMocks());

  function Later({ shown }: { shown: boolean }) {
    const focus = useScrollFocus('Cut pack files');
    return shown ? <div data-testid="box" {...focus} /> : <p>Loading…</p>;
  }

  it('watches a box that appears after the first render (rows loaded)', () => {
    layOut(600);
    const { rerender } = render(<Later shown={false} />);
    rerender(<Later shown />);
    expect(screen.getByRole('region', { name: 'Cut pack files' })).toHaveAttribute('tabindex', '0');
  });
});
