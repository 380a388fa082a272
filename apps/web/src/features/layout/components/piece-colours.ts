import colorName from 'color-name';

/** Stock colours shown on screen, by colour index of the colour plan (our own palette, light to dark). */
export const PIECE_COLOURS = ['#d9b98c', '#3f6e8c', '#b8643a', '#6f8f5a', '#8a6f9e', '#c9a227'] as const;

export function pieceColour(index: number | undefined): string {
  return PIECE_COLOURS[(index ?? 0) % PIECE_COLOURS.length] ?? PIECE_COLOURS[0];
}

/** The named colours of CSS (CSS Color Module Level 4, "named colors"), which SVG draws by name: color-name. */
const CSS_NAMED_COLOURS: ReadonlySet<string> = new Set(Object.keys(colorName));

/**
 * Stock colours that sheet materials are commonly sold in but CSS has no name for, as sRGB hex (values from
 * memory of common colour references, for the on-screen preview only; nothing is cut by them). Looked up by the
 * whole name before CSS's last-word fallback, so "moss green" is not drawn as pure green.
 */
const STOCK_COLOURS: Readonly<Record<string, string>> = {
  amber: '#ffbf00',
  charcoal: '#36454f',
  cobaltblue: '#0047ab',
  cream: '#fffdd0',
  mossgreen: '#8a9a5b',
  mustard: '#ffdb58',
  natural: '#d8b98c',
  oatmeal: '#d9cdb4',
  ochre: '#cc7722',
  saffron: '#f4c430',
  terracotta: '#e2725b',
};

/**
 * How a stock colour named by a job (a material's colour: "teal", "slate grey", "cobalt blue") is drawn: a CSS
 * named colour by its name (spaces and dashes left out, so "slate grey" is slategrey); else a common stock
 * colour CSS lacks ("charcoal", "saffron", "moss green"); else the named colour its last word gives ("opal
 * white" is white); else, for a name neither knows ("clear", "opal"), our palette colour of the colour index.
 */
export function stockColour(name: string | null | undefined, index: number | undefined): string {
  const words = (name ?? '')
    .toLowerCase()
    .split(/[\s_-]+/)
    .filter(Boolean);
  const whole = words.join('');
  if (CSS_NAMED_COLOURS.has(whole)) return whole;
  const stock = STOCK_COLOURS[whole];
  if (stock) return stock;
  const last = words.at(-1);
  if (last !== undefined && CSS_NAMED_COLOURS.has(last)) return last;
  return pieceColour(index);
}
