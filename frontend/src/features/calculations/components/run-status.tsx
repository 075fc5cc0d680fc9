import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import { useMemo } from 'react';
import { Plot } from '../../../components/plot';
import { ErrorAlert } from '../../../components/error-alert';
import { useCancelCalculation } from '../api/cancel-calculation';
import { isLive, type CalculationView } from '../api/get-calculation';
import { liveMerit } from '../results';
import { CalculationStatus } from './calculation-status';

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
      <CalculationStatus
        name={name}
        calculation={calculation}
        text={statusText(name, calculation)}
        onCancel={() => cancel.mutate(calculation.id)}
        cancelling={cancel.isPending}
      />
      {cancel.error && <ErrorAlert error={cancel.error} title="The calculation was not cancelled" />}
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
