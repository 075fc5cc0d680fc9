import { DEFAULT_TARGET_MARGIN_PERCENT, MAX_TARGET_MARGIN_PERCENT } from '@quietglass/shared';
import type { Control, FieldPath, FieldValues } from 'react-hook-form';
import { FormTextField } from '../../../components/form-text-field';
import { formatSigned } from '../../../lib/format';
import { numberIn } from '../form-rules';

/** The form's starting text for the target margin. */
export const DEFAULT_TARGET_MARGIN_TEXT = String(DEFAULT_TARGET_MARGIN_PERCENT);

/** Target margin of Fit to mask and Grow layers: how far inside every limit to design. */
export function TargetMarginField<T extends FieldValues & { targetMarginPercent: string }>({
  control,
}: {
  control: Control<T>;
}) {
  return (
    <FormTextField
      control={control}
      name={'targetMarginPercent' as FieldPath<T>}
      label="Target margin (pp)"
      size="small"
      sx={{ width: 170 }}
      helperText="Inside every limit"
      rules={{ validate: numberIn('Target margin', 0, MAX_TARGET_MARGIN_PERCENT, ' percentage points') }}
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
