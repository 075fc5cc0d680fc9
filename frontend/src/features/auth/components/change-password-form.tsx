import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Stack from '@mui/material/Stack';
import { useForm } from 'react-hook-form';
import { ErrorAlert } from '../../../components/error-alert';
import { FormTextField } from '../../../components/form-text-field';
import { NewPasswordField } from '../../../components/new-password-field';
import { useChangePassword } from '../api/change-password';

interface ChangePasswordValues {
  currentPassword: string;
  newPassword: string;
  repeatPassword: string;
}

const EMPTY: ChangePasswordValues = { currentPassword: '', newPassword: '', repeatPassword: '' };

/** The signed-in user's own password change: current, new (at least 10 characters) and a repeat. */
export function ChangePasswordForm() {
  const changePassword = useChangePassword();
  const { control, handleSubmit, reset } = useForm<ChangePasswordValues>({ defaultValues: EMPTY });

  const onSubmit = handleSubmit(({ currentPassword, newPassword }) =>
    changePassword.mutate({ currentPassword, newPassword }, { onSuccess: () => reset(EMPTY) }),
  );

  return (
    <Stack component="form" noValidate onSubmit={onSubmit} spacing={2} sx={{ maxWidth: 420 }}>
      {changePassword.isSuccess && <Alert severity="success">Your password has been changed.</Alert>}
      {changePassword.error && <ErrorAlert error={changePassword.error} />}
      <FormTextField
        control={control}
        name="currentPassword"
        rules={{ required: 'Enter your current password' }}
        label="Current password"
        type="password"
        autoComplete="current-password"
      />
      <NewPasswordField control={control} name="newPassword" label="New password" />
      <FormTextField
        control={control}
        name="repeatPassword"
        rules={{
          required: 'Repeat the new password',
          validate: (value, values) => value === values.newPassword || 'The passwords do not match',
        }}
        label="Repeat new password"
        type="password"
        autoComplete="new-password"
      />
      <Button
        type="submit"
        variant="contained"
        loading={changePassword.isPending}
        sx={{ alignSelf: 'flex-start' }}
      >
        Change password
      </Button>
    </Stack>
  );
}
