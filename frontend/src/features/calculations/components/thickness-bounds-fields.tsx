import type { Control, FieldPath, FieldValues } from 'react-hook-form';
import { FormTextField } from '../../../components/form-text-field';

interface Bounds {
  minThicknessNm: string;
  maxThicknessNm: string;
}

/**
 * The min and max layer thickness of Fit to mask and Grow layers; the form's schema refuses a max
 * below the min, so the max is checked again when the min changes.
 */
export function ThicknessBoundsFields<T extends FieldValues & Bounds, TOut extends FieldValues>({
  control,
}: {
  control: Control<T, unknown, TOut>;
}) {
  const min = 'minThicknessNm' as FieldPath<T>;
  const max = 'maxThicknessNm' as FieldPath<T>;
  return (
    <>
      <FormTextField
        control={control}
        name={min}
        label="Min thickness (nm)"
        size="small"
        sx={{ width: 170 }}
        rules={{ deps: [max] }}
      />
      <FormTextField
        control={control}
        name={max}
        label="Max thickness (nm)"
        size="small"
        sx={{ width: 170 }}
      />
    </>
  );
}
