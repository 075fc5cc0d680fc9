import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { PageHeader } from '../../components/page-header';
import { ChangePasswordForm } from '../../features/auth/components/change-password-form';
import { useSignedInUser } from '../../features/auth/signed-in-user';
import { ROLE_LABELS } from '../../lib/roles';

export function AccountRoute() {
  const user = useSignedInUser();
  return (
    <>
      <PageHeader
        title="Account"
        description={`${user.displayName} · ${user.email} · ${ROLE_LABELS[user.role]}`}
      />
      <Paper variant="outlined" sx={{ p: 3, maxWidth: 520 }}>
        <Typography variant="h2" component="h2" gutterBottom>
          Change password
        </Typography>
        <ChangePasswordForm />
      </Paper>
    </>
  );
}
