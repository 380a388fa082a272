import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Typography from '@mui/material/Typography';
import { type ReactNode } from 'react';
import { errorMessage, isApiError } from '../../lib/api-client';

interface ErrorPanelProps {
  title: string;
  error: unknown;
  onRetry?: () => void;
  /** A second way out, e.g. signing out when the account cannot be loaded. */
  children?: ReactNode;
}

/** An error a person can act on: what failed, the server's words, a reference for support, a retry. */
export function ErrorPanel({ title, error, onRetry, children }: ErrorPanelProps) {
  const requestId = isApiError(error) ? error.requestId : undefined;
  return (
    <Box sx={{ maxWidth: 640, mx: 'auto', my: 4, px: 2 }}>
      <Alert
        severity="error"
        action={
          onRetry ? (
            <Button color="inherit" size="small" onClick={onRetry}>
              Try again
            </Button>
          ) : undefined
        }
      >
        <AlertTitle>{title}</AlertTitle>
        {errorMessage(error)}
        {requestId ? (
          <Typography variant="body2" sx={{ mt: 1 }}>
            Reference for support: <code>{requestId}</code>
          </Typography>
        ) : null}
      </Alert>
      {children ? <Box sx={{ mt: 2 }}>{children}</Box> : null}
    </Box>
  );
}
