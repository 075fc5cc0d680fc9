import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import type { SxProps, Theme } from '@mui/material/styles';
import { ApiError } from '../lib/api-client';

interface ErrorAlertProps {
  error: unknown;
  title?: string;
  sx?: SxProps<Theme>;
}

/** Shows an error's message, and the API's per-field details when it sent some. */
export function ErrorAlert({ error, title, sx }: ErrorAlertProps) {
  if (error === null || error === undefined) return null;
  const message = error instanceof Error ? error.message : String(error);
  const details = error instanceof ApiError ? error.details.filter((d) => d !== message) : [];
  return (
    <Alert severity="error" role="alert" sx={sx}>
      {title && <AlertTitle>{title}</AlertTitle>}
      {message}
      {details.length > 0 && (
        <ul style={{ margin: '4px 0 0', paddingLeft: '1.25em' }}>
          {details.map((d) => (
            <li key={d}>{d}</li>
          ))}
        </ul>
      )}
    </Alert>
  );
}
