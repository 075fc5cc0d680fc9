import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import {
  MAX_ANALYSIS_ANGLES,
  MAX_ANALYSIS_WAVELENGTHS,
  plotRangeForMask,
  type AnalysisRequest,
  type LimitBand,
} from '@quietglass/shared';
import { useEffect, useState } from 'react';
import { useForm } from 'react-hook-form';
import { ErrorAlert } from '../../../components/error-alert';
import { FormTextField } from '../../../components/form-text-field';
import { parseNumberInput } from '../../../lib/format';
import { useCancelCalculation } from '../api/cancel-calculation';
import {
  CALCULATION_POLL_MS,
  isAnalysis,
  useCalculation,
  type CalculationView,
} from '../api/get-calculation';
import { useLatestCalculations } from '../api/get-latest-calculations';
import { useSubmitAnalysis } from '../api/submit-analysis';
import { AnalysisResults } from './analysis-results';
import { CalculationStatus } from './calculation-status';

interface AnalysisValues {
  fromNm: string;
  toNm: string;
  wavelengthCount: string;
  angleFromDeg: string;
  angleToDeg: string;
  angleCount: string;
  fieldWavelengthNm: string;
  fieldAngleDeg: string;
}

const DEFAULTS: AnalysisValues = {
  fromNm: '400',
  toNm: '800',
  wavelengthCount: '401',
  angleFromDeg: '0',
  angleToDeg: '60',
  angleCount: '13',
  fieldWavelengthNm: '',
  fieldAngleDeg: '',
};

/** The form's wavelengths and angles for the range that covers the mask (1 nm steps where they fit). */
export function maskAnalysisRange(
  maskBands: readonly LimitBand[] | null,
): Partial<Pick<AnalysisValues, 'fromNm' | 'toNm' | 'wavelengthCount' | 'angleToDeg'>> {
  if (!maskBands || maskBands.length === 0) return {};
  const range = plotRangeForMask(maskBands);
  const count = Math.min(MAX_ANALYSIS_WAVELENGTHS, Math.round(range.toNm - range.fromNm) + 1);
  const maxAngle = Math.max(...range.anglesDeg);
  return {
    fromNm: String(range.fromNm),
    toNm: String(range.toNm),
    wavelengthCount: String(count),
    angleToDeg: String(Math.min(85, Math.max(60, maxAngle))),
  };
}

// Rules of the engine's validateAnalysisRequest (shared/src/analysis.ts), which the API applies.
const num = (v: string) => parseNumberInput(v);
const positive = (what: string) => (v: string) => (num(v) ?? 0) > 0 || `${what} must be a number > 0`;
const angle = (v: string) => {
  const a = num(v);
  return (a !== null && a >= 0 && a < 90) || 'An angle from 0 to below 90°';
};
const count = (max: number) => (v: string) => {
  const n = num(v);
  return (n !== null && Number.isInteger(n) && n >= 1 && n <= max) || `A whole number from 1 to ${max}`;
};

function requestOf(values: AnalysisValues): AnalysisRequest {
  const request: AnalysisRequest = {
    fromNm: Number(values.fromNm),
    toNm: Number(values.toNm),
    wavelengthCount: Number(values.wavelengthCount),
    angleFromDeg: Number(values.angleFromDeg),
    angleToDeg: Number(values.angleToDeg),
    angleCount: Number(values.angleCount),
  };
  if (values.fieldWavelengthNm.trim() !== '') {
    request.fieldWavelengthNm = Number(values.fieldWavelengthNm);
    request.fieldAngleDeg = values.fieldAngleDeg.trim() === '' ? 0 : Number(values.fieldAngleDeg);
  }
  return request;
}

function statusText(c: CalculationView): string {
  const pct = `${Math.round(100 * c.progress)} %`;
  switch (c.status) {
    case 'queued':
      return `Calculation ${c.id} is queued`;
    case 'running':
      return `Calculation ${c.id} is running: ${pct}`;
    case 'completed':
      return `Calculation ${c.id} completed${c.computeMs !== null ? ` in ${(c.computeMs / 1000).toFixed(2)} s` : ''}`;
    case 'failed':
      return `Calculation ${c.id} failed`;
    case 'cancelled':
      return `Calculation ${c.id} was cancelled`;
  }
}

interface AnalysisPanelProps {
  designId: number;
  versionNumber: number;
  /** The signed-in role may queue and cancel calculations. */
  canSubmit: boolean;
  /** The design's mask: the form starts on the range that covers its bands. */
  maskBands?: readonly LimitBand[] | null;
  /** A calculation to show at first (opened from the compute queue) instead of the latest. */
  openCalculationId?: number | null;
  pollMs?: number;
}

/**
 * Full analysis of the saved version on the compute queue: the grid to compute, progress while it
 * runs (with Cancel), then the heat map, slices, colour against angle and field profile.
 */
export function AnalysisPanel({
  designId,
  versionNumber,
  canSubmit,
  maskBands = null,
  openCalculationId = null,
  pollMs = CALCULATION_POLL_MS,
}: AnalysisPanelProps) {
  const [calculationId, setCalculationId] = useState<number | null>(openCalculationId);
  const [reused, setReused] = useState(false);
  const submit = useSubmitAnalysis();
  const cancel = useCancelCalculation();
  // Until one is run here, the version's latest completed analysis is shown.
  const latest = useLatestCalculations(designId, versionNumber);
  const calculation = useCalculation(calculationId ?? latest.data?.analysis?.id ?? null, pollMs);
  const { control, handleSubmit, getFieldState, setValue } = useForm<AnalysisValues>({
    defaultValues: { ...DEFAULTS, ...maskAnalysisRange(maskBands) },
    mode: 'onTouched',
  });
  // A mask that arrives after the form opened moves the fields the engineer has not changed.
  useEffect(() => {
    const range = maskAnalysisRange(maskBands);
    for (const [name, value] of Object.entries(range) as [keyof typeof range, string][])
      if (!getFieldState(name).isDirty) setValue(name, value);
  }, [maskBands, getFieldState, setValue]);

  const onSubmit = handleSubmit((values) =>
    submit.mutate(
      { designId, versionNumber, request: requestOf(values) },
      {
        onSuccess: (answer) => {
          setReused(answer.reused);
          setCalculationId(answer.id);
        },
      },
    ),
  );

  const calc = calculation.data;
  const field = (
    name: keyof AnalysisValues,
    label: string,
    validate: (v: string, all: AnalysisValues) => true | string,
    width = 150,
  ) => (
    <FormTextField
      control={control}
      name={name}
      rules={{ validate }}
      label={label}
      size="small"
      disabled={!canSubmit}
      sx={{ width }}
      slotProps={{ htmlInput: { inputMode: 'decimal' } }}
    />
  );

  return (
    <Paper variant="outlined" sx={{ p: 2 }} component="section" aria-label="Full analysis">
      <Typography variant="h2" component="h2" gutterBottom>
        Full analysis
      </Typography>
      <Typography variant="body2" color="text.secondary" sx={{ mb: 2 }}>
        R, T and A of saved version {versionNumber} over wavelength × angle for s, p and unpolarised light,
        computed on the compute queue. Unsaved edits in the grid are not included.
      </Typography>
      {canSubmit ? (
        <Box component="form" noValidate onSubmit={onSubmit} sx={{ display: 'grid', gap: 1.5, mb: 2 }}>
          <Box sx={{ display: 'flex', gap: 1.5, flexWrap: 'wrap' }}>
            {field('fromNm', 'From (nm)', positive('From'))}
            {field(
              'toNm',
              'To (nm)',
              (v, all) => (num(v) ?? 0) > (num(all.fromNm) ?? Infinity) || 'Must exceed From',
            )}
            {field('wavelengthCount', 'Wavelengths', count(MAX_ANALYSIS_WAVELENGTHS))}
          </Box>
          <Box sx={{ display: 'flex', gap: 1.5, flexWrap: 'wrap' }}>
            {field('angleFromDeg', 'Angle from (°)', angle)}
            {field('angleToDeg', 'Angle to (°)', (v, all) => {
              const ok = angle(v);
              if (ok !== true) return ok;
              return (num(v) ?? 0) >= (num(all.angleFromDeg) ?? Infinity) || 'Must not be below Angle from';
            })}
            {field('angleCount', 'Angles', count(MAX_ANALYSIS_ANGLES))}
          </Box>
          <Box sx={{ display: 'flex', gap: 1.5, flexWrap: 'wrap' }}>
            {field(
              'fieldWavelengthNm',
              'Field profile at (nm)',
              (v) => v.trim() === '' || positive('The wavelength')(v),
              190,
            )}
            {field(
              'fieldAngleDeg',
              'Field profile angle (°)',
              (v, all) => {
                if (v.trim() === '') return true;
                if (all.fieldWavelengthNm.trim() === '') return 'Give the wavelength too';
                return angle(v);
              },
              190,
            )}
          </Box>
          <Box>
            <Button type="submit" variant="contained" loading={submit.isPending}>
              Run analysis
            </Button>
          </Box>
        </Box>
      ) : (
        <Alert severity="info" sx={{ mb: 2 }}>
          Engineers and administrators run analyses.
        </Alert>
      )}
      {submit.error && <ErrorAlert error={submit.error} title="The analysis was not queued" sx={{ mb: 2 }} />}
      {calculation.isError && (
        <ErrorAlert error={calculation.error} title="The calculation could not be read" />
      )}
      {calc && (
        <Box sx={{ display: 'grid', gap: 1.5 }}>
          {reused && (
            <Alert severity="info">
              An identical analysis was already on the queue; it is shown here instead of a new one.
            </Alert>
          )}
          <CalculationStatus
            name="Analysis"
            calculation={calc}
            text={statusText(calc)}
            onCancel={canSubmit ? () => cancel.mutate(calc.id) : undefined}
            cancelling={cancel.isPending}
          />
          {calc.status === 'completed' && isAnalysis(calc) && (
            <AnalysisResults key={calc.id} calculation={calc} maskBands={maskBands} />
          )}
        </Box>
      )}
    </Paper>
  );
}
