import Box from '@mui/material/Box';
import { specMaskLabel, updateDesignSchema, type DesignView, type SpecMaskKind } from '@quietglass/shared';
import { useForm } from 'react-hook-form';
import { ErrorAlert } from '../../../components/error-alert';
import { FormDialog } from '../../../components/form-dialog';
import { FormSelectField } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import { schemaRule } from '../../../lib/validation';
import { useUpdateDesign } from '../api/update-design';

interface DesignDetailsValues {
  name: string;
  specMaskId: string;
}

interface DesignDetailsDialogProps {
  open: boolean;
  design: DesignView;
  /** The spec masks of the design's customer (a design cannot use another customer's mask). */
  specMasks: readonly { id: number; name: string; revision: string; kind: SpecMaskKind }[];
  onClose: () => void;
}

// The API's own rule for a design's name.
const NAME_RULES = schemaRule(updateDesignSchema.shape.name.unwrap());

function valuesOf(design: DesignView): DesignDetailsValues {
  return { name: design.name, specMaskId: design.specMaskId === null ? '' : String(design.specMaskId) };
}

/** Rename a design or change its spec mask (for instance to a new revision of the customer's mask). */
export function DesignDetailsDialog({ open, design, specMasks, onClose }: DesignDetailsDialogProps) {
  const update = useUpdateDesign();
  const { control, handleSubmit, reset } = useForm<DesignDetailsValues>({ values: valuesOf(design) });

  const close = () => {
    reset(valuesOf(design));
    update.reset();
    onClose();
  };

  const onSubmit = handleSubmit((values) =>
    update.mutate(
      {
        id: design.id,
        version: design.version,
        name: values.name.trim(),
        specMaskId: values.specMaskId === '' ? null : Number(values.specMaskId),
      },
      { onSuccess: () => onClose() },
    ),
  );

  return (
    <FormDialog
      open={open}
      title="Design details"
      submitLabel="Save details"
      pending={update.isPending}
      onSubmit={onSubmit}
      onClose={close}
    >
      {update.error && <ErrorAlert error={update.error} />}
      <Box sx={{ display: 'grid', gap: 2, mt: 1 }}>
        <FormTextField control={control} name="name" rules={NAME_RULES} label="Name" />
        <FormSelectField
          control={control}
          name="specMaskId"
          label="Spec mask"
          placeholder="No spec mask"
          helperText={`Masks of ${design.customer.name}; the change applies to every version's checks`}
          options={specMasks.map((m) => ({ value: String(m.id), label: specMaskLabel(m) }))}
        />
      </Box>
    </FormDialog>
  );
}
