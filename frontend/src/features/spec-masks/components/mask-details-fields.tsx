import Box from '@mui/material/Box';
import type { Control, FieldValues, UseFormSetValue } from 'react-hook-form';
import { FormSelectField, NEW_CUSTOMER_OPTION, namedOptions } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import { SPEC_MASK_KINDS, SPEC_MASK_KIND_LABELS } from '@quietglass/shared';
import type { MaskFormValues } from '../band-form';

const KIND_HELP =
  "Reports and quotes use customer specifications only; an internal design target is the shop's own, never sent out.";

interface MaskDetailsFieldsProps<TOut extends FieldValues> {
  /** The form's control; its schema checks these fields with the API's rules. */
  control: Control<MaskFormValues, unknown, TOut>;
  customers: readonly { id: number; name: string }[];
  setValue: UseFormSetValue<MaskFormValues>;
  /** "New customer…" in the customer picker: shows the form, then `choose` selects the new one. */
  onNewCustomer?: (choose: (customer: { id: number; name: string }) => void) => void;
}

/** Name, customer, revision and notes of a spec mask (its bands are edited apart). */
export function MaskDetailsFields<TOut extends FieldValues>({
  control,
  customers,
  setValue,
  onNewCustomer,
}: MaskDetailsFieldsProps<TOut>) {
  const newCustomer = onNewCustomer && {
    label: NEW_CUSTOMER_OPTION,
    onCreate: () => onNewCustomer((c) => setValue('customerId', String(c.id), { shouldValidate: true })),
  };
  return (
    <>
      <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', sm: '2fr 2fr 1fr' }, mt: 1 }}>
        <FormTextField control={control} name="name" label="Name" size="small" />
        <FormSelectField
          control={control}
          name="customerId"
          label="Customer"
          size="small"
          placeholder="Choose…"
          options={namedOptions(customers)}
          createOption={newCustomer}
        />
        <FormTextField control={control} name="revision" label="Revision" size="small" />
      </Box>
      <FormSelectField
        control={control}
        name="kind"
        label="What this mask is"
        size="small"
        options={SPEC_MASK_KINDS.map((k) => ({ value: k, label: SPEC_MASK_KIND_LABELS[k] }))}
        helperText={KIND_HELP}
      />
      <FormTextField control={control} name="notes" label="Notes" size="small" multiline maxRows={3} />
    </>
  );
}
