import TextField, { type TextFieldProps } from '@mui/material/TextField';
import {
  type FieldError,
  type FieldErrors,
  type FieldValues,
  get,
  type Path,
  type RegisterOptions,
  type UseFormRegister,
  type UseFormRegisterReturn,
} from 'react-hook-form';

export type FormTextFieldProps = Omit<
  TextFieldProps,
  'name' | 'error' | 'onChange' | 'onBlur' | 'inputRef'
> & {
  registration: UseFormRegisterReturn;
  error?: FieldError;
};

/**
 * A labelled text field wired to react-hook-form; its validation message shows under it. Keyed by the field's
 * name: where a form swaps one field for another in the same place (kerf for tool diameter), React would
 * otherwise keep the input element, and the form would read the value left in it into the field that comes.
 */
export function FormTextField({ registration, error, helperText, ...props }: FormTextFieldProps) {
  const { ref, ...field } = registration;
  return (
    <TextField
      key={field.name}
      {...props}
      {...field}
      id={props.id ?? field.name}
      inputRef={ref}
      error={Boolean(error)}
      helperText={error?.message ?? helperText}
      fullWidth
    />
  );
}

/**
 * A registration whose text is upper-cased as it is typed or pasted (a currency code: "usd" becomes "USD"), the
 * caret left where it was.
 */
export function upperCased<N extends string>(
  registration: UseFormRegisterReturn<N>,
): UseFormRegisterReturn<N> {
  return {
    ...registration,
    onChange: (event: { target: unknown; type?: unknown }) => {
      const input = event.target;
      if (input instanceof HTMLInputElement && input.value !== input.value.toUpperCase()) {
        const { selectionStart, selectionEnd } = input;
        input.value = input.value.toUpperCase();
        input.setSelectionRange(selectionStart, selectionEnd);
      }
      return registration.onChange(event);
    },
  };
}

/** What a field bound by name needs of its form: `{ register, errors }` from useForm / useFormState. */
export interface FormFields<T extends FieldValues> {
  register: UseFormRegister<T>;
  errors: FieldErrors<T>;
}

/** The props of a field bound by name to its form, checked against the form's fields. */
export type BoundFieldProps<T extends FieldValues> = Omit<
  FormTextFieldProps,
  'registration' | 'error' | 'form'
> & {
  form: FormFields<T>;
  /** The form's field; its validation message is read from the form's errors at the same path. */
  name: Path<T>;
};

/** FormTextField's `registration` and `error` for the field `name` of `form`. */
export function bindField<T extends FieldValues>(
  form: FormFields<T>,
  name: Path<T>,
  rules?: RegisterOptions<T, Path<T>>,
): { registration: UseFormRegisterReturn<Path<T>>; error: FieldError | undefined } {
  return { registration: form.register(name, rules), error: get(form.errors, name) };
}
