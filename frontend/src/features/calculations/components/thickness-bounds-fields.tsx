import type { Control, FieldPath, FieldValues } from 'react-hook-form';
import { FormTextField } from '../../../components/form-text-field';
import { both, notBelowMin, numberIn } from '../form-rules';

/** Most thickness bound accepted, nm (the Layer grid's largest thickness). */
const MAX_BOUND_NM = 100_000;

interface Bounds {
  minThicknessNm: string;
  maxThicknessNm: string;
}

/** The min and max layer thickness of Fit to mask and Grow layers; max may not be below min. */
export function ThicknessBoundsFields<T extends FieldValues & Bounds>({ control }: { control: Control<T> }) {
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
        rules={{ deps: [max], validate: numberIn('Min thickness', 0, MAX_BOUND_NM, ' nm') }}
      />
      <FormTextField
        control={control}
        name={max}
        label="Max thickness (nm)"
        size="small"
        sx={{ width: 170 }}
        rules={{
          validate: (v, all) =>
            both(numberIn('Max thickness', 0, MAX_BOUND_NM, ' nm', true), notBelowMin(all.minThicknessNm))(v),
        }}
      />
    </>
  );
}
