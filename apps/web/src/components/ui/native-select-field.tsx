import { type FieldValues } from 'react-hook-form';
import { bindField, type BoundFieldProps, FormTextField } from './form-text-field';

const NATIVE = { select: { native: true } } as const;

/** A select of the browser's own `<option>` children, wired to react-hook-form like FormTextField. */
export function NativeSelectField<T extends FieldValues>({
  form,
  name,
  ...props
}: Omit<BoundFieldProps<T>, 'select' | 'slotProps'>) {
  return <FormTextField {...props} {...bindField(form, name)} select slotProps={NATIVE} />;
}
