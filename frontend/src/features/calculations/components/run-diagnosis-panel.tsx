import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { DiagnosisRequest } from '@quietglass/shared';
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { ErrorAlert } from '../../../components/error-alert';
import { FormTextField } from '../../../components/form-text-field';
import { formatFixed, formatSigned } from '../../../lib/format';
import { CALCULATION_POLL_MS, useCalculation, type CalculationView } from '../api/get-calculation';
import { useLatestDiagnosis } from '../api/get-latest-calculations';
import { diagnosisSummaryOf, useStartDiagnosis, type DiagnosisSummary } from '../api/start-diagnosis';
import { DIAGNOSIS_DEFAULTS, diagnosisFormSchema, type DiagnosisValues } from '../optimise-forms';
import { CalculationStatus } from './calculation-status';

/**
 * A layer whose fitted thickness is off its design by at least this much is flagged as a likely
 * culprit. AR layers are usually held to about ±2 % in thickness (common practice, no source).
 */
export const DEVIATION_FLAG_PERCENT = 2;

function statusText(c: CalculationView): string {
  switch (c.status) {
    case 'queued':
      return 'Queued — waiting for a worker';
    case 'running':
      return `Running — ${Math.round(100 * c.progress)} %`;
    case 'completed':
      return 'Diagnosis completed';
    case 'failed':
      return 'Diagnosis failed';
    case 'cancelled':
      return 'Diagnosis cancelled';
  }
}

/** The ranked layers with fitted factor and deviation; likely deviated layers are highlighted. */
export function DiagnosisTable({
  summary,
  layerCount,
  materialName,
}: {
  summary: DiagnosisSummary;
  layerCount: number;
  materialName: (materialId: number) => string;
}) {
  const flagged = summary.layers.filter((l) => Math.abs(l.deviationPercent) >= DEVIATION_FLAG_PERCENT);
  return (
    <Box sx={{ display: 'grid', gap: 1.5 }}>
      <Typography variant="body2" role="status" aria-label="Diagnosis finding">
        {flagged.length === 0
          ? `No layer deviated by ${DEVIATION_FLAG_PERCENT} % or more.`
          : `Most likely deviated: ${flagged
              .map(
                (l) =>
                  `layer ${l.layer} (${materialName(l.materialId)}, ${formatSigned(l.deviationPercent, 2)} %)`,
              )
              .join(', ')}.`}{' '}
        Residual between measured and fitted spectrum: {formatFixed(summary.residualRmsPercent, 4)}.
      </Typography>
      <Table size="small" aria-label="Fitted thickness factors">
        <TableHead>
          <TableRow>
            <TableCell>Rank</TableCell>
            <TableCell>Design layer</TableCell>
            <TableCell>Step</TableCell>
            <TableCell>Material</TableCell>
            <TableCell align="right">Design (nm)</TableCell>
            <TableCell align="right">Fitted (nm)</TableCell>
            <TableCell align="right">Factor</TableCell>
            <TableCell align="right">Deviation</TableCell>
            <TableCell />
          </TableRow>
        </TableHead>
        <TableBody>
          {summary.layers.map((l, i) => {
            const deviated = Math.abs(l.deviationPercent) >= DEVIATION_FLAG_PERCENT;
            return (
              <TableRow key={l.layer} selected={deviated} aria-label={`Design layer ${l.layer}`}>
                <TableCell>{i + 1}</TableCell>
                <TableCell>{l.layer}</TableCell>
                <TableCell>{layerCount - l.layer + 1}</TableCell>
                <TableCell>{materialName(l.materialId)}</TableCell>
                <TableCell align="right">{formatFixed(l.designNm, 1)}</TableCell>
                <TableCell align="right">{formatFixed(l.fittedNm, 1)}</TableCell>
                <TableCell align="right">{formatFixed(l.factor, 3)}</TableCell>
                <TableCell align="right">{`${formatSigned(l.deviationPercent, 2)} %`}</TableCell>
                <TableCell>
                  {deviated && <Chip size="small" color="warning" label="Likely deviated" />}
                </TableCell>
              </TableRow>
            );
          })}
        </TableBody>
      </Table>
      <Typography variant="caption" color="text.secondary">
        Design layer 1 is the outermost; step 1 was deposited first, next to the substrate.
      </Typography>
    </Box>
  );
}

/** The measured spectrum of a chamber run that is diagnosed. */
export interface DiagnosedSpectrum {
  id: number;
  runId: number;
  filename: string;
}

interface RunDiagnosisPanelProps {
  spectrum: DiagnosedSpectrum;
  layerCount: number;
  materialName: (materialId: number) => string;
  /** Engineers and admins run a diagnosis; operators see the run's latest one. */
  canRun?: boolean;
  pollMs?: number;
}

/** Run diagnosis: fits the layer thicknesses to the measured spectrum to find which layer went wrong. */
export function RunDiagnosisPanel({
  spectrum,
  layerCount,
  materialName,
  canRun = true,
  pollMs = CALCULATION_POLL_MS,
}: RunDiagnosisPanelProps) {
  const [calculationId, setCalculationId] = useState<number | null>(null);
  const start = useStartDiagnosis();
  const calculation = useCalculation(calculationId, pollMs);
  // The run's latest stored diagnosis until one is run here.
  const latest = useLatestDiagnosis(spectrum.runId);
  const { control, handleSubmit } = useForm<DiagnosisValues, unknown, DiagnosisRequest>({
    defaultValues: DIAGNOSIS_DEFAULTS,
    mode: 'onTouched',
    resolver: zodResolver(diagnosisFormSchema),
  });

  const onSubmit = handleSubmit(({ factorRange }) =>
    start.mutate(
      { runId: spectrum.runId, spectrumId: spectrum.id, factorRange },
      { onSuccess: (answer) => setCalculationId(answer.id) },
    ),
  );

  const calc =
    calculation.data ?? (calculationId === null ? (latest.data?.calculation ?? undefined) : undefined);
  const summary = calc?.status === 'completed' ? diagnosisSummaryOf(calc) : null;

  return (
    <Paper variant="outlined" sx={{ p: 2 }} component="section" aria-label="Run diagnosis">
      <Typography variant="h2" component="h2" gutterBottom>
        Run diagnosis
      </Typography>
      <Typography variant="body2" color="text.secondary" sx={{ mb: 1.5 }}>
        Fits every layer&apos;s thickness to {spectrum.filename} within the factor range, to find which layers
        most likely went wrong.
      </Typography>
      {!canRun && !calc && (
        <Typography variant="body2" color="text.secondary">
          No diagnosis of this run yet; an engineer runs it.
        </Typography>
      )}
      {canRun && (
        <Box
          component="form"
          noValidate
          onSubmit={onSubmit}
          sx={{ display: 'flex', gap: 1.5, flexWrap: 'wrap', alignItems: 'flex-start', mb: 2 }}
        >
          <FormTextField
            control={control}
            name="factorRange.0"
            label="Lowest factor"
            size="small"
            sx={{ width: 150 }}
            slotProps={{ htmlInput: { inputMode: 'decimal' } }}
            rules={{ deps: ['factorRange.1'] }}
          />
          <FormTextField
            control={control}
            name="factorRange.1"
            label="Highest factor"
            size="small"
            sx={{ width: 150 }}
            slotProps={{ htmlInput: { inputMode: 'decimal' } }}
          />
          <Button type="submit" variant="contained" loading={start.isPending}>
            Run diagnosis
          </Button>
        </Box>
      )}
      {start.error && <ErrorAlert error={start.error} title="Run diagnosis was not queued" sx={{ mb: 2 }} />}
      {calculation.isError && (
        <ErrorAlert error={calculation.error} title="The diagnosis could not be read" />
      )}
      {calc && (
        <Box sx={{ display: 'grid', gap: 1.5 }}>
          <CalculationStatus
            name="Diagnosis"
            calculation={calc}
            text={statusText(calc)}
            failedText="The diagnosis failed."
          />
          {summary && (
            <DiagnosisTable summary={summary} layerCount={layerCount} materialName={materialName} />
          )}
        </Box>
      )}
    </Paper>
  );
}
