import Box from '@mui/material/Box';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { LimitBand, YieldEnvelope, YieldForecast } from '@quietglass/shared';
import { Plot, PLOT_COLOURS, type PlotData, type PlotLayout } from '../../../components/plot';
import { maskPlotLayout } from '../../../components/mask-plot-layout';
import { binCentres } from '../results';
import { formatSigned } from '../../../lib/format';

/** The nominal curve and each percentile of one envelope, over the mask's forbidden regions. */
export function envelopeFigure(
  envelope: YieldEnvelope,
  maskBands: readonly LimitBand[] | null,
): { data: PlotData[]; layout: PlotLayout } {
  // The median solid, the outer percentiles dashed in one colour, the nominal design dotted.
  const data: PlotData[] = envelope.percentiles.map((p) => ({
    type: 'scatter',
    mode: 'lines',
    name: `${p.p} %`,
    x: envelope.wavelengthsNm,
    y: p.values,
    line: p.p === 50 ? { color: PLOT_COLOURS[2], width: 2 } : { color: PLOT_COLOURS[1], dash: 'dash' },
  }));
  data.push({
    type: 'scatter',
    mode: 'lines',
    name: 'Nominal',
    x: envelope.wavelengthsNm,
    y: envelope.nominal,
    line: { color: PLOT_COLOURS[0], dash: 'dot' },
  });
  let top = 0;
  for (const p of envelope.percentiles) for (const v of p.values) top = Math.max(top, v);
  for (const v of envelope.nominal) top = Math.max(top, v);
  top = Math.min(100, Math.max(1, top * 1.1));
  return { data, layout: maskPlotLayout(maskBands ?? [], envelope.quantity, top) };
}

interface YieldResultViewProps {
  forecast: YieldForecast;
  maskBands: LimitBand[] | null;
}

/** A completed Yield forecast: the yield, the percentile envelopes, worst margins and the layers that cost most. */
export function YieldResultView({ forecast, maskBands }: YieldResultViewProps) {
  const margins = forecast.worstMargins;
  return (
    <Box sx={{ display: 'grid', gap: 1.5 }}>
      <Box role="group" aria-label="Yield forecast result">
        <Typography variant="h3" component="p" aria-label="Predicted yield">
          Predicted yield {(100 * forecast.yieldFraction).toFixed(1)} %
        </Typography>
        <Typography variant="body2">
          {forecast.passed} of {forecast.trials} trials pass the mask
          {forecast.trials < forecast.requestedTrials ? ` (${forecast.requestedTrials} asked)` : ''}; seed{' '}
          {forecast.seed}. Nominal design: {forecast.nominal.pass ? 'Pass' : 'Fail'}, worst margin{' '}
          {formatSigned(forecast.nominal.worstMargin)} percentage points. Worst margin of the trials: mean{' '}
          {formatSigned(margins.mean)},{' '}
          {margins.percentiles.map((p) => `${p.p} %: ${formatSigned(p.value)}`).join(', ')}.
        </Typography>
      </Box>
      {forecast.envelopes.map((envelope) => {
        const figure = envelopeFigure(envelope, maskBands);
        const name = `${envelope.quantity} at ${envelope.angleDeg}° (${envelope.polarisation})`;
        return (
          <Box key={name}>
            <Typography variant="subtitle2" component="h3">
              Percentile envelope, {name}
            </Typography>
            <Plot
              title={`Percentile envelope ${name}`}
              data={figure.data}
              layout={figure.layout}
              height={300}
            />
          </Box>
        );
      })}
      <Typography variant="subtitle2" component="h3">
        Worst margins of the trials
      </Typography>
      <Plot
        title="Worst margins of the trials"
        height={260}
        data={[
          {
            type: 'bar',
            name: 'Trials',
            x: binCentres(margins.histogram.edges),
            y: margins.histogram.counts,
          },
        ]}
        layout={{
          xaxis: { title: { text: 'Worst margin (percentage points); ≥ 0 passes' } },
          yaxis: { title: { text: 'Trials' } },
          bargap: 0.05,
        }}
      />
      <Typography variant="subtitle2" component="h3">
        Layer sensitivity (each layer perturbed alone, most yield-costly first)
      </Typography>
      <Table size="small" aria-label="Layer sensitivity">
        <TableHead>
          <TableRow>
            <TableCell>Rank</TableCell>
            <TableCell>Layer</TableCell>
            <TableCell>Material</TableCell>
            <TableCell align="right">Yield loss (%)</TableCell>
            <TableCell align="right">Margin loss (percentage points)</TableCell>
          </TableRow>
        </TableHead>
        <TableBody>
          {forecast.sensitivity.map((s, i) => (
            <TableRow key={s.layer}>
              <TableCell>{i + 1}</TableCell>
              <TableCell>{s.layer + 1}</TableCell>
              <TableCell>{s.material}</TableCell>
              <TableCell align="right">{(100 * s.yieldLossFraction).toFixed(1)}</TableCell>
              <TableCell align="right">{s.marginLossPercent.toFixed(3)}</TableCell>
            </TableRow>
          ))}
        </TableBody>
      </Table>
      {forecast.sensitivityTrials === 0 && (
        <Typography variant="body2" color="text.secondary">
          No per-layer sensitivity was computed.
        </Typography>
      )}
    </Box>
  );
}
