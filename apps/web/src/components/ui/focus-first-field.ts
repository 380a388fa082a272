/** The fields a dialog's first focus may go to (not MUI's hidden sizing textarea, not a disabled field). */
const FIELD =
  'input:not([type=hidden]):not([type=checkbox]):not([type=radio]):not([disabled]):not([aria-hidden="true"]),' +
  'textarea:not([disabled]):not([aria-hidden="true"]):not([readonly]),' +
  'select:not([disabled])';

/**
 * Puts the keyboard in a dialog's first field once the dialog has opened (its transition's onEntered, after
 * the form has been reset for this opening), so what is typed goes where it is meant to. A number is
 * selected, so typing replaces it ("2", not "12" after the "1" it starts with); in text the caret goes to
 * the end, so nothing already written is lost by a keystroke. Focus already in a field is left alone.
 */
export function focusFirstField(node: HTMLElement): void {
  const field = node.querySelector<HTMLInputElement | HTMLTextAreaElement | HTMLSelectElement>(FIELD);
  if (!field) return;
  // Someone quicker is in a field already (typing, perhaps): leave them there, their text as it is.
  const active = node.ownerDocument.activeElement;
  if (active && node.contains(active) && active.matches(FIELD)) return;
  field.focus();
  if (field instanceof HTMLInputElement && field.type === 'number') field.select();
  else if (field instanceof HTMLInputElement || field instanceof HTMLTextAreaElement) {
    const end = field.value.length;
    field.setSelectionRange(end, end);
  }
}
