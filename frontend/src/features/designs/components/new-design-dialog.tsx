import Box from '@mui/material/Box';
import { createDesignSchema, specMaskLabel, type DesignView, type SpecMaskKind } from '@quietglass/shared';
import { useEffect } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { ErrorAlert } from '../../../components/error-alert';
import { FormDialog } from '../../../components/form-dialog';
import { FormSelectField, NEW_CUSTOMER_OPTION, namedOptions } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import { chosenId, schemaRule } from '../../../lib/validation';
import { useCreateDesign } from '../api/create-design';
import { contentOf, type HeaderValues } from '../header';
import type { LibraryMaterial } from '../layers';
import { VersionHeaderFields } from './version-header-fields';

export interface NewDesignValues extends HeaderValues {
  name: string;
  customerId: string;
  specMaskId: string;
}

interface NewDesignDialogProps {
  open: boolean;
  onClose: () => void;
  onCreated: (design: DesignView) => void;
  customers: readonly { id: number; name: string }[];
  specMasks: readonly {
    id: number;
    name: string;
    revision: string;
    customer: { id: number };
    kind: SpecMaskKind;
  }[];
  materials: readonly LibraryMaterial[];
  /** "New customer…" in the customer picker: shows the form, then `choose` selects the new one. */
  onNewCustomer?: (choose: (customer: { id: number; name: string }) => void) => void;
}

// The API's own rules for the design's name and customer.
const NAME_RULES = schemaRule(createDesignSchema.shape.name);
const CUSTOMER_RULES = schemaRule(chosenId.pipe(createDesignSchema.shape.customerId));

function emptyValues(materials: readonly LibraryMaterial[]): NewDesignValues {
  const air = materials.find((m) => m.name.toLowerCase() === 'air');
  return {
    name: '',
    customerId: '',
    specMaskId: '',
    incidentMaterialId: air ? String(air.id) : '',
    substrateMaterialId: '',
    substrateThicknessMm: '',
    backSurface: 'front-only',
    // 550 nm, the middle of the visible band, is the usual reference for visible AR (common practice, no source).
    referenceWavelengthNm: '550',
    notes: '',
  };
}

/** A new stack design: its customer, their spec mask, the media and the reference wavelength. */
export function NewDesignDialog({
  open,
  onClose,
  onCreated,
  customers,
  specMasks,
  materials,
  onNewCustomer,
}: NewDesignDialogProps) {
  const createDesign = useCreateDesign();
  const { control, handleSubmit, reset, setValue } = useForm<NewDesignValues>({
    defaultValues: emptyValues(materials),
  });
  const customerId = useWatch({ control, name: 'customerId' });
  const masksOfCustomer = specMasks.filter((m) => String(m.customer.id) === customerId);
  // A mask belongs to one customer: choosing another customer clears it.
  useEffect(() => setValue('specMaskId', ''), [customerId, setValue]);

  const close = () => {
    reset(emptyValues(materials));
    createDesign.reset();
    onClose();
  };

  const onSubmit = handleSubmit((values) =>
    createDesign.mutate(
      {
        name: values.name.trim(),
        customerId: Number(values.customerId),
        specMaskId: values.specMaskId === '' ? null : Number(values.specMaskId),
        ...contentOf(values, []),
      },
      {
        onSuccess: (design) => {
          close();
          onCreated(design);
        },
      },
    ),
  );

  return (
    <FormDialog
      open={open}
      title="New design"
      submitLabel="Create design"
      pending={createDesign.isPending}
      onSubmit={onSubmit}
      onClose={close}
      maxWidth="md"
    >
      {createDesign.error && <ErrorAlert error={createDesign.error} />}
      <Box
        sx={{
          display: 'grid',
          gap: 2,
          gridTemplateColumns: { xs: '1fr', sm: 'repeat(3, minmax(0, 1fr))' },
          mt: 1,
        }}
      >
        <FormTextField control={control} name="name" rules={NAME_RULES} label="Name" />
        <FormSelectField
          control={control}
          name="customerId"
          rules={CUSTOMER_RULES}
          label="Customer"
          placeholder="Choose…"
          options={namedOptions(customers)}
          createOption={
            onNewCustomer && {
              label: NEW_CUSTOMER_OPTION,
              onCreate: () =>
                onNewCustomer((c) => setValue('customerId', String(c.id), { shouldValidate: true })),
            }
          }
        />
        <FormSelectField
          control={control}
          name="specMaskId"
          label="Spec mask"
          placeholder="No spec mask"
          disabled={customerId === ''}
          helperText={
            customerId === '' ? 'Choose the customer first' : `${masksOfCustomer.length} of their masks`
          }
          options={masksOfCustomer.map((m) => ({
            value: String(m.id),
            label: specMaskLabel(m),
          }))}
        />
      </Box>
      <VersionHeaderFields control={control} materials={materials} disabled={false} size="medium" />
    </FormDialog>
  );
}
