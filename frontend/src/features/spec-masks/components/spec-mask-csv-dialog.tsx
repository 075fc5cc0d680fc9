import Typography from '@mui/material/Typography';
import { zodResolver } from '@hookform/resolvers/zod';
import { LIMIT_BAND_FIELDS, MAX_MASK_CSV_BYTES } from '@quietglass/shared';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { FileField } from '../../../components/file-field';
import { FileProblemsAlert } from '../../../components/file-problems-alert';
import { FormDialog } from '../../../components/form-dialog';
import { notify } from '../../../lib/notifier';
import { useImportSpecMaskCsv } from '../api/import-spec-mask-csv';
import { maskDetailsFormSchema, type MaskDetailsOutput, type MaskFormValues } from '../band-form';
import { MaskDetailsFields } from './mask-details-fields';
import { formatSizeLimit } from '../../../lib/format';

interface SpecMaskCsvDialogProps {
  open: boolean;
  customers: readonly { id: number; name: string }[];
  defaultCustomerId: number | null;
  onClose: () => void;
  /** "New customer…" in the customer picker: shows the form, then `choose` selects the new one. */
  onNewCustomer?: (choose: (customer: { id: number; name: string }) => void) => void;
}

/** A new spec mask from a CSV file with a header naming the limit-band columns. */
export function SpecMaskCsvDialog({
  open,
  customers,
  defaultCustomerId,
  onClose,
  onNewCustomer,
}: SpecMaskCsvDialogProps) {
  const importCsv = useImportSpecMaskCsv();
  const [file, setFile] = useState<File | null>(null);
  const [fileProblem, setFileProblem] = useState<string | null>(null);
  // The bands come from the file, so the form's band list stays empty.
  const empty: MaskFormValues = {
    name: '',
    customerId: defaultCustomerId === null ? '' : String(defaultCustomerId),
    revision: 'A',
    kind: 'customer',
    notes: '',
    bands: [],
  };
  const { control, handleSubmit, reset, setValue } = useForm<MaskFormValues, unknown, MaskDetailsOutput>({
    defaultValues: empty,
    resolver: zodResolver(maskDetailsFormSchema),
    mode: 'onTouched',
  });

  const close = () => {
    reset(empty);
    setFile(null);
    setFileProblem(null);
    importCsv.reset();
    onClose();
  };

  const onSubmit = handleSubmit(async (details) => {
    if (!file) {
      setFileProblem('Choose a CSV file');
      return;
    }
    if (file.size > MAX_MASK_CSV_BYTES) {
      setFileProblem(`The file is larger than ${formatSizeLimit(MAX_MASK_CSV_BYTES)}`);
      return;
    }
    importCsv.mutate(
      { ...details, csv: await file.text() },
      {
        onSuccess: (saved) => {
          notify(
            `Spec mask ${saved.name} rev ${saved.revision} imported with ${saved.bands.length} bands.`,
            'success',
          );
          close();
        },
      },
    );
  });

  return (
    <FormDialog
      open={open}
      title="Import spec mask"
      submitLabel="Import mask"
      pending={importCsv.isPending}
      onSubmit={onSubmit}
      onClose={close}
    >
      <FileProblemsAlert error={importCsv.error} />
      <Typography variant="body2" color="text.secondary" sx={{ mt: 1 }}>
        A header row naming the columns — <code>{LIMIT_BAND_FIELDS.join(',')}</code> — then one limit band per
        row; from_nm, to_nm and quantity are required, angles are separated by <code>;</code>.
      </Typography>
      <FileField
        label="Spec mask file"
        accept=".csv,text/csv"
        file={file}
        problem={fileProblem}
        onChange={(chosen) => {
          setFile(chosen);
          setFileProblem(null);
          importCsv.reset();
        }}
      />
      <MaskDetailsFields
        control={control}
        customers={customers}
        setValue={setValue}
        onNewCustomer={onNewCustomer}
      />
    </FormDialog>
  );
}
