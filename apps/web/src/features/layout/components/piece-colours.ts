import colorName from 'color-name';

/** Stock colours shown on screen, by colour index of the colour plan (our own palette, light to dark). */
export const PIECE_COLOURS = ['#d9b98c', '#3f6e8c', '#b8643a', '#6f8f5a', '#8a6f9e', '#c9a227'] as const;

export function pieceColour(index: number | undefined): string {
  return PIECE_COLOURS[(index ?? 0) % PIECE_COLOURS.length] ?? PIECE_COLOURS[0];
}

/** The named colours of CSS (CSS Color Module Level 4, "named colors"), which SVG draws by name: color-name. */
const CSS_NAMED_COLOURS: ReadonlySet<string> = new Set(Object.keys(colorName));

/**
 * How a stock colour named by a job (a material's colour: "teal", "slate grey", "cobalt blue") is drawn: a CSS
 * named colour by its name (spaces and dashes left out, so "slate grey" is slategrey); else the named colour
 * its last word gives ("cobalt blue" is blue, "opal white" white); else, for a name CSS has no colour for
 * ("clear", "natural", "saffron"), our palette colour of the colour index.
 */
export function stockColour(name: string | null | undefined, index: number | undefined): string {
  const words = (name ?? '')
    .toLowerCase()
    .split(/[\s_-]+/)
    .filter(Boolean);
  const whole = words.join('');
  if (CSS_NAMED_COLOURS.has(whole)) return whole;
  const last = words.at(-1);
  if (last !== undefined && CSS_NAMED_COLOURS.has(last)) return last;
  return pieceColour(index);
}
