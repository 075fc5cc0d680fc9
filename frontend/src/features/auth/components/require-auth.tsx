import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import { Navigate, Outlet, useLocation } from 'react-router-dom';
import { ErrorAlert } from '../../../components/error-alert';
import { LoadingBlock } from '../../../components/loading-block';
import { useMe } from '../api/get-me';
import { signInPathFor } from '../next-path';
import { SignedInUserContext } from '../signed-in-user';
import { ChangePasswordForm } from './change-password-form';

/** Route element: renders its child routes for a signed-in user, else sends the visitor to sign-in. */
export function RequireAuth() {
  const me = useMe();
  const location = useLocation();

  if (me.isPending) return <LoadingBlock label="Checking your session" />;
  if (me.isError)
    return <ErrorAlert error={me.error} title="Your session could not be checked" sx={{ m: 3 }} />;
  if (!me.data) return <Navigate to={signInPathFor(location.pathname + location.search)} replace />;

  return (
    <SignedInUserContext value={me.data}>
      {me.data.mustChangePassword ? <FirstOwnPassword /> : <Outlet />}
    </SignedInUserContext>
  );
}

/** Shown instead of every page until a user whose password an admin set has chosen their own. */
function FirstOwnPassword() {
  return (
    <Box component="main" sx={{ p: 4, maxWidth: 560 }}>
      <Typography variant="h1" sx={{ fontSize: '1.6rem', mb: 1 }}>
        Choose your own password
      </Typography>
      <Typography sx={{ mb: 3 }}>
        An admin set the password you signed in with. Choose one that only you know before you go on; use the
        admin&apos;s password as the current one.
      </Typography>
      <ChangePasswordForm />
    </Box>
  );
}
