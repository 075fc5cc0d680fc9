import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import type { SxProps, Theme } from '@mui/material/styles';

interface ConflictAlertProps {
  /** The server's message (someone else saved first, or the record can no longer change). */
  message: string;
  onReload: () => void;
  sx?: SxProps<Theme>;
}

/** A 409 from a save: the server's words and a Reload to fetch what is saved now. */
export function ConflictAlert({ message, onReload, sx }: ConflictAlertProps) {
  return (
    <Alert
      severity="warning"
      role="alert"
      sx={sx}
      action={
        <Button color="inherit" size="small" onClick={onReload}>
          Reload
        </Button>
      }
    >
      {message}
    </Alert>
  );
}
