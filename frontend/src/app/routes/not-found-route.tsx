import Button from '@mui/material/Button';
import Typography from '@mui/material/Typography';
import { Link as RouterLink } from 'react-router-dom';
import { PageHeader } from '../../components/page-header';

export function NotFoundRoute() {
  return (
    <>
      <PageHeader title="Page not found" />
      <Typography sx={{ mb: 2 }}>There is no page at this address.</Typography>
      <Button component={RouterLink} to="/" variant="outlined">
        Back to Home
      </Button>
    </>
  );
}
