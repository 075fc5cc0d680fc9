import Box from '@mui/material/Box';
import Chip from '@mui/material/Chip';
import Typography from '@mui/material/Typography';
import type { DesignVersionView, FitResult } from '@quietglass/shared';
import { useMemo } from 'react';
import { Plot } from '../../../components/plot';
import { fittedLayers, STOP_REASONS } from '../results';
import { AcceptButton } from './accept-button';
import { SpectrumOverlay } from './spectrum-overlay';
import { ResultForecastLine } from './result-forecast-line';
import { marginSummary } from './target-margin-field';
import { ThicknessTable } from './thickness-table';
import { tableLayers, type VersionContext } from './version-context';

interface FitResultViewProps {
  calculationId: number;
  result: FitResult;
  context: VersionContext;
  /** Caches the accepted result's new version (see OptimisePanel). */
  storeVersion: (view: DesignVersionView) => Promise<void>;
  onAccepted: (versionNumber: number) => void;
}

/** A completed Fit to mask: merit before and after, the thickness table, the spectra, Accept. */
export function FitResultView({
  calculationId,
  result,
  context,
  storeVersion,
  onAccepted,
}: FitResultViewProps) {
  const { version } = context;
  const before = useMemo(
    () =>
      version.layers.map((l, i) => ({ ...l, thicknessNm: result.initialThicknessesNm[i] ?? l.thicknessNm })),
    [version.layers, result.initialThicknessesNm],
  );
  const after = useMemo(() => fittedLayers(version.layers, result), [version.layers, result]);
  const beforeContent = useMemo(() => ({ ...version, layers: before }), [version, before]);
  const afterContent = useMemo(() => ({ ...version, layers: after }), [version, after]);

  return (
    <Box sx={{ display: 'grid', gap: 1.5 }}>
      <Box
        role="group"
        aria-label="Fit to mask result"
        sx={{ display: 'flex', alignItems: 'center', gap: 1, flexWrap: 'wrap' }}
      >
        <Chip
          label={result.pass ? 'Pass' : 'Fail'}
          color={result.pass ? 'success' : 'error'}
          size="small"
          sx={{ fontWeight: 600, minWidth: 56 }}
        />
        <Typography variant="body2">
          Merit {result.merit.before.toFixed(4)} → {result.merit.after.toFixed(4)} percentage points ·{' '}
          {marginSummary(result.worstMargin, result.targetMarginPercent)} · {result.iterations} iterations (
          {STOP_REASONS[result.stoppedBy] ?? result.stoppedBy})
        </Typography>
      </Box>
      <ResultForecastLine forecast={result.forecast} />
      <Plot
        title="Merit per iteration"
        height={240}
        data={[
          {
            type: 'scatter',
            mode: 'lines+markers',
            name: 'Merit',
            x: result.history.map((h) => h.iteration),
            y: result.history.map((h) => h.merit),
          },
        ]}
        layout={{
          xaxis: { title: { text: 'Iteration' } },
          yaxis: { title: { text: 'Merit (percentage points)' } },
        }}
      />
      <ThicknessTable before={tableLayers(before, context)} after={tableLayers(after, context)} />
      <SpectrumOverlay
        slot={`fit-${calculationId}`}
        before={beforeContent}
        after={afterContent}
        materials={context.materials}
        maskBands={context.maskBands}
      />
      <AcceptButton calculationId={calculationId} storeVersion={storeVersion} onAccepted={onAccepted} />
    </Box>
  );
}
