import { type FieldValues, type Path, type RegisterOptions } from 'react-hook-form';
import { bindField, type BoundFieldProps, FormTextField } from './form-text-field';

const AS_NUMBER = { valueAsNumber: true } as const;

type NumberFieldProps<T extends FieldValues> = Omit<BoundFieldProps<T>, 'type' | 'slotProps'> & {
  /** How the typed text becomes the value: a number (NaN when empty) unless given. */
  rules?: RegisterOptions<T, Path<T>>;
  /** Whole numbers only (the browser's default step of 1); otherwise any decimal is accepted. */
  integer?: boolean;
};

/** A number input wired to react-hook-form, with the field's validation message under it. */
export function NumberField<T extends FieldValues>({
  form,
  name,
  rules = AS_NUMBER,
  integer = false,
  ...props
}: NumberFieldProps<T>) {
  return (
    <FormTextField
      {...props}
      {...bindField(form, name, rules)}
      type="number"
      slotProps={integer ? undefined : { htmlInput: { step: 'any' } }}
    />
  );
}
