import TextField, { type TextFieldProps } from '@mui/material/TextField';
import { type FieldError, type UseFormRegisterReturn } from 'react-hook-form';

type FormTextFieldProps = Omit<TextFieldProps, 'name' | 'error' | 'onChange' | 'onBlur' | 'inputRef'> & {
  registration: UseFormRegisterReturn;
  error?: FieldError;
};

/** A labelled text field wired to react-hook-form; its validation message shows under it. */
export function FormTextField({ registration, error, helperText, ...props }: FormTextFieldProps) {
  const { ref, ...field } = registration;
  return (
    <TextField
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
