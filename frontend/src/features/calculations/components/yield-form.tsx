import { zodResolver } from '@hookform/resolvers/zod';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import { useForm } from 'react-hook-form';
import { FormSelectField } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import { YIELD_DEFAULTS, yieldFormSchema, type YieldFormOutput, type YieldValues } from '../optimise-forms';

const DISTRIBUTIONS = [
  { value: 'normal', label: 'Normal (value is 1σ)' },
  { value: 'uniform', label: 'Uniform (value is half-width)' },
];

interface YieldFormProps {
  pending: boolean;
  onRun: (body: YieldFormOutput) => void;
}

/** Trials, seed and the thickness and index errors of a Yield forecast (Monte Carlo). */
export function YieldForm({ pending, onRun }: YieldFormProps) {
  const { control, handleSubmit } = useForm<YieldValues, unknown, YieldFormOutput>({
    defaultValues: YIELD_DEFAULTS,
    mode: 'onTouched',
    resolver: zodResolver(yieldFormSchema),
  });
  const text = (name: keyof YieldValues, label: string, width = 170) => (
    <FormTextField
      control={control}
      name={name}
      label={label}
      size="small"
      sx={{ width }}
      slotProps={{ htmlInput: { inputMode: 'decimal' } }}
    />
  );
  return (
    <Box
      component="form"
      noValidate
      aria-label="Yield forecast settings"
      onSubmit={handleSubmit(onRun)}
      sx={{ display: 'grid', gap: 1.5 }}
    >
      <Box sx={{ display: 'flex', gap: 1.5, flexWrap: 'wrap', alignItems: 'flex-start' }}>
        {text('trials', 'Trials', 140)}
        {text('seed', 'Seed', 140)}
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
        {text('relativePercent', 'Thickness error (%)')}
        {text('absoluteNm', 'Thickness error (nm)')}
        {text('systematicPercent', 'Rate error per material (%)', 210)}
        {text('indexPercent', 'Index error per material (%)', 210)}
      </Box>
      <Box>
        <Button type="submit" variant="contained" loading={pending}>
          Run Yield forecast
        </Button>
      </Box>
    </Box>
  );
}
