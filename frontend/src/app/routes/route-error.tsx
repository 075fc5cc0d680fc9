import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import { isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { ErrorAlert } from '../../components/error-alert';

/** Shown when a page fails to load or throws while rendering. */
export function RouteError() {
  const error = useRouteError();
  const shown = isRouteErrorResponse(error) ? new Error(`${error.status} ${error.statusText}`) : error;
  return (
    <Box sx={{ p: 3, maxWidth: 720 }}>
      <ErrorAlert error={shown} title="This page could not be shown" sx={{ mb: 2 }} />
      <Button variant="outlined" onClick={() => window.location.reload()}>
        Reload
      </Button>
    </Box>
  );
}
