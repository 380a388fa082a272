import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { theme } from '../../config/theme';
import { renderWithProviders } from '../../testing/render-app';
import { UnitToggle } from './unit-toggle';

/** WCAG 2.1 relative luminance of an sRGB colour given as rgb()/rgba() or #rrggbb, over a background. */
function rgbOf(colour: string, over?: [number, number, number]): [number, number, number] {
  const hex = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(colour);
  if (hex) return [1, 2, 3].map((i) => parseInt(hex[i]!, 16)) as [number, number, number];
  const parts = /rgba?\(([^)]+)\)/
    .exec(colour)?.[1]
    ?.split(',')
    .map((p) => Number(p.trim()));
  if (!parts || parts.length < 3) throw new Error(`not a colour: ${colour}`);
  const [r, g, b, a = 1] = parts as [number, number, number, number?];
  if (a === 1 || !over) return [r, g, b];
  return [r, g, b].map((c, i) => c * a + over[i]! * (1 - a)) as [number, number, number];
}
function luminance([r, g, b]: [number, number, number]): number {
  const lin = (c: number) => {
    const s = c / 255;
    return s <= 0.04045 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * lin(r) + 0.7152 * lin(g) + 0.0722 * lin(b);
}
function contrast(a: [number, number, number], b: [number, number, number]): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x) as [number, number];
  return (hi + 0.05) / (lo + 0.05);
}

describe('UnitToggle', () => {
  it('writes the unit not chosen at 4.5:1 or more on the page background (WCAG 2.1, 1.4.3)', () => {
    renderWithProviders(<UnitToggle unit="mm" onUnit={() => undefined} />);
    const inch = screen.getByRole('button', { name: 'inch' });
    expect(inch).toHaveAttribute('aria-pressed', 'false');
    const page = rgbOf(theme.palette.background.default);
    const text = rgbOf(getComputedStyle(inch).color, page);
    // The contrast formula and the 4.5:1 minimum for normal text: WCAG 2.1, 1.4.3 and its definitions.
    expect(contrast(text, page)).toBeGreaterThanOrEqual(4.5);
  });
});
