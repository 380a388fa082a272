/** The fields a dialog's first focus may go to (not MUI's hidden sizing textarea, not a disabled field). */
const FIELD =
  'input:not([type=hidden]):not([type=checkbox]):not([type=radio]):not([disabled]):not([aria-hidden="true"]),' +
  'textarea:not([disabled]):not([aria-hidden="true"]):not([readonly]),' +
  'select:not([disabled])';

function firstField(node: HTMLElement) {
  return node.querySelector<HTMLInputElement | HTMLTextAreaElement | HTMLSelectElement>(FIELD);
}

/** A number selected, so typing replaces it; in text the caret at the end, so nothing written is lost. */
function prepare(field: HTMLInputElement | HTMLTextAreaElement | HTMLSelectElement): void {
  if (field instanceof HTMLInputElement && field.type === 'number') field.select();
  else if (field instanceof HTMLInputElement || field instanceof HTMLTextAreaElement) {
    const end = field.value.length;
    field.setSelectionRange(end, end);
  }
}

/**
 * Puts the keyboard in a container's first field: a number selected ("2" typed over the "1" a field starts
 * with gives 2, not 12), the caret at the end of text. Focus already in another of its fields is left alone.
 */
export function focusFirstField(node: HTMLElement): void {
  const field = firstField(node);
  if (!field) return;
  const active = node.ownerDocument.activeElement;
  if (active && active !== field && node.contains(active) && active.matches(FIELD)) return;
  field.focus();
  prepare(field);
}

/** Dialogs whose first field someone typed into since it opened (their text is theirs from then on). */
const typedIn = new WeakSet<HTMLElement>();

/**
 * A dialog's transition handlers that put the keyboard in its first field: as soon as it opens (onEnter, so
 * nothing typed at once is lost to the dialog box), and again once the opening is over (onEntered), when
 * the form's start may have rewritten the field, unless a key was pressed meanwhile.
 */
export const FOCUS_FIRST_FIELD_ON_OPEN = {
  onEnter: (node: HTMLElement) => {
    typedIn.delete(node);
    node.addEventListener('keydown', () => typedIn.add(node), { once: true });
    focusFirstField(node);
  },
  onEntered: (node: HTMLElement) => {
    if (!typedIn.has(node)) focusFirstField(node);
  },
};
