import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import { useForm } from 'react-hook-form';
import { FormSelectField } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import type { YieldRequest } from '../api/submit-optimisation';
import { numberIn, wholeIn } from '../form-rules';

/** Most trials of one forecast (YieldDto, the engine's MAX_TRIALS). */
export const MAX_YIELD_TRIALS = 100_000;

interface YieldValues {
  trials: string;
  seed: string;
  relativePercent: string;
  absoluteNm: string;
  distribution: 'normal' | 'uniform';
  systematicPercent: string;
  indexPercent: string;
}

const DEFAULTS: YieldValues = {
  trials: '2000',
  seed: '1',
  relativePercent: '1',
  absoluteNm: '0',
  distribution: 'normal',
  systematicPercent: '0',
  indexPercent: '0',
};

const DISTRIBUTIONS = [
  { value: 'normal', label: 'Normal (value is 1σ)' },
  { value: 'uniform', label: 'Uniform (value is half-width)' },
];

interface YieldFormProps {
  pending: boolean;
  onRun: (body: YieldRequest) => void;
}

/** Trials, seed and the thickness and index errors of a Yield forecast (Monte Carlo). */
export function YieldForm({ pending, onRun }: YieldFormProps) {
  const { control, handleSubmit } = useForm<YieldValues>({ defaultValues: DEFAULTS, mode: 'onTouched' });
  const onSubmit = handleSubmit((v) =>
    onRun({
      trials: Number(v.trials),
      seed: Number(v.seed),
      thickness: {
        relativePercent: Number(v.relativePercent),
        absoluteNm: Number(v.absoluteNm),
        distribution: v.distribution,
      },
      systematicPercent: Number(v.systematicPercent),
      indexPercent: Number(v.indexPercent),
    }),
  );
  const text = (
    name: keyof YieldValues,
    label: string,
    validate: (v: string) => true | string,
    width = 170,
  ) => (
    <FormTextField
      control={control}
      name={name}
      label={label}
      size="small"
      sx={{ width }}
      rules={{ validate }}
      slotProps={{ htmlInput: { inputMode: 'decimal' } }}
    />
  );
  return (
    <Box
      component="form"
      noValidate
      aria-label="Yield forecast settings"
      onSubmit={onSubmit}
      sx={{ display: 'grid', gap: 1.5 }}
    >
      <Box sx={{ display: 'flex', gap: 1.5, flexWrap: 'wrap', alignItems: 'flex-start' }}>
        {text('trials', 'Trials', wholeIn('Trials', 1, MAX_YIELD_TRIALS), 140)}
        {text('seed', 'Seed', wholeIn('The seed', 0, 4_294_967_295), 140)}
        <FormSelectField
          control={control}
          name="distribution"
          label="Error distribution"
          options={DISTRIBUTIONS}
          size="small"
          sx={{ width: 240 }}
        />
      </Box>
      <Box sx={{ display: 'flex', gap: 1.5, flexWrap: 'wrap', alignItems: 'flex-start' }}>
        {text('relativePercent', 'Thickness error (%)', numberIn('The thickness error', 0, 50, ' %'))}
        {text('absoluteNm', 'Thickness error (nm)', numberIn('The thickness error', 0, 100, ' nm'))}
        {text(
          'systematicPercent',
          'Rate error per material (%)',
          numberIn('The rate error', 0, 50, ' %'),
          210,
        )}
        {text('indexPercent', 'Index error per material (%)', numberIn('The index error', 0, 20, ' %'), 210)}
      </Box>
      <Box>
        <Button type="submit" variant="contained" loading={pending}>
          Run Yield forecast
        </Button>
      </Box>
    </Box>
  );
}
