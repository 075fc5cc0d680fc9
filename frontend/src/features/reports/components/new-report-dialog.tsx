import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import { zodResolver } from '@hookform/resolvers/zod';
import {
  createReportSchema,
  isApprovedForCustomers,
  isCustomerSpecification,
  type CreateReportInput,
  type SpecMaskKind,
  type VersionStatus,
} from '@quietglass/shared';
import { useEffect } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { z } from 'zod';
import { ErrorAlert } from '../../../components/error-alert';
import { FormCheckboxField } from '../../../components/form-checkbox-field';
import { FormDialog } from '../../../components/form-dialog';
import { FormSelectField } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import { parseNumberInput } from '../../../lib/format';
import { chosenId, requestFormSchema } from '../../../lib/validation';
import { useCreateReport } from '../api/create-report';
import type { ReportView } from '../api/get-reports';

export interface ReportDesignChoice {
  id: number;
  name: string;
  customer: { id: number; name: string };
  specMaskId: number | null;
}

export interface ReportMaskChoice {
  id: number;
  name: string;
  revision: string;
  customer: { id: number };
  kind: SpecMaskKind;
}

interface NewReportValues {
  designId: string;
  versionNumber: string;
  specMaskId: string;
  hideLayers: boolean;
  runId: string;
  spectrumId: string;
}

interface NewReportDialogProps {
  open: boolean;
  onClose: () => void;
  onCreated: (report: ReportView) => void;
  designs: readonly ReportDesignChoice[];
  masks: readonly ReportMaskChoice[];
  /** Versions of the chosen design; undefined while they load (or before a design is chosen). */
  versions: readonly { number: number; status: VersionStatus }[] | undefined;
  /** Told which design is chosen, so its versions can be fetched. */
  onDesignChange: (designId: number | null) => void;
  /** Fixed design, version and mask (a report made for a quote). */
  preset?: { designId: number; versionNumber: number; specMaskId: number };
  /** Offer a run's measured spectrum (only roles that may read chamber runs). */
  allowMeasured?: boolean;
}

/** A number typed in a field that may stay empty: left out when empty, NaN when not a number. */
const typedOptionalId = z
  .string()
  .transform((text) => (text.trim() === '' ? undefined : (parseNumberInput(text) ?? Number.NaN)));

/** The form's fields read as a report request and checked by the API's own schema. */
const newReportSchema = requestFormSchema(
  z.object({
    designId: chosenId,
    versionNumber: chosenId,
    // The form always names the mask; NaN (none chosen) gets the API's message.
    specMaskId: chosenId,
    hideLayers: z.boolean(),
    runId: typedOptionalId,
    spectrumId: typedOptionalId,
  }),
  createReportSchema,
);

function defaults(preset: NewReportDialogProps['preset']): NewReportValues {
  return {
    designId: preset ? String(preset.designId) : '',
    versionNumber: preset ? String(preset.versionNumber) : '',
    specMaskId: preset ? String(preset.specMaskId) : '',
    hideLayers: false,
    runId: '',
    spectrumId: '',
  };
}

/** A compliance report of an approved version against a spec mask of the design's customer. */
export function NewReportDialog({
  open,
  onClose,
  onCreated,
  designs,
  masks,
  versions,
  onDesignChange,
  preset,
  allowMeasured = false,
}: NewReportDialogProps) {
  const createReport = useCreateReport();
  const { control, handleSubmit, setValue, watch } = useForm<NewReportValues, unknown, CreateReportInput>({
    defaultValues: defaults(preset),
    resolver: zodResolver(newReportSchema),
  });
  const designId = useWatch({ control, name: 'designId' });
  const design = designs.find((d) => String(d.id) === designId);
  // A report judges against the customer's own specification: internal design targets are not offered.
  const masksOfCustomer = design
    ? masks.filter((m) => m.customer.id === design.customer.id && isCustomerSpecification(m))
    : [];
  const reportable = (versions ?? []).filter((v) => isApprovedForCustomers(v.status));

  useEffect(() => onDesignChange(designId === '' ? null : Number(designId)), [designId, onDesignChange]);
  useEffect(() => {
    // Another design chosen: its own versions, and its own mask as the first choice.
    const subscription = watch((values, { name }) => {
      if (name !== 'designId') return;
      const chosen = designs.find((d) => String(d.id) === values.designId);
      setValue('versionNumber', '');
      const own = masks.find((m) => m.id === chosen?.specMaskId);
      setValue('specMaskId', own && isCustomerSpecification(own) ? String(own.id) : '');
    });
    return () => subscription.unsubscribe();
  }, [designs, masks, setValue, watch]);

  const close = () => {
    createReport.reset();
    onClose();
  };

  const onSubmit = handleSubmit((input) => {
    createReport.mutate(input, {
      onSuccess: (report) => {
        close();
        onCreated(report);
      },
    });
  });

  const versionOptions = preset
    ? [{ value: String(preset.versionNumber), label: `Version ${preset.versionNumber}` }]
    : reportable.map((v) => ({ value: String(v.number), label: `Version ${v.number} (${v.status})` }));

  return (
    <FormDialog
      open={open}
      title="New compliance report"
      submitLabel="Create report"
      pending={createReport.isPending}
      onSubmit={onSubmit}
      onClose={close}
    >
      {createReport.error && <ErrorAlert error={createReport.error} title="The report was not created" />}
      <Box sx={{ display: 'grid', gap: 2, mt: 1 }}>
        <FormSelectField
          control={control}
          name="designId"
          label="Design"
          placeholder="Choose…"
          disabled={Boolean(preset)}
          options={designs.map((d) => ({ value: String(d.id), label: `${d.name} — ${d.customer.name}` }))}
        />
        <FormSelectField
          control={control}
          name="versionNumber"
          label="Approved version"
          placeholder="Choose…"
          disabled={Boolean(preset) || designId === ''}
          helperText={
            designId === ''
              ? 'Choose the design first'
              : versions === undefined
                ? 'Loading the versions…'
                : reportable.length === 0
                  ? 'This design has no approved or released version yet'
                  : 'Only approved and released versions are reported'
          }
          options={versionOptions}
        />
        <FormSelectField
          control={control}
          name="specMaskId"
          label="Spec mask"
          placeholder="Choose…"
          disabled={Boolean(preset) || designId === ''}
          helperText={design ? `Customer specifications of ${design.customer.name}` : undefined}
          options={(preset ? masks.filter((m) => m.id === preset.specMaskId) : masksOfCustomer).map((m) => ({
            value: String(m.id),
            label: `${m.name} rev ${m.revision}`,
          }))}
        />
        <FormCheckboxField
          control={control}
          name="hideLayers"
          label="Hide the layer table (design not disclosed)"
        />
        {allowMeasured && (
          <>
            <Typography variant="subtitle2">Measured spectrum (optional)</Typography>
            <Typography variant="body2" color="text.secondary">
              Report a chamber run&apos;s uploaded spectrum instead of the designed values. The run must have
              built this version.
            </Typography>
            <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: '1fr 1fr' }}>
              <FormTextField control={control} name="runId" label="Run number" />
              <FormTextField control={control} name="spectrumId" label="Spectrum number" />
            </Box>
          </>
        )}
      </Box>
    </FormDialog>
  );
}
