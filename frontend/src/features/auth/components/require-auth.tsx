import { Navigate, Outlet, useLocation } from 'react-router-dom';
import { ErrorAlert } from '../../../components/error-alert';
import { LoadingBlock } from '../../../components/loading-block';
import { useMe } from '../api/get-me';
import { signInPathFor } from '../next-path';
import { SignedInUserContext } from '../signed-in-user';

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
      <Outlet />
    </SignedInUserContext>
  );
}
