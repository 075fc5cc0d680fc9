import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Stack from '@mui/material/Stack';
import { useForm } from 'react-hook-form';
import { FormTextField } from '../../../components/form-text-field';
import { ApiError } from '../../../lib/api-client';
import { emailRules } from '../../../lib/validation';
import { useSignIn, type SignInInput } from '../api/sign-in';

export const TOO_MANY_ATTEMPTS_MESSAGE = 'Too many attempts — wait a minute';

function signInErrorMessage(error: Error): string {
  if (error instanceof ApiError && error.status === 429) return TOO_MANY_ATTEMPTS_MESSAGE;
  return error.message;
}

/** E-mail and password form; on success the session's user is set and the route moves on. */
export function SignInForm() {
  const signIn = useSignIn();
  const { control, handleSubmit } = useForm<SignInInput>({ defaultValues: { email: '', password: '' } });
  const onSubmit = handleSubmit((values) => signIn.mutate(values));

  return (
    <Stack component="form" noValidate onSubmit={onSubmit} spacing={2}>
      {signIn.error && <Alert severity="error">{signInErrorMessage(signIn.error)}</Alert>}
      <FormTextField
        control={control}
        name="email"
        rules={emailRules}
        label="E-mail"
        type="email"
        autoComplete="username"
        autoFocus
        fullWidth
      />
      <FormTextField
        control={control}
        name="password"
        rules={{ required: 'Enter your password' }}
        label="Password"
        type="password"
        autoComplete="current-password"
        fullWidth
      />
      <Button type="submit" variant="contained" size="large" loading={signIn.isPending}>
        Sign in
      </Button>
    </Stack>
  );
}
