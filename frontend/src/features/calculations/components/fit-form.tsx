import { zodResolver } from '@hookform/resolvers/zod';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import { useForm } from 'react-hook-form';
import { FormTextField } from '../../../components/form-text-field';
import { FIT_DEFAULTS, fitFormSchema, type FitFormOutput, type FitValues } from '../optimise-forms';
import { TargetMarginField, useShopMarginDefault } from './target-margin-field';
import { ThicknessBoundsFields } from './thickness-bounds-fields';

interface FitFormProps {
  pending: boolean;
  onRun: (body: FitFormOutput) => void;
}

/** Bounds, target margin and iterations of Fit to mask (Levenberg–Marquardt over the unlocked layers). */
export function FitForm({ pending, onRun }: FitFormProps) {
  const form = useForm<FitValues, unknown, FitFormOutput>({
    defaultValues: FIT_DEFAULTS,
    mode: 'onTouched',
    resolver: zodResolver(fitFormSchema),
  });
  const { control, handleSubmit } = form;
  useShopMarginDefault(form);
  return (
    <Box
      component="form"
      noValidate
      aria-label="Fit to mask settings"
      onSubmit={handleSubmit(onRun)}
      sx={{ display: 'flex', gap: 1.5, flexWrap: 'wrap', alignItems: 'flex-start' }}
    >
      <ThicknessBoundsFields control={control} />
      <TargetMarginField control={control} />
      <FormTextField
        control={control}
        name="maxIterations"
        label="Max iterations"
        size="small"
        sx={{ width: 150 }}
      />
      <Button type="submit" variant="contained" loading={pending} sx={{ mt: 0.25 }}>
        Run Fit to mask
      </Button>
    </Box>
  );
}
