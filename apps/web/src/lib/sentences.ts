/**
 * A reason typed by a person, ended as a sentence: its own full stop (or question or exclamation mark) is kept,
 * and one is added when it has none, so the text after it does not run on ("Wrong stock Put that right") nor
 * stop twice ("…delivery.”.").
 */
export function withFullStop(text: string): string {
  const t = text.trim();
  return /[.!?…]["'”’)]*$/.test(t) ? t : `${t}.`;
}
