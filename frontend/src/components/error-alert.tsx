import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import type { SxProps, Theme } from '@mui/material/styles';
import { ApiError } from '../lib/api-client';

interface ErrorAlertProps {
  error: unknown;
  title?: string;
  sx?: SxProps<Theme>;
}

/** Shows an error's message, the API's per-field details when it sent some, and a server error's reference. */
export function ErrorAlert({ error, title, sx }: ErrorAlertProps) {
  if (error === null || error === undefined) return null;
  const message =
    error instanceof Error ? error.message : typeof error === 'string' ? error : 'Something went wrong';
  const details = error instanceof ApiError ? error.details.filter((d) => d !== message) : [];
  // A server error names its request, so whoever reports it can point at the log entry.
  const body = error instanceof ApiError ? (error.body as { requestId?: unknown } | undefined) : undefined;
  const reference = typeof body?.requestId === 'string' ? body.requestId : null;
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
      {reference && (
        <div style={{ marginTop: 4, fontSize: '0.85em', opacity: 0.8 }}>
          Reference for the shop's admin: {reference}
        </div>
      )}
    </Alert>
  );
}
