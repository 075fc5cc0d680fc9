import DialogContentText from '@mui/material/DialogContentText';
import type { UserView } from '@quietglass/shared';
import { useForm } from 'react-hook-form';
import { ErrorAlert } from '../../../components/error-alert';
import { FormDialog } from '../../../components/form-dialog';
import { NewPasswordField } from '../../../components/new-password-field';
import { notify } from '../../../lib/notifier';
import { useResetPassword } from '../api/reset-password';

interface ResetPasswordDialogProps {
  /** The account whose password is reset; null keeps the dialog closed. */
  user: UserView | null;
  onClose: () => void;
}

/** Sets a new password for another account; the administrator passes it on to its owner. */
export function ResetPasswordDialog({ user, onClose }: ResetPasswordDialogProps) {
  const resetPassword = useResetPassword();
  const { control, handleSubmit, reset } = useForm<{ newPassword: string }>({
    defaultValues: { newPassword: '' },
  });

  const close = () => {
    reset({ newPassword: '' });
    resetPassword.reset();
    onClose();
  };

  const onSubmit = handleSubmit(({ newPassword }) => {
    if (!user) return;
    resetPassword.mutate(
      { id: user.id, newPassword },
      {
        onSuccess: () => {
          notify(`New password set for ${user.email}.`, 'success');
          close();
        },
      },
    );
  });

  return (
    <FormDialog
      open={user !== null}
      title="Reset password"
      submitLabel="Set password"
      pending={resetPassword.isPending}
      onSubmit={onSubmit}
      onClose={close}
      maxWidth="xs"
    >
      <DialogContentText>
        Set a new password for {user?.displayName} ({user?.email}) and pass it on to them. Their open sessions
        end at once, and at the next sign-in they must choose a password of their own.
      </DialogContentText>
      {resetPassword.error && <ErrorAlert error={resetPassword.error} />}
      <NewPasswordField control={control} name="newPassword" label="New password" fullWidth autoFocus />
    </FormDialog>
  );
}
