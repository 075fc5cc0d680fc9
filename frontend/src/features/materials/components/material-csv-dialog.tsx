import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { FileField } from '../../../components/file-field';
import { FileProblemsAlert } from '../../../components/file-problems-alert';
import { FormCheckboxField } from '../../../components/form-checkbox-field';
import { FormDialog } from '../../../components/form-dialog';
import { FormSelectField } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import { notify } from '../../../lib/notifier';
import type { MaterialView } from '../api/get-materials';
import { MAX_NK_CSV_BYTES, useImportMaterialCsv } from '../api/import-material-csv';
import { materialRules } from '../material-form';

interface CsvValues {
  name: string;
  unit: 'nm' | 'um';
  interpolation: 'linear' | 'pchip';
  typical: boolean;
  source: string;
}

const EMPTY: CsvValues = { name: '', unit: 'nm', interpolation: 'linear', typical: false, source: '' };

function megabytes(bytes: number): string {
  return `${(bytes / 1_000_000).toFixed(2)} MB`;
}

/**
 * A tabulated material from an n,k file (wavelength, n and optionally k per row). The file is
 * checked for size here; the API checks every row and saves nothing unless all are good.
 */
export function MaterialCsvDialog({
  open,
  onClose,
  onSaved,
}: {
  open: boolean;
  onClose: () => void;
  /** Told the imported material, e.g. to select it. */
  onSaved?: (saved: MaterialView) => void;
}) {
  const importCsv = useImportMaterialCsv();
  const [file, setFile] = useState<File | null>(null);
  const [fileProblem, setFileProblem] = useState<string | null>(null);
  const { control, handleSubmit, reset } = useForm<CsvValues>({ defaultValues: EMPTY, mode: 'onTouched' });

  const close = () => {
    reset(EMPTY);
    setFile(null);
    setFileProblem(null);
    importCsv.reset();
    onClose();
  };

  const chooseFile = (chosen: File | null) => {
    setFile(chosen);
    importCsv.reset();
    if (chosen && chosen.size > MAX_NK_CSV_BYTES)
      setFileProblem(
        `The file is larger than 1 MB (${megabytes(chosen.size)}); split it or thin out its rows.`,
      );
    else setFileProblem(null);
  };

  const onSubmit = handleSubmit(async (values) => {
    if (!file) {
      setFileProblem('Choose an n,k file');
      return;
    }
    if (fileProblem) return;
    const csv = await file.text();
    importCsv.mutate(
      {
        name: values.name.trim(),
        csv,
        unit: values.unit,
        interpolation: values.interpolation,
        typical: values.typical,
        ...(values.source.trim() ? { provenance: { source: values.source.trim(), notes: '' } } : {}),
      },
      {
        onSuccess: (saved) => {
          notify(`${saved.name} imported with its n,k table.`, 'success');
          onSaved?.(saved);
          close();
        },
      },
    );
  });

  return (
    <FormDialog
      open={open}
      title="Upload n,k file"
      submitLabel="Import material"
      pending={importCsv.isPending}
      onSubmit={onSubmit}
      onClose={close}
    >
      <FileProblemsAlert error={importCsv.error} />
      <Typography variant="body2" color="text.secondary" sx={{ mt: 1 }}>
        Columns wavelength, n and optionally k, separated by commas, semicolons or tabs, with or without a
        header row such as <code>wavelength_nm,n,k</code>. At most 1 MB.
      </Typography>
      <FileField
        label="n,k file"
        accept=".csv,.txt,.tsv,text/csv,text/plain"
        file={file}
        problem={fileProblem}
        onChange={chooseFile}
      />
      <FormTextField
        control={control}
        name="name"
        rules={{ validate: (v) => materialRules.name(String(v)) }}
        label="Material name"
        size="small"
      />
      <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: 'repeat(2, minmax(0, 1fr))' }}>
        <FormSelectField
          control={control}
          name="unit"
          label="Wavelength unit"
          size="small"
          options={[
            { value: 'nm', label: 'nm' },
            { value: 'um', label: 'µm' },
          ]}
        />
        <FormSelectField
          control={control}
          name="interpolation"
          label="Interpolation"
          size="small"
          options={[
            { value: 'linear', label: 'Linear' },
            { value: 'pchip', label: 'Shape-preserving cubic (PCHIP)' },
          ]}
        />
      </Box>
      <FormCheckboxField
        control={control}
        name="typical"
        label="Typical value (not measured on our process)"
      />
      <FormTextField control={control} name="source" label="Source" size="small" />
    </FormDialog>
  );
}
