import { useEffect } from 'react';
import type { Control, FieldPath, FieldValues, PathValue, UseFormReturn } from 'react-hook-form';
import { FormTextField } from '../../../components/form-text-field';
import { formatSigned } from '../../../lib/format';
import { useShopTargetMargin } from '../../../lib/shop-settings';

type WithMargin = FieldValues & { targetMarginPercent: string };

/**
 * Starts the form's target margin at the shop's default once it has loaded, unless the engineer
 * has already typed one.
 */
export function useShopMarginDefault<T extends WithMargin, TOut extends FieldValues>(
  form: UseFormReturn<T, unknown, TOut>,
): void {
  const { percent, loaded } = useShopTargetMargin();
  useEffect(() => {
    const name = 'targetMarginPercent' as FieldPath<T>;
    if (loaded && !form.getFieldState(name).isDirty)
      form.resetField(name, { defaultValue: String(percent) as PathValue<T, FieldPath<T>> });
  }, [loaded, percent, form]);
}

/**
 * Target margin of Fit to mask and Grow layers: how far inside every limit to design (the form's
 * schema checks it with the shop setting's rule).
 */
export function TargetMarginField<T extends WithMargin, TOut extends FieldValues>({
  control,
}: {
  control: Control<T, unknown, TOut>;
}) {
  const { percent } = useShopTargetMargin();
  return (
    <FormTextField
      control={control}
      name={'targetMarginPercent' as FieldPath<T>}
      label="Target margin (pp)"
      size="small"
      sx={{ width: 170 }}
      helperText={`Inside every limit; shop default ${percent}`}
    />
  );
}

/** "worst margin +0.123 pp, target +0.100 pp reached" for a result. */
export function marginSummary(worstMargin: number, targetMarginPercent: number | undefined): string {
  const worst = `worst margin ${formatSigned(worstMargin)} percentage points`;
  if (targetMarginPercent === undefined) return worst;
  const reached = worstMargin >= targetMarginPercent - 1e-9;
  return `${worst}, target ${formatSigned(targetMarginPercent)} ${reached ? 'reached' : 'not reached'}`;
}
