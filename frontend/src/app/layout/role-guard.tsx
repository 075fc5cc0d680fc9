import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import { navSectionsFor, type NavSection } from '@quietglass/shared';
import { Link as RouterLink, Outlet } from 'react-router-dom';
import { PageHeader } from '../../components/page-header';
import { useSignedInUser } from '../../features/auth/signed-in-user';
import { ROLE_LABELS } from '../../lib/roles';

/** Route element: the section's pages for roles that may use it, a plain refusal for the others. */
export function RoleGuard({ section }: { section: NavSection }) {
  const user = useSignedInUser();
  const permitted = navSectionsFor(user.role).some((s) => s.key === section.key);
  if (permitted) return <Outlet />;

  return (
    <>
      <PageHeader title="Not permitted for your role" />
      <Alert severity="warning" sx={{ mb: 2, maxWidth: 640 }}>
        {section.label} is not open to the {ROLE_LABELS[user.role]} role (403). Ask an administrator if your
        work needs it.
      </Alert>
      <Button component={RouterLink} to="/" variant="outlined">
        Back to Home
      </Button>
    </>
  );
}
