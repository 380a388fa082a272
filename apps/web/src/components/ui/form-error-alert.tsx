import Alert from '@mui/material/Alert';
import { errorMessage } from '../../lib/api-client';

/** The API's answer when it is about the whole form rather than one field. */
export function FormErrorAlert({ error }: { error: unknown }) {
  if (!error) return null;
  return (
    <Alert severity="error" role="alert" sx={{ mb: 2 }} data-testid="form-error">
      {errorMessage(error)}
    </Alert>
  );
}
