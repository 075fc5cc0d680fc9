import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { useEffect } from 'react';
import { Navigate, useSearchParams } from 'react-router-dom';
import { useMe } from '../../features/auth/api/get-me';
import { SignInForm } from '../../features/auth/components/sign-in-form';
import { safeNextPath } from '../../features/auth/next-path';

/** Public page: the sign-in form; a signed-in user goes on to `next` (or Home). */
export function SignInRoute() {
  const me = useMe();
  const [params] = useSearchParams();

  useEffect(() => {
    document.title = 'Sign in · Quietglass';
  }, []);

  if (me.data) return <Navigate to={safeNextPath(params.get('next'))} replace />;

  return (
    <Box
      sx={{ minHeight: '100vh', display: 'grid', placeItems: 'center', p: 2, bgcolor: 'background.default' }}
    >
      <Paper variant="outlined" sx={{ width: '100%', maxWidth: 400, p: 4 }}>
        <Typography
          variant="overline"
          component="p"
          color="primary"
          sx={{ fontWeight: 600, letterSpacing: 2 }}
        >
          Quietglass
        </Typography>
        <Typography variant="h1" component="h1" sx={{ mb: 3 }}>
          Sign in
        </Typography>
        <SignInForm />
      </Paper>
    </Box>
  );
}
