/** Styles for text read by screen readers and not shown (a table column's name over its buttons, say). */
export const SCREEN_READER_ONLY = {
  position: 'absolute',
  // Pixels, not sx's fractions: `width: 1` would mean 100 %.
  width: '1px',
  height: '1px',
  overflow: 'hidden',
  clip: 'rect(0 0 0 0)',
  whiteSpace: 'nowrap',
} as const;
