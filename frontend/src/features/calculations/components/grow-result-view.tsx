import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Radio from '@mui/material/Radio';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { DesignLayer, DesignVersionView, GrowResult } from '@quietglass/shared';
import { useMemo, useState } from 'react';
import { Plot } from '../../../components/plot';
import { grownLayers, STOP_REASONS } from '../results';
import { AcceptButton } from './accept-button';
import { SpectrumOverlay } from './spectrum-overlay';
import { ResultForecastLine } from './result-forecast-line';
import { marginSummary } from './target-margin-field';
import { ThicknessTable } from './thickness-table';
import { tableLayers, type VersionContext } from './version-context';
import { formatSigned } from '../../../lib/format';

interface GrowResultViewProps {
  calculationId: number;
  result: GrowResult;
  context: VersionContext;
  /** Caches the accepted result's new version (see OptimisePanel). */
  storeVersion: (view: DesignVersionView) => Promise<void>;
  onAccepted: (versionNumber: number) => void;
}

/**
 * A completed Grow layers: merit against layer count over the kept steps, a table of the steps to
 * choose one from (the final step at first), and the chosen stack against the version's.
 */
export function GrowResultView({
  calculationId,
  result,
  context,
  storeVersion,
  onAccepted,
}: GrowResultViewProps) {
  const { version } = context;
  const [chosen, setChosen] = useState(result.final.step);
  const step = result.steps.find((s) => s.step === chosen) ?? result.final;
  const grown = useMemo((): { layers: DesignLayer[] } | { error: string } => {
    try {
      return { layers: grownLayers(step, version.layers, context.idsByName) };
    } catch (error) {
      return { error: error instanceof Error ? error.message : String(error) };
    }
  }, [step, version.layers, context.idsByName]);
  const afterContent = useMemo(
    () => ('layers' in grown ? { ...version, layers: grown.layers } : null),
    [version, grown],
  );

  return (
    <Box sx={{ display: 'grid', gap: 1.5 }}>
      <Typography variant="body2" role="group" aria-label="Grow layers result">
        {result.steps.length} kept steps, stopped: {STOP_REASONS[result.stoppedBy] ?? result.stoppedBy}.
        Final: {result.final.layerCount} layers, merit {result.final.merit.toFixed(4)} percentage points,{' '}
        {result.final.pass ? 'Pass' : 'Fail'},{' '}
        {marginSummary(result.final.worstMargin, result.targetMarginPercent)}.
      </Typography>
      <ResultForecastLine
        forecast={result.forecast}
        of={`the final step, ${result.final.layerCount} layers`}
      />
      <Plot
        title="Merit against layer count"
        height={260}
        data={[
          {
            type: 'scatter',
            mode: 'lines+markers',
            name: 'Kept steps',
            x: result.steps.map((s) => s.layerCount),
            y: result.steps.map((s) => s.merit),
            text: result.steps.map((s) => `step ${s.step}`),
          },
        ]}
        layout={{
          xaxis: { title: { text: 'Layer count' } },
          yaxis: { title: { text: 'Merit (percentage points)' } },
        }}
      />
      <Table size="small" aria-label="Grow steps">
        <TableHead>
          <TableRow>
            <TableCell padding="checkbox">Use</TableCell>
            <TableCell>Step</TableCell>
            <TableCell align="right">Layers</TableCell>
            <TableCell align="right">Total (nm)</TableCell>
            <TableCell align="right">Merit</TableCell>
            <TableCell align="right">Worst margin</TableCell>
            <TableCell>Mask</TableCell>
          </TableRow>
        </TableHead>
        <TableBody>
          {result.steps.map((s) => (
            <TableRow key={s.step} selected={s.step === step.step}>
              <TableCell padding="checkbox">
                <Radio
                  checked={s.step === step.step}
                  onChange={() => setChosen(s.step)}
                  slotProps={{ input: { 'aria-label': `Step ${s.step}` } }}
                />
              </TableCell>
              <TableCell>{s.step}</TableCell>
              <TableCell align="right">{s.layerCount}</TableCell>
              <TableCell align="right">{s.totalThicknessNm.toFixed(1)}</TableCell>
              <TableCell align="right">{s.merit.toFixed(4)}</TableCell>
              <TableCell align="right">{formatSigned(s.worstMargin)}</TableCell>
              <TableCell>{s.pass ? 'Pass' : 'Fail'}</TableCell>
            </TableRow>
          ))}
        </TableBody>
      </Table>
      <Typography variant="h3" component="h3">
        Step {step.step}: {step.layerCount} layers
      </Typography>
      {'error' in grown ? (
        <Alert severity="error">The step cannot be shown: {grown.error}</Alert>
      ) : (
        <>
          <ThicknessTable
            before={tableLayers(version.layers, context)}
            after={tableLayers(grown.layers, context)}
          />
          {afterContent && (
            <SpectrumOverlay
              slot={`grow-${calculationId}`}
              before={version}
              after={afterContent}
              materials={context.materials}
              maskBands={context.maskBands}
            />
          )}
        </>
      )}
      <AcceptButton
        calculationId={calculationId}
        step={step.step}
        storeVersion={storeVersion}
        onAccepted={onAccepted}
      />
    </Box>
  );
}
