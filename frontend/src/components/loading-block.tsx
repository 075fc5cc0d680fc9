import Box from '@mui/material/Box';
import CircularProgress from '@mui/material/CircularProgress';

/** A centred spinner with a name, for pages waiting on their first answer. */
export function LoadingBlock({ label = 'Loading' }: { label?: string }) {
  return (
    <Box sx={{ display: 'flex', justifyContent: 'center', py: 6 }}>
      <CircularProgress aria-label={label} />
    </Box>
  );
}
