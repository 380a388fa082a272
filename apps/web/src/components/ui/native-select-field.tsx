import { type FieldValues } from 'react-hook-form';
import { bindField, type BoundFieldProps, FormTextField } from './form-text-field';

/**
 * The browser's own select, its label always above the field: the select shows an option's text even when
 * its value is empty ("Choose…"), so a label left inside would overlap it.
 */
export const NATIVE_SELECT = { select: { native: true }, inputLabel: { shrink: true } } as const;

/** A select of the browser's own `<option>` children, wired to react-hook-form like FormTextField. */
export function NativeSelectField<T extends FieldValues>({
  form,
  name,
  ...props
}: Omit<BoundFieldProps<T>, 'select' | 'slotProps'>) {
  return <FormTextField {...props} {...bindField(form, name)} select slotProps={NATIVE_SELECT} />;
}
