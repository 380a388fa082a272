/** "1 piece", "3 pieces": a count with its noun, plural unless the count is one (English). */
export function countOf(n: number, noun: string, plural = `${noun}s`): string {
  return `${n} ${n === 1 ? noun : plural}`;
}
