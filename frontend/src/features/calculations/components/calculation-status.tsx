import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import LinearProgress from '@mui/material/LinearProgress';
import Typography from '@mui/material/Typography';
import { formatDateTime } from '../../../lib/format';
import { isLive, type CalculationView } from '../api/get-calculation';

interface CalculationStatusProps {
  /** Names the status line "<name> status" and the bar "<name> progress", e.g. "Analysis". */
  name: string;
  calculation: CalculationView;
  /** The status line's words for this kind of job. */
  text: string;
  /** Offered while the calculation waits or runs; no Cancel button without it. */
  onCancel?: () => void;
  cancelling?: boolean;
  /** Shown when a failed calculation carries no message of its own. */
  failedText?: string;
}

/**
 * Where a job of the compute queue stands: the status line (with Cancel while it waits or runs),
 * the progress bar, and why it failed or stopped.
 */
export function CalculationStatus({
  name,
  calculation,
  text,
  onCancel,
  cancelling = false,
  failedText = 'The calculation failed.',
}: CalculationStatusProps) {
  const live = isLive(calculation.status);
  return (
    <>
      <Box sx={{ display: 'flex', alignItems: 'center', gap: 2, flexWrap: 'wrap' }}>
        <Typography role="status" aria-label={`${name} status`} variant="body1">
          {text}
        </Typography>
        {live && onCancel && (
          <Button variant="outlined" color="warning" size="small" loading={cancelling} onClick={onCancel}>
            Cancel
          </Button>
        )}
      </Box>
      <Typography variant="body2" color="text.secondary" aria-label={`${name} run by`}>
        Run by {calculation.createdBy}
        {calculation.finishedAt
          ? `, finished ${formatDateTime(calculation.finishedAt)}`
          : `, queued ${formatDateTime(calculation.createdAt)}`}
      </Typography>
      {live && (
        <LinearProgress
          aria-label={`${name} progress`}
          variant={calculation.status === 'queued' ? 'indeterminate' : 'determinate'}
          value={Math.round(100 * calculation.progress)}
        />
      )}
      {calculation.status === 'failed' && <Alert severity="error">{calculation.error ?? failedText}</Alert>}
      {calculation.status === 'cancelled' && (
        <Alert severity="info">{calculation.error ?? 'Cancelled.'}</Alert>
      )}
    </>
  );
}
