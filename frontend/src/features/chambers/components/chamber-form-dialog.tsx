import { pickableMaterials } from '@quietglass/shared';
import AddOutlined from '@mui/icons-material/AddOutlined';
import DeleteOutlined from '@mui/icons-material/DeleteOutlined';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import IconButton from '@mui/material/IconButton';
import Typography from '@mui/material/Typography';
import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { zodResolver } from '@hookform/resolvers/zod';
import { useFieldArray, useForm } from 'react-hook-form';
import { ConflictAlert } from '../../../components/conflict-alert';
import { ErrorAlert } from '../../../components/error-alert';
import { FormDialog } from '../../../components/form-dialog';
import { FormSelectField, namedOptions } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import { ApiError } from '../../../lib/api-client';
import { notify } from '../../../lib/notifier';
import { useCreateChamber } from '../api/create-chamber';
import { getChambersQueryOptions, type ChamberView } from '../api/get-chambers';
import { useUpdateChamber } from '../api/update-chamber';
import {
  EMPTY_MATERIAL_ROW,
  chamberFormSchema,
  valuesOfChamber,
  type ChamberFormOutput,
  type ChamberFormValues,
} from '../chamber-form';

interface ChamberFormDialogProps {
  open: boolean;
  /** The chamber to edit, or null for a new one. */
  chamber: ChamberView | null;
  materials: readonly { id: number; name: string }[];
  onClose: () => void;
}

/** A chamber's name, monitor, and tooling factor and rate per material. */
export function ChamberFormDialog({ open, chamber, materials, onClose }: ChamberFormDialogProps) {
  const queryClient = useQueryClient();
  const create = useCreateChamber();
  const update = useUpdateChamber();
  const [base, setBase] = useState<ChamberView | null>(chamber);
  const { control, handleSubmit, reset } = useForm<ChamberFormValues, unknown, ChamberFormOutput>({
    defaultValues: valuesOfChamber(chamber),
    resolver: zodResolver(chamberFormSchema),
    mode: 'onTouched',
  });
  const { fields, append, remove } = useFieldArray({ control, name: 'materials' });
  const mutation = chamber ? update : create;
  const conflict = update.error instanceof ApiError && update.error.status === 409 ? update.error : null;
  const options = namedOptions(
    pickableMaterials(
      materials,
      (chamber?.materials ?? [])
        .map((m) => m.materialId)
        .concat(chamber ? [chamber.monitorChipMaterialId] : []),
    ),
  );
  const close = () => {
    create.reset();
    update.reset();
    onClose();
  };

  const onSubmit = handleSubmit((input) => {
    const onSuccess = (saved: ChamberView) => {
      notify(`Chamber ${saved.name} saved.`, 'success');
      close();
    };
    if (base) update.mutate({ id: base.id, version: base.version, chamber: input }, { onSuccess });
    else create.mutate(input, { onSuccess });
  });

  const reload = async () => {
    if (!base) return;
    const list = await queryClient.fetchQuery({ ...getChambersQueryOptions(), staleTime: 0 });
    const fresh = list.find((c) => c.id === base.id) ?? null;
    setBase(fresh);
    reset(valuesOfChamber(fresh));
    update.reset();
  };

  return (
    <FormDialog
      open={open}
      title={chamber ? `Edit ${chamber.name}` : 'New chamber'}
      submitLabel="Save chamber"
      pending={mutation.isPending}
      onSubmit={onSubmit}
      onClose={close}
      maxWidth="md"
    >
      {conflict && <ConflictAlert message={conflict.message} onReload={() => void reload()} />}
      {mutation.error && !conflict && <ErrorAlert error={mutation.error} title="Not saved" />}
      <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', md: '2fr 1fr 1fr' }, pt: 1 }}>
        <FormTextField control={control} name="name" label="Name" />
        <FormTextField
          control={control}
          name="monitorWavelengths"
          label="Monitor wavelengths (nm)"
          helperText="e.g. 550, 632.8"
        />
        <FormSelectField
          control={control}
          name="monitorChipMaterialId"
          label="Monitor chip material"
          placeholder="Choose…"
          options={options}
        />
      </Box>
      <Box component="fieldset" aria-label="Tooling factors and rates" sx={{ border: 0, p: 0, m: 0 }}>
        <Typography component="legend" variant="subtitle1" sx={{ fontWeight: 600, mb: 0.5 }}>
          Tooling factors and rates
        </Typography>
        <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
          Tooling factor = thickness on the part ÷ thickness on the monitor. Rates are the defaults set at the
          monitor, in nm/s.
        </Typography>
        {fields.length === 0 && (
          <Alert severity="info" sx={{ mb: 1 }}>
            No materials yet: run sheets need a row for every material of the recipe.
          </Alert>
        )}
        <Box sx={{ display: 'grid', gap: 1.5 }}>
          {fields.map((f, index) => (
            <Box
              key={f.id}
              role="group"
              aria-label={`Material row ${index + 1}`}
              sx={{ display: 'grid', gap: 1.5, gridTemplateColumns: '2fr 1fr 1fr auto', alignItems: 'start' }}
            >
              <FormSelectField
                control={control}
                name={`materials.${index}.materialId`}
                label="Material"
                size="small"
                placeholder="Choose…"
                options={options}
              />
              <FormTextField
                control={control}
                name={`materials.${index}.toolingFactor`}
                label="Tooling factor"
                size="small"
              />
              <FormTextField
                control={control}
                name={`materials.${index}.rateNmPerS`}
                label="Rate (nm/s)"
                size="small"
              />
              <IconButton aria-label={`Remove material row ${index + 1}`} onClick={() => remove(index)}>
                <DeleteOutlined fontSize="small" />
              </IconButton>
            </Box>
          ))}
        </Box>
        <Button startIcon={<AddOutlined />} onClick={() => append({ ...EMPTY_MATERIAL_ROW })} sx={{ mt: 1 }}>
          Add material
        </Button>
      </Box>
      <FormTextField control={control} name="notes" label="Notes" multiline minRows={2} />
    </FormDialog>
  );
}
