import Box from '@mui/material/Box';
import type { Control, UseFormSetValue } from 'react-hook-form';
import { FormSelectField, NEW_CUSTOMER_OPTION, namedOptions } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import { SPEC_MASK_KINDS, SPEC_MASK_KIND_LABELS } from '@quietglass/shared';
import type { MaskFormValues } from '../band-form';
import { fieldText } from '../../../lib/format';

const KIND_HELP =
  "Reports and quotes use customer specifications only; an internal design target is the shop's own, never sent out.";

// SpecMaskDto: name 1–160 characters, a customer, revision 1–20 characters, notes ≤ 4000.
const MAX_NAME = 160;
const MAX_REVISION = 20;
const MAX_NOTES = 4000;

interface MaskDetailsFieldsProps {
  control: Control<MaskFormValues>;
  customers: readonly { id: number; name: string }[];
  setValue: UseFormSetValue<MaskFormValues>;
  /** "New customer…" in the customer picker: shows the form, then `choose` selects the new one. */
  onNewCustomer?: (choose: (customer: { id: number; name: string }) => void) => void;
}

/** Name, customer, revision and notes of a spec mask (its bands are edited apart). */
export function MaskDetailsFields({ control, customers, setValue, onNewCustomer }: MaskDetailsFieldsProps) {
  const newCustomer = onNewCustomer && {
    label: NEW_CUSTOMER_OPTION,
    onCreate: () => onNewCustomer((c) => setValue('customerId', String(c.id), { shouldValidate: true })),
  };
  return (
    <>
      <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', sm: '2fr 2fr 1fr' }, mt: 1 }}>
        <FormTextField
          control={control}
          name="name"
          rules={{
            validate: (v) => fieldText(v).trim() !== '' || 'Enter a name',
            maxLength: { value: MAX_NAME, message: `At most ${MAX_NAME} characters` },
          }}
          label="Name"
          size="small"
        />
        <FormSelectField
          control={control}
          name="customerId"
          rules={{ validate: (v) => v !== '' || 'Choose the customer' }}
          label="Customer"
          size="small"
          placeholder="Choose…"
          options={namedOptions(customers)}
          createOption={newCustomer}
        />
        <FormTextField
          control={control}
          name="revision"
          rules={{
            validate: (v) => fieldText(v).trim() !== '' || 'Enter a revision',
            maxLength: { value: MAX_REVISION, message: `At most ${MAX_REVISION} characters` },
          }}
          label="Revision"
          size="small"
        />
      </Box>
      <FormSelectField
        control={control}
        name="kind"
        label="What this mask is"
        size="small"
        options={SPEC_MASK_KINDS.map((k) => ({ value: k, label: SPEC_MASK_KIND_LABELS[k] }))}
        helperText={KIND_HELP}
      />
      <FormTextField
        control={control}
        name="notes"
        rules={{ maxLength: { value: MAX_NOTES, message: `At most ${MAX_NOTES} characters` } }}
        label="Notes"
        size="small"
        multiline
        maxRows={3}
      />
    </>
  );
}
