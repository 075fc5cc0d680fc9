import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import LinearProgress from '@mui/material/LinearProgress';
import Typography from '@mui/material/Typography';
import { useMemo } from 'react';
import { Plot } from '../../../components/plot';
import { ErrorAlert } from '../../../components/error-alert';
import { useCancelCalculation } from '../api/cancel-calculation';
import { isLive, type CalculationView } from '../api/get-calculation';
import { liveMerit } from '../results';

function statusText(name: string, c: CalculationView): string {
  switch (c.status) {
    case 'queued':
      return `${name} (calculation ${c.id}) is queued`;
    case 'running':
      return `${name} (calculation ${c.id}) is running: ${Math.round(100 * c.progress)} %`;
    case 'completed':
      return `${name} (calculation ${c.id}) is done${
        c.computeMs !== null ? ` in ${(c.computeMs / 1000).toFixed(2)} s` : ''
      }`;
    case 'failed':
      return `${name} (calculation ${c.id}) failed`;
    case 'cancelled':
      return `${name} (calculation ${c.id}) was cancelled`;
  }
}

interface RunStatusProps {
  /** "Fit to mask", "Grow layers", "Yield forecast". */
  name: string;
  calculation: CalculationView;
  /** What the live merit is plotted against, or null for no merit plot (Yield forecast). */
  meritAxis: 'Iteration' | 'Layer count' | null;
  reused: boolean;
}

/** Where a queued optimisation stands: status, progress bar, the merit streamed so far, Cancel. */
export function RunStatus({ name, calculation, meritAxis, reused }: RunStatusProps) {
  const cancel = useCancelCalculation();
  const live = isLive(calculation.status);
  const points = useMemo(() => liveMerit(calculation), [calculation]);
  const last = points[points.length - 1];

  return (
    <Box sx={{ display: 'grid', gap: 1.5 }}>
      {reused && (
        <Alert severity="info">
          The same {name.toLowerCase()} with the same settings was already on the queue; it is shown here.
        </Alert>
      )}
      <Box sx={{ display: 'flex', alignItems: 'center', gap: 2, flexWrap: 'wrap' }}>
        <Typography role="status" aria-label={`${name} status`} variant="body1">
          {statusText(name, calculation)}
        </Typography>
        {live && (
          <Button
            variant="outlined"
            color="warning"
            size="small"
            loading={cancel.isPending}
            onClick={() => cancel.mutate(calculation.id)}
          >
            Cancel
          </Button>
        )}
      </Box>
      {live && (
        <LinearProgress
          aria-label={`${name} progress`}
          variant={calculation.status === 'queued' ? 'indeterminate' : 'determinate'}
          value={Math.round(100 * calculation.progress)}
        />
      )}
      {cancel.error && <ErrorAlert error={cancel.error} title="The calculation was not cancelled" />}
      {calculation.status === 'failed' && (
        <Alert severity="error">{calculation.error ?? 'The calculation failed.'}</Alert>
      )}
      {calculation.status === 'cancelled' && (
        <Alert severity="info">{calculation.error ?? 'Cancelled.'}</Alert>
      )}
      {live && meritAxis && last && (
        <>
          <Typography variant="body2" aria-label="Latest merit">
            Merit {last.merit.toFixed(4)} at {meritAxis.toLowerCase()} {last.x} ({points.length}{' '}
            {points.length === 1 ? 'point' : 'points'})
          </Typography>
          <Plot
            title="Merit so far"
            height={240}
            data={[
              {
                type: 'scatter',
                mode: 'lines+markers',
                name: 'Merit',
                x: points.map((p) => p.x),
                y: points.map((p) => p.merit),
              },
            ]}
            layout={{
              xaxis: { title: { text: meritAxis } },
              yaxis: { title: { text: 'Merit (percentage points)' } },
            }}
          />
        </>
      )}
    </Box>
  );
}
