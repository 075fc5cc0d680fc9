import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import { useForm } from 'react-hook-form';
import { FormTextField } from '../../../components/form-text-field';
import type { FitRequest } from '../api/submit-optimisation';
import { wholeIn } from '../form-rules';
import { DEFAULT_TARGET_MARGIN_TEXT, TargetMarginField, useShopMarginDefault } from './target-margin-field';
import { ThicknessBoundsFields } from './thickness-bounds-fields';

interface FitValues {
  minThicknessNm: string;
  maxThicknessNm: string;
  maxIterations: string;
  targetMarginPercent: string;
}

const DEFAULTS: FitValues = {
  minThicknessNm: '10',
  maxThicknessNm: '1000',
  maxIterations: '100',
  targetMarginPercent: DEFAULT_TARGET_MARGIN_TEXT,
};

interface FitFormProps {
  pending: boolean;
  onRun: (body: FitRequest) => void;
}

/** Bounds, target margin and iterations of Fit to mask (Levenberg–Marquardt over the unlocked layers). */
export function FitForm({ pending, onRun }: FitFormProps) {
  const form = useForm<FitValues>({ defaultValues: DEFAULTS, mode: 'onTouched' });
  const { control, handleSubmit } = form;
  useShopMarginDefault(form);
  const onSubmit = handleSubmit((v) =>
    onRun({
      minThicknessNm: Number(v.minThicknessNm),
      maxThicknessNm: Number(v.maxThicknessNm),
      maxIterations: Number(v.maxIterations),
      targetMarginPercent: Number(v.targetMarginPercent),
    }),
  );
  return (
    <Box
      component="form"
      noValidate
      aria-label="Fit to mask settings"
      onSubmit={onSubmit}
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
        rules={{ validate: wholeIn('Max iterations', 1, 1000) }}
      />
      <Button type="submit" variant="contained" loading={pending} sx={{ mt: 0.25 }}>
        Run Fit to mask
      </Button>
    </Box>
  );
}
