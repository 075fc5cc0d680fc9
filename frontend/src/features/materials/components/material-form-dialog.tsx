import Box from '@mui/material/Box';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { PROVENANCE_KINDS, PROVENANCE_KIND_LABELS, type MaterialModel } from '@quietglass/shared';
import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { ConflictAlert } from '../../../components/conflict-alert';
import { ErrorAlert } from '../../../components/error-alert';
import { FormCheckboxField } from '../../../components/form-checkbox-field';
import { FormDialog } from '../../../components/form-dialog';
import { FormSelectField } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import { ApiError } from '../../../lib/api-client';
import { notify } from '../../../lib/notifier';
import { useCreateMaterial } from '../api/create-material';
import { getMaterialQueryOptions } from '../api/get-material';
import type { MaterialView } from '../api/get-materials';
import { useUpdateMaterial } from '../api/update-material';
import {
  EMPTY_MATERIAL_VALUES,
  MODEL_KIND_LABELS,
  convertSellmeierC,
  materialInputOf,
  materialRules,
  readIndex,
  valuesOf,
  type MaterialFormValues,
  type SellmeierForm,
} from '../material-form';

/** The d line (587.6 nm, helium), where glass catalogues state nd. */
const D_LINE_NM = 587.6;

interface MaterialFormDialogProps {
  open: boolean;
  /** The material to edit, or null for a new one. */
  material: MaterialView | null;
  onClose: () => void;
  /** Told the saved material (new or edited), e.g. to select it. */
  onSaved?: (saved: MaterialView) => void;
  /** The design reference wavelength for the live readout (nm; 550 when not given). */
  referenceWavelengthNm?: number;
}

/** Create or edit a material: constant, Cauchy or Sellmeier model, valid range and provenance. */
export function MaterialFormDialog({
  open,
  material,
  onClose,
  onSaved,
  referenceWavelengthNm,
}: MaterialFormDialogProps) {
  const queryClient = useQueryClient();
  const create = useCreateMaterial();
  const update = useUpdateMaterial();
  // The version the edit is based on; replaced by Reload after a conflict.
  const [base, setBase] = useState<MaterialView | null>(material);
  const [reloadError, setReloadError] = useState<Error | null>(null);
  const { control, handleSubmit, reset, getValues, setValue } = useForm<MaterialFormValues>({
    defaultValues: material ? valuesOf(material) : EMPTY_MATERIAL_VALUES,
    mode: 'onTouched',
  });
  const kind = useWatch({ control, name: 'kind' });
  const provenanceKind = useWatch({ control, name: 'provenanceKind' });
  const sellmeierForm = useWatch({ control, name: 'sellmeierForm' });
  const [referenceText, setReferenceText] = useState(String(referenceWavelengthNm ?? 550));
  const mutation = material ? update : create;
  const conflict = update.error instanceof ApiError && update.error.status === 409 ? update.error : null;

  const close = () => {
    create.reset();
    update.reset();
    onClose();
  };

  const onSubmit = handleSubmit((values) => {
    const input = materialInputOf(values, base?.model ?? null);
    const onSuccess = (saved: MaterialView) => {
      notify(`${saved.name} ${material ? 'saved' : 'added to the library'}.`, 'success');
      onSaved?.(saved);
      close();
    };
    if (base) update.mutate({ id: base.id, version: base.version, material: input }, { onSuccess });
    else create.mutate(input, { onSuccess });
  });

  const reload = async () => {
    if (!base) return;
    try {
      const fresh = await queryClient.fetchQuery({ ...getMaterialQueryOptions(base.id), staleTime: 0 });
      setBase(fresh);
      reset(valuesOf(fresh));
      update.reset();
      setReloadError(null);
    } catch (error) {
      setReloadError(error instanceof Error ? error : new Error(String(error)));
    }
  };

  const changeSellmeierForm = (to: SellmeierForm) => {
    if (to === getValues('sellmeierForm')) return;
    for (const i of [1, 2, 3] as const) setValue(`C${i}`, convertSellmeierC(getValues(`C${i}`), to));
    setValue('sellmeierForm', to);
  };

  const numberField = (
    name: keyof MaterialFormValues,
    label: string,
    validate: (v: string, all: MaterialFormValues) => true | string,
  ) => (
    <FormTextField
      control={control}
      name={name}
      rules={{ validate: (v, all) => validate(String(v), all) }}
      label={label}
      size="small"
      slotProps={{ htmlInput: { inputMode: 'decimal' } }}
    />
  );

  return (
    <FormDialog
      open={open}
      title={material ? `Edit ${material.name}` : 'New material'}
      submitLabel={material ? 'Save material' : 'Add material'}
      pending={mutation.isPending}
      onSubmit={onSubmit}
      onClose={close}
      maxWidth="md"
    >
      {conflict && <ConflictAlert message={conflict.message} onReload={() => void reload()} />}
      {reloadError && <ErrorAlert error={reloadError} title="The material could not be reloaded" />}
      {mutation.error && !conflict && <ErrorAlert error={mutation.error} title="Not saved" />}
      <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', sm: '2fr 1fr' }, mt: 1 }}>
        <FormTextField
          control={control}
          name="name"
          rules={{ validate: (v) => materialRules.name(String(v)) }}
          label="Name"
          size="small"
        />
        <FormSelectField
          control={control}
          name="kind"
          label="Dispersion model"
          size="small"
          disabled={kind === 'table'}
          options={(kind === 'table'
            ? (['table'] as const)
            : (['constant', 'cauchy', 'sellmeier'] as const)
          ).map((k) => ({ value: k, label: MODEL_KIND_LABELS[k] }))}
        />
      </Box>
      {kind === 'constant' && (
        <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: 'repeat(2, minmax(0, 1fr))' }}>
          {numberField('n', 'n', materialRules.n)}
          {numberField('k', 'k', materialRules.k)}
        </Box>
      )}
      {kind === 'cauchy' && (
        <>
          <Typography variant="body2" color="text.secondary">
            n(λ) = A + B/λ² + C/λ⁴ with λ in µm.
          </Typography>
          <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: 'repeat(4, minmax(0, 1fr))' }}>
            {numberField('A', 'A', materialRules.A)}
            {numberField('B', 'B (µm²)', materialRules.cauchyB)}
            {numberField('C', 'C (µm⁴)', materialRules.cauchyC)}
            {base?.model.model === 'cauchy' && base.model.absorption ? (
              <Typography variant="body2" color="text.secondary">
                k follows the saved absorption tail (kept as is).
              </Typography>
            ) : (
              numberField('k', 'k', materialRules.k)
            )}
          </Box>
        </>
      )}
      {kind === 'sellmeier' && (
        <>
          <Typography variant="body2" color="text.secondary">
            n²(λ) = 1 + Σ Bᵢλ²/(λ² − Cᵢ) with λ in µm; one to three terms. Cᵢ in µm², or the resonance
            wavelength λᵢ in µm as many publications give it (Cᵢ = λᵢ²).
          </Typography>
          <TextField
            select
            label="Enter the poles as"
            size="small"
            value={sellmeierForm}
            onChange={(e) => changeSellmeierForm(e.target.value as SellmeierForm)}
            slotProps={{ select: { native: true } }}
            sx={{ maxWidth: 320 }}
          >
            <option value="C">Cᵢ in µm²</option>
            <option value="lambda">Resonance wavelength λᵢ in µm</option>
          </TextField>
          <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: 'repeat(3, minmax(0, 1fr))' }}>
            {([1, 2, 3] as const).map((i) => (
              <Box key={i} sx={{ display: 'grid', gap: 1 }}>
                {numberField(`B${i}`, `B${i}`, materialRules.sellmeierB(i))}
                {sellmeierForm === 'lambda'
                  ? numberField(`C${i}`, `λ${i} (µm)`, materialRules.sellmeierC(i))
                  : numberField(`C${i}`, `C${i} (µm²)`, materialRules.sellmeierC(i))}
              </Box>
            ))}
          </Box>
          <Box sx={{ maxWidth: 200 }}>{numberField('k', 'k', materialRules.k)}</Box>
        </>
      )}
      {kind === 'table' && (
        <Typography variant="body2" color="text.secondary">
          Tabulated n,k data from a file; upload a new file to change the values. The name, range and
          provenance can be edited here.
        </Typography>
      )}
      <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: 'repeat(2, minmax(0, 1fr))' }}>
        {numberField('rangeFrom', 'Valid from (nm)', materialRules.rangeFrom)}
        {numberField('rangeTo', 'Valid to (nm)', materialRules.rangeTo)}
      </Box>
      <FormCheckboxField
        control={control}
        name="holdOutside"
        label="Outside the valid range, hold the end values and warn (otherwise calculations there are refused)"
      />
      {kind !== 'table' && (
        <IndexReadout
          control={control}
          original={base?.model ?? null}
          referenceText={referenceText}
          onReferenceChange={setReferenceText}
        />
      )}
      <FormSelectField
        control={control}
        name="provenanceKind"
        rules={{ validate: (v) => materialRules.provenanceKind(String(v)) }}
        label="Provenance"
        size="small"
        placeholder="Choose…"
        options={PROVENANCE_KINDS.map((k) => ({ value: k, label: PROVENANCE_KIND_LABELS[k] }))}
      />
      <Box
        sx={{
          display: 'grid',
          gap: 2,
          gridTemplateColumns: { xs: '1fr', sm: provenanceKind === 'measured' ? '2fr 1fr 1fr' : '2fr 1fr' },
        }}
      >
        <FormTextField
          control={control}
          name="source"
          rules={{ validate: (v, all) => materialRules.source(String(v), all) }}
          label={
            provenanceKind === 'published'
              ? 'Reference (authors, title, journal, DOI)'
              : provenanceKind === 'measured'
                ? 'What was measured and how'
                : 'Source'
          }
          size="small"
        />
        <FormTextField
          control={control}
          name="date"
          rules={{ validate: (v, all) => materialRules.measuredDate(String(v), all) }}
          label="Date (YYYY-MM-DD)"
          size="small"
        />
        {provenanceKind === 'measured' && (
          <FormTextField
            control={control}
            name="run"
            rules={{ validate: (v, all) => materialRules.run(String(v), all) }}
            label="Run"
            size="small"
          />
        )}
      </Box>
      <FormTextField
        control={control}
        name="notes"
        label="Process notes"
        size="small"
        multiline
        minRows={2}
      />
    </FormDialog>
  );
}

/** Live n and k of the model being entered at the reference wavelength and at the d line. */
function IndexReadout({
  control,
  original,
  referenceText,
  onReferenceChange,
}: {
  control: ReturnType<typeof useForm<MaterialFormValues>>['control'];
  original: MaterialModel | null;
  referenceText: string;
  onReferenceChange: (text: string) => void;
}) {
  const values = useWatch({ control }) as MaterialFormValues;
  const reference = Number(referenceText);
  const wavelengths = reference > 0 ? [reference, D_LINE_NM] : [D_LINE_NM];
  const readings = readIndex({ ...EMPTY_MATERIAL_VALUES, ...values }, original, wavelengths);
  return (
    <Box
      component="section"
      aria-label="Index readout"
      sx={{ display: 'flex', gap: 2, alignItems: 'center', flexWrap: 'wrap' }}
    >
      <TextField
        label="Reference wavelength (nm)"
        size="small"
        value={referenceText}
        onChange={(e) => onReferenceChange(e.target.value)}
        slotProps={{ htmlInput: { inputMode: 'decimal' } }}
        sx={{ width: 200 }}
      />
      <Box>
        {readings.map((r) => (
          <Typography key={r.wavelengthNm} variant="body2" aria-label={`Index at ${r.wavelengthNm} nm`}>
            {r.wavelengthNm} nm:{' '}
            {r.n === null
              ? r.problem
              : `n = ${r.n.toFixed(5)}, k = ${(r.k ?? 0).toPrecision(3)}${r.held ? ' (outside the range: end value held)' : ''}`}
          </Typography>
        ))}
      </Box>
    </Box>
  );
}
