import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Chip from '@mui/material/Chip';
import Link from '@mui/material/Link';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { useMemo } from 'react';
import { ErrorAlert } from '../../../components/error-alert';
import { LoadingBlock } from '../../../components/loading-block';
import { Plot, type PlotData, type PlotLayout } from '../../../components/plot';
import type { RunSpectrumView } from '../api/get-run';
import {
  originalSpectrumUrl,
  useSpectrumComparison,
  type SpectrumComparisonView,
} from '../api/get-spectrum-comparison';
import { maskPlotLayout } from '../../../components/mask-plot-layout';
import { formatSigned } from '../../../lib/format';

/** Traces and layout: measured and design curves, with the mask's forbidden regions shaded. */
export function comparisonFigure(c: SpectrumComparisonView): { data: PlotData[]; layout: PlotLayout } {
  const q = c.quantity;
  const limits = (c.mask?.limits ?? []).filter((b) => b.quantity === q);
  let top = 100;
  if (q === 'R') {
    const highest = Math.max(0, ...c.measured.valuesPercent, ...c.design.valuesPercent);
    const bound = Math.max(0, ...limits.map((b) => b.max_percent ?? b.min_percent ?? b.target_percent ?? 0));
    top = Math.min(100, Math.max(1, highest * 1.1, bound * 2));
  }
  const data: PlotData[] = [
    {
      type: 'scatter',
      mode: 'lines',
      name: `Measured ${q} ${c.angleDeg}°`,
      x: c.measured.wavelengthsNm,
      y: c.measured.valuesPercent,
    },
    {
      type: 'scatter',
      mode: 'lines',
      name: `Design ${q} ${c.angleDeg}° avg`,
      x: c.design.wavelengthsNm,
      y: c.design.valuesPercent,
      line: { dash: 'dash' },
    },
  ];
  const layout = maskPlotLayout(limits, q, top);
  return { data, layout };
}

function MaskVerdict({ comparison }: { comparison: SpectrumComparisonView }) {
  const mask = comparison.mask;
  let body;
  if (!mask) body = <Typography variant="body2">The recipe has no spec mask.</Typography>;
  else if (mask.pass === null || mask.worstMargin === null) {
    const reasons = mask.bands.filter((b) => !b.evaluated).map((b) => b.reason ?? '');
    body = (
      <Typography variant="body2">
        Not evaluated: {reasons.length > 0 ? reasons.join('; ') : 'no band covers this measurement'}
      </Typography>
    );
  } else {
    const worst = mask.worstBand === null ? null : mask.bands[mask.worstBand];
    const at = worst?.worstAt;
    body = (
      <>
        <Chip
          label={mask.pass ? 'Pass' : 'Fail'}
          color={mask.pass ? 'success' : 'error'}
          size="small"
          sx={{ fontWeight: 600, minWidth: 56 }}
        />
        <Typography variant="body2">
          Worst margin {formatSigned(mask.worstMargin)} percentage points
          {at ? ` at ${at.wavelengthNm} nm: ${comparison.quantity} ${at.valuePercent.toFixed(3)} %` : ''}
        </Typography>
      </>
    );
  }
  return (
    <Box
      role="status"
      aria-label="Measured against the mask"
      sx={{ display: 'flex', alignItems: 'center', gap: 1, flexWrap: 'wrap' }}
    >
      {mask && (
        <Typography variant="body2" color="text.secondary">
          {mask.name} rev {mask.revision}:
        </Typography>
      )}
      {body}
    </Box>
  );
}

/** The comparison as drawn and judged, for a loaded comparison. */
export function ComparisonView({
  comparison,
  spectrum,
}: {
  comparison: SpectrumComparisonView;
  spectrum: RunSpectrumView;
}) {
  const figure = useMemo(() => comparisonFigure(comparison), [comparison]);
  const notEvaluated =
    comparison.mask?.bands.filter((b) => !b.evaluated && comparison.mask?.pass !== null) ?? [];
  return (
    <Box sx={{ display: 'grid', gap: 1.5 }}>
      <MaskVerdict comparison={comparison} />
      {notEvaluated.length > 0 && (
        <Alert severity="info">
          Not judged by this measurement:{' '}
          {notEvaluated.map((b) => b.reason ?? `band ${b.band + 1}`).join('; ')}
        </Alert>
      )}
      {comparison.design.valuesPercent.length === 0 && (
        <Alert severity="warning">
          The design curve is not drawn: the scan lies outside the materials&apos; data.
        </Alert>
      )}
      <Plot title="Measured against design" data={figure.data} layout={figure.layout} />
      <Typography variant="body2">
        <Link href={originalSpectrumUrl(spectrum.runId, spectrum.id)} download={spectrum.filename}>
          Download the original file ({spectrum.filename})
        </Link>
      </Typography>
    </Box>
  );
}

/** Measured vs design vs the recipe's spec mask, for one uploaded spectrum. */
export function SpectrumComparison({ spectrum }: { spectrum: RunSpectrumView }) {
  const comparison = useSpectrumComparison(spectrum.runId, spectrum.id);
  return (
    <Paper variant="outlined" sx={{ p: 2 }} component="section" aria-label="Comparison with design and mask">
      <Typography variant="h2" component="h2" gutterBottom>
        Comparison with design and mask
      </Typography>
      <Typography variant="body2" color="text.secondary" sx={{ mb: 1.5 }}>
        {spectrum.filename}: {spectrum.quantity} of the{' '}
        {spectrum.sample === 'witness' ? 'witness sample' : 'part'} at {spectrum.angleDeg}°, uploaded by{' '}
        {spectrum.uploadedBy}.
      </Typography>
      {comparison.isPending && <LoadingBlock label="Comparing with the design" />}
      {comparison.isError && <ErrorAlert error={comparison.error} title="The comparison could not be made" />}
      {comparison.data && <ComparisonView comparison={comparison.data} spectrum={spectrum} />}
    </Paper>
  );
}
