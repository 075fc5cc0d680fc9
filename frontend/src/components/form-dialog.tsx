import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import type { FormEventHandler, ReactNode } from 'react';

interface FormDialogProps {
  open: boolean;
  title: string;
  submitLabel: string;
  /** Disables the submit button and shows progress while the request runs. */
  pending: boolean;
  onSubmit: FormEventHandler<HTMLFormElement>;
  onClose: () => void;
  maxWidth?: 'xs' | 'sm' | 'md';
  children: ReactNode;
}

/** A dialog holding one form: its fields, Cancel and a submit button named for what it does. */
export function FormDialog({
  open,
  title,
  submitLabel,
  pending,
  onSubmit,
  onClose,
  maxWidth = 'sm',
  children,
}: FormDialogProps) {
  return (
    <Dialog open={open} onClose={onClose} fullWidth maxWidth={maxWidth}>
      <form noValidate onSubmit={onSubmit}>
        <DialogTitle>{title}</DialogTitle>
        <DialogContent sx={{ display: 'grid', gap: 2 }}>{children}</DialogContent>
        <DialogActions>
          <Button onClick={onClose}>Cancel</Button>
          <Button type="submit" variant="contained" loading={pending}>
            {submitLabel}
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}
