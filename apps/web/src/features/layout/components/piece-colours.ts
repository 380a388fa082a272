/** Stock colours shown on screen, by colour index of the colour plan (our own palette, light to dark). */
export const PIECE_COLOURS = ['#d9b98c', '#3f6e8c', '#b8643a', '#6f8f5a', '#8a6f9e', '#c9a227'] as const;

export function pieceColour(index: number | undefined): string {
  return PIECE_COLOURS[(index ?? 0) % PIECE_COLOURS.length] ?? PIECE_COLOURS[0];
}
