import AddOutlined from '@mui/icons-material/AddOutlined';
import DeleteOutlined from '@mui/icons-material/DeleteOutlined';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import IconButton from '@mui/material/IconButton';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { zodResolver } from '@hookform/resolvers/zod';
import { useFieldArray, useForm, useFormState, useWatch, type Control } from 'react-hook-form';
import { ConflictAlert } from '../../../components/conflict-alert';
import { ErrorAlert } from '../../../components/error-alert';
import { FormDialog } from '../../../components/form-dialog';
import { FormSelectField } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import { ApiError } from '../../../lib/api-client';
import { notify } from '../../../lib/notifier';
import { useCreateSpecMask } from '../api/create-spec-mask';
import { getSpecMaskQueryOptions } from '../api/get-spec-mask';
import type { SpecMaskView } from '../api/get-spec-masks';
import { useUpdateSpecMask } from '../api/update-spec-mask';
import {
  BAND_ERROR_KEY,
  BOUND_LABELS,
  EMPTY_BAND,
  mapMaskError,
  maskFormSchema,
  validBands,
  valuesOfBand,
  type BandValues,
  type BoundType,
  type MaskFormOutput,
  type MaskFormValues,
} from '../band-form';
import { MaskDetailsFields } from './mask-details-fields';
import { MaskPreviewPlot } from './mask-preview-plot';

const POLARISATION_OPTIONS = [
  { value: 'avg', label: 'Average' },
  { value: 's', label: 's' },
  { value: 'p', label: 'p' },
];
const QUANTITY_OPTIONS = [
  { value: 'R', label: 'R' },
  { value: 'T', label: 'T' },
];
const ANGLE_MODE_OPTIONS = [
  { value: 'list', label: 'List' },
  { value: 'range', label: 'Range' },
];
const BAND_TEXT_FIELDS = [
  'fromNm',
  'toNm',
  'angles',
  'angleFrom',
  'angleTo',
  'angleStep',
  'value',
  'tolerance',
  'margin',
  'stepNm',
] as const satisfies readonly (keyof BandValues)[];
const BOUND_OPTIONS = (Object.keys(BOUND_LABELS) as BoundType[]).map((b) => ({
  value: b,
  label: BOUND_LABELS[b],
}));

function valuesOf(mask: SpecMaskView | null, customerId: number | null): MaskFormValues {
  if (!mask) {
    return {
      name: '',
      customerId: customerId === null ? '' : String(customerId),
      revision: 'A',
      kind: 'customer',
      notes: '',
      bands: [{ ...EMPTY_BAND }],
    };
  }
  return {
    name: mask.name,
    customerId: String(mask.customer.id),
    revision: mask.revision,
    kind: mask.kind,
    notes: mask.notes,
    bands: mask.bands.map(valuesOfBand),
  };
}

function BandFields({
  control,
  index,
  onRemove,
  canRemove,
  bandError,
}: {
  control: Control<MaskFormValues, unknown, MaskFormOutput>;
  index: number;
  onRemove: () => void;
  canRemove: boolean;
  /** A problem of the band as a whole the API reported (the form's own are in its errors). */
  bandError: string | undefined;
}) {
  const boundType = useWatch({ control, name: `bands.${index}.boundType` });
  const angleMode = useWatch({ control, name: `bands.${index}.angleMode` });
  const { errors } = useFormState({ control, name: `bands.${index}` });
  const ownError = (errors.bands?.[index] as Record<string, { message?: string }> | undefined)?.[
    BAND_ERROR_KEY
  ]?.message;
  // The engine names one problem of a band at a time: a change anywhere in the band checks all of it again.
  const together = { deps: BAND_TEXT_FIELDS.map((key) => `bands.${index}.${key}` as const) };
  const shownError = bandError ?? ownError;
  const n = index + 1;
  return (
    <Paper
      variant="outlined"
      component="fieldset"
      aria-label={`Limit band ${n}`}
      sx={{ p: 1.5, m: 0, border: 1, borderColor: 'divider' }}
    >
      <Box sx={{ display: 'flex', alignItems: 'center', mb: 1 }}>
        <Typography component="h3" variant="subtitle2" sx={{ flexGrow: 1 }}>
          Limit band {n}
        </Typography>
        <IconButton size="small" aria-label={`Remove band ${n}`} onClick={onRemove} disabled={!canRemove}>
          <DeleteOutlined fontSize="small" />
        </IconButton>
      </Box>
      {shownError && (
        <Alert severity="error" sx={{ mb: 1 }}>
          {shownError}
        </Alert>
      )}
      <Box
        sx={{
          display: 'grid',
          gap: 1.5,
          gridTemplateColumns: { xs: '1fr 1fr', md: 'repeat(6, minmax(0, 1fr))' },
        }}
      >
        <FormTextField
          control={control}
          name={`bands.${index}.fromNm`}
          rules={together}
          label="From (nm)"
          size="small"
        />
        <FormTextField
          control={control}
          name={`bands.${index}.toNm`}
          rules={together}
          label="To (nm)"
          size="small"
        />
        <FormSelectField
          control={control}
          name={`bands.${index}.angleMode`}
          label="Angles given as"
          size="small"
          options={ANGLE_MODE_OPTIONS}
        />
        {angleMode === 'range' ? (
          <>
            {(['angleFrom', 'angleTo', 'angleStep'] as const).map((key) => (
              <FormTextField
                key={key}
                control={control}
                name={`bands.${index}.${key}`}
                rules={together}
                label={{ angleFrom: 'Angle from (°)', angleTo: 'Angle to (°)', angleStep: 'Every (°)' }[key]}
                size="small"
                helperText={key === 'angleStep' ? 'Both ends included' : undefined}
              />
            ))}
          </>
        ) : (
          <FormTextField
            control={control}
            name={`bands.${index}.angles`}
            rules={together}
            label="Angles (°)"
            size="small"
            helperText="e.g. 0, 15, 30"
          />
        )}
        <FormSelectField
          control={control}
          name={`bands.${index}.polarisation`}
          label="Polarisation"
          size="small"
          options={POLARISATION_OPTIONS}
        />
        <FormSelectField
          control={control}
          name={`bands.${index}.quantity`}
          label="Quantity"
          size="small"
          options={QUANTITY_OPTIONS}
        />
        <FormSelectField
          control={control}
          name={`bands.${index}.boundType`}
          label="Bound"
          size="small"
          options={BOUND_OPTIONS}
        />
        <FormTextField
          control={control}
          name={`bands.${index}.value`}
          rules={together}
          label="Limit (%)"
          size="small"
          helperText="The customer's limit; reports judge this"
        />
        {boundType === 'target' && (
          <FormTextField
            control={control}
            name={`bands.${index}.tolerance`}
            rules={together}
            label="Tolerance (%)"
            size="small"
          />
        )}
        <FormTextField
          control={control}
          name={`bands.${index}.margin`}
          rules={together}
          label="Design margin"
          size="small"
          helperText="% points inside the limit the design aims for (optional)"
        />
        <FormTextField
          control={control}
          name={`bands.${index}.stepNm`}
          rules={together}
          label="Step (nm)"
          size="small"
          helperText="Optional"
        />
        <Box sx={{ gridColumn: { xs: 'span 2', md: 'span 2' } }}>
          <FormTextField
            control={control}
            name={`bands.${index}.label`}
            label="Label"
            size="small"
            fullWidth
          />
        </Box>
      </Box>
    </Paper>
  );
}

interface SpecMaskFormDialogProps {
  open: boolean;
  /** The mask to edit, or null for a new one. */
  mask: SpecMaskView | null;
  customers: readonly { id: number; name: string }[];
  /** Customer preselected for a new mask. */
  defaultCustomerId: number | null;
  onClose: () => void;
  /** "New customer…" in the customer picker: shows the form, then `choose` selects the new one. */
  onNewCustomer?: (choose: (customer: { id: number; name: string }) => void) => void;
}

/** A customer's spec mask: its limit bands, each a wavelength range, angles, polarisation and one bound. */
export function SpecMaskFormDialog({
  open,
  mask,
  customers,
  defaultCustomerId,
  onClose,
  onNewCustomer,
}: SpecMaskFormDialogProps) {
  const queryClient = useQueryClient();
  const create = useCreateSpecMask();
  const update = useUpdateSpecMask();
  const [base, setBase] = useState<SpecMaskView | null>(mask);
  const [bandErrors, setBandErrors] = useState<Record<number, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, reset, setError, setValue, formState } = useForm<
    MaskFormValues,
    unknown,
    MaskFormOutput
  >({
    defaultValues: valuesOf(mask, defaultCustomerId),
    resolver: zodResolver(maskFormSchema),
    mode: 'onTouched',
  });
  const { fields, append, remove } = useFieldArray({ control, name: 'bands' });
  const bands: BandValues[] = useWatch({ control, name: 'bands' });
  const mutation = mask ? update : create;
  const conflict = update.error instanceof ApiError && update.error.status === 409 ? update.error : null;

  const close = () => {
    create.reset();
    update.reset();
    onClose();
  };

  const showApiError = (error: Error) => {
    if (!(error instanceof ApiError) || error.status !== 400) return;
    const details = error.details.length > 0 ? error.details : [error.message];
    const perBand: Record<number, string> = {};
    const general: string[] = [];
    for (const detail of details) {
      const mapped = mapMaskError(detail);
      if (mapped.path)
        setError(mapped.path, { type: 'server', message: mapped.message }, { shouldFocus: true });
      else if (mapped.band !== null) perBand[mapped.band] = mapped.message;
      else general.push(mapped.message);
    }
    setBandErrors(perBand);
    setFormError(general.length > 0 ? general.join('; ') : null);
  };

  const onSubmit = handleSubmit((input) => {
    setBandErrors({});
    setFormError(null);
    const onSuccess = (saved: SpecMaskView) => {
      notify(`Spec mask ${saved.name} rev ${saved.revision} saved.`, 'success');
      close();
    };
    if (base)
      update.mutate(
        { id: base.id, version: base.version, mask: input },
        { onSuccess, onError: showApiError },
      );
    else create.mutate(input, { onSuccess, onError: showApiError });
  });

  const reload = async () => {
    if (!base) return;
    const fresh = await queryClient.fetchQuery({ ...getSpecMaskQueryOptions(base.id), staleTime: 0 });
    setBase(fresh);
    reset(valuesOf(fresh, null));
    update.reset();
  };

  const preview = validBands(bands ?? []);
  const maskError = formState.errors.bands?.root?.message ?? formError;
  const otherError =
    mutation.error && !conflict && !(mutation.error instanceof ApiError && mutation.error.status === 400)
      ? mutation.error
      : null;

  return (
    <FormDialog
      open={open}
      title={mask ? `Edit ${mask.name} rev ${mask.revision}` : 'New spec mask'}
      submitLabel="Save mask"
      pending={mutation.isPending}
      onSubmit={onSubmit}
      onClose={close}
      maxWidth="md"
    >
      {conflict && <ConflictAlert message={conflict.message} onReload={() => void reload()} />}
      {otherError && <ErrorAlert error={otherError} title="Not saved" />}
      {maskError && (
        <Alert severity="error" role="alert">
          {maskError}
        </Alert>
      )}
      {mutation.error instanceof ApiError && mutation.error.status === 400 && (
        <Alert severity="error" role="alert">
          Not saved: the marked fields have problems.
        </Alert>
      )}
      <MaskDetailsFields
        control={control}
        customers={customers}
        setValue={setValue}
        onNewCustomer={onNewCustomer}
      />
      <Box sx={{ display: 'grid', gap: 1.5 }}>
        {fields.map((f, index) => (
          <BandFields
            key={f.id}
            control={control}
            index={index}
            canRemove={fields.length > 1}
            onRemove={() => {
              remove(index);
              setBandErrors({});
            }}
            bandError={bandErrors[index]}
          />
        ))}
      </Box>
      <Box>
        <Button startIcon={<AddOutlined />} onClick={() => append({ ...EMPTY_BAND })}>
          Add band
        </Button>
      </Box>
      <MaskPreviewPlot bands={preview} title="Mask preview" />
    </FormDialog>
  );
}
