import Box from '@mui/material/Box';
import TextField from '@mui/material/TextField';
import { RUN_SHEET_SIDES, SIDES_LABELS, runSheetQuerySchema, type RunSheetSides } from '@quietglass/shared';
import { useEffect, useState } from 'react';
import { parseNumberInput } from '../../../lib/format';
import type { RunSheetJobParams } from '../api/get-run-sheet';

interface RunSheetJobFieldsProps {
  job: RunSheetJobParams;
  /** The sides the design coats: the other choice is shown but cannot be picked. */
  designSides: RunSheetSides | null;
  /** The design's substrate thickness, shown as the placeholder. */
  designThicknessMm: number | null;
  onChange: (job: RunSheetJobParams) => void;
}

const { shape } = runSheetQuerySchema;

/** A typed value as the run sheet query takes it: the part's text, or the number typed (NaN when it is none). */
function typedValue(field: 'part' | 'quantity' | 'substrateThicknessMm', text: string): string | number {
  return field === 'part' ? text : (parseNumberInput(text) ?? Number.NaN);
}

/** Why a typed value cannot be used, checked by the API's own run sheet query schema; null when it can. */
export function jobFieldError(
  field: 'part' | 'quantity' | 'substrateThicknessMm',
  text: string,
): string | null {
  const t = text.trim();
  if (t === '') return null;
  const parsed = shape[field].safeParse(typedValue(field, t));
  return parsed.success ? null : (parsed.error.issues[0]?.message ?? 'Not valid');
}

/**
 * What this run coats: the part, how many, which sides and the substrate thickness. A typed value
 * is applied when the field is left or Enter is pressed, and only when it is valid.
 */
export function RunSheetJobFields({ job, designSides, designThicknessMm, onChange }: RunSheetJobFieldsProps) {
  const [part, setPart] = useState(job.part ?? '');
  const [quantity, setQuantity] = useState(job.quantity === null ? '' : String(job.quantity));
  const [thickness, setThickness] = useState(
    job.substrateThicknessMm === null ? '' : String(job.substrateThicknessMm),
  );
  useEffect(() => setPart(job.part ?? ''), [job.part]);
  useEffect(() => setQuantity(job.quantity === null ? '' : String(job.quantity)), [job.quantity]);
  useEffect(
    () => setThickness(job.substrateThicknessMm === null ? '' : String(job.substrateThicknessMm)),
    [job.substrateThicknessMm],
  );
  const errors = {
    part: jobFieldError('part', part),
    quantity: jobFieldError('quantity', quantity),
    substrateThicknessMm: jobFieldError('substrateThicknessMm', thickness),
  };
  const apply = () => {
    if (errors.part || errors.quantity || errors.substrateThicknessMm) return;
    const next: RunSheetJobParams = {
      ...job,
      part: part.trim() || null,
      quantity: quantity.trim() ? parseNumberInput(quantity) : null,
      substrateThicknessMm: thickness.trim() ? parseNumberInput(thickness) : null,
    };
    if (
      next.part !== job.part ||
      next.quantity !== job.quantity ||
      next.substrateThicknessMm !== job.substrateThicknessMm
    )
      onChange(next);
  };
  const onKeyDown = (event: React.KeyboardEvent) => {
    if (event.key === 'Enter') apply();
  };
  return (
    <Box
      sx={{ display: 'flex', gap: 2, flexWrap: 'wrap' }}
      data-print="hide"
      role="group"
      aria-label="What this run coats"
    >
      <TextField
        size="small"
        label="Part"
        value={part}
        onChange={(e) => setPart(e.target.value)}
        onBlur={apply}
        onKeyDown={onKeyDown}
        error={errors.part !== null}
        helperText={errors.part ?? ' '}
        sx={{ minWidth: 220 }}
      />
      <TextField
        size="small"
        label="Quantity"
        value={quantity}
        onChange={(e) => setQuantity(e.target.value)}
        onBlur={apply}
        onKeyDown={onKeyDown}
        error={errors.quantity !== null}
        helperText={errors.quantity ?? ' '}
        slotProps={{ htmlInput: { inputMode: 'numeric' } }}
        sx={{ width: 130 }}
      />
      <TextField
        size="small"
        label="Substrate thickness (mm)"
        value={thickness}
        placeholder={designThicknessMm === null ? undefined : String(designThicknessMm)}
        onChange={(e) => setThickness(e.target.value)}
        onBlur={apply}
        onKeyDown={onKeyDown}
        error={errors.substrateThicknessMm !== null}
        helperText={
          errors.substrateThicknessMm ??
          (designThicknessMm === null ? ' ' : `Design: ${designThicknessMm} mm`)
        }
        slotProps={{ htmlInput: { inputMode: 'decimal' }, inputLabel: { shrink: true } }}
        sx={{ width: 200 }}
      />
      <TextField
        select
        size="small"
        label="Sides to coat"
        value={job.sides ?? designSides ?? 'front'}
        onChange={(e) => onChange({ ...job, sides: e.target.value as RunSheetSides })}
        helperText="As the design's back surface says"
        slotProps={{ select: { native: true }, inputLabel: { shrink: true } }}
        sx={{ minWidth: 260 }}
      >
        {RUN_SHEET_SIDES.map((s) => (
          <option key={s} value={s} disabled={designSides !== null && s !== designSides}>
            {SIDES_LABELS[s]}
          </option>
        ))}
      </TextField>
    </Box>
  );
}
