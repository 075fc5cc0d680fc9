import Box from '@mui/material/Box';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import {
  MAX_NK_CSV_BYTES,
  PROVENANCE_KINDS,
  PROVENANCE_KIND_LABELS,
  type ProvenanceKind,
} from '@quietglass/shared';
import { useEffect, useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { FileField } from '../../../components/file-field';
import { FileProblemsAlert } from '../../../components/file-problems-alert';
import { FormCheckboxField } from '../../../components/form-checkbox-field';
import { FormDialog } from '../../../components/form-dialog';
import { FormSelectField } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import { Plot } from '../../../components/plot';
import { formatFileSize, formatSizeLimit } from '../../../lib/format';
import { notify } from '../../../lib/notifier';
import type { MaterialView } from '../api/get-materials';
import { useImportMaterialCsv } from '../api/import-material-csv';
import { usePreviewMaterialCsv, type NkCsvPreview } from '../api/preview-material-csv';
import { EMPTY_MATERIAL_VALUES, materialRules } from '../material-form';

interface CsvValues {
  name: string;
  /** '' takes the unit from the header ("Wavelength (nm)"). */
  unit: '' | 'nm' | 'um';
  interpolation: 'linear' | 'pchip';
  holdOutside: boolean;
  provenanceKind: ProvenanceKind | '';
  source: string;
  date: string;
  run: string;
  notes: string;
}

const EMPTY: CsvValues = {
  name: '',
  unit: '',
  interpolation: 'linear',
  holdOutside: false,
  provenanceKind: '',
  source: '',
  date: '',
  run: '',
  notes: '',
};

/** Rows shown at each end of the preview table. */
const PREVIEW_ROWS = 5;

/**
 * A tabulated material from an n,k file (wavelength, n and optionally k per row). The API reads the
 * file for a preview (table and plot) before anything is saved; the import keeps the file.
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
  const preview = usePreviewMaterialCsv();
  const [file, setFile] = useState<File | null>(null);
  const [text, setText] = useState<string | null>(null);
  const [fileProblem, setFileProblem] = useState<string | null>(null);
  const { control, handleSubmit, reset } = useForm<CsvValues>({ defaultValues: EMPTY, mode: 'onTouched' });
  const unit = useWatch({ control, name: 'unit' });
  const provenanceKind = useWatch({ control, name: 'provenanceKind' });
  const { mutate: runPreview, reset: resetPreview } = preview;

  useEffect(() => {
    if (text === null) return;
    runPreview({ csv: text, ...(unit ? { unit } : {}) });
  }, [text, unit, runPreview]);

  const close = () => {
    reset(EMPTY);
    setFile(null);
    setText(null);
    setFileProblem(null);
    importCsv.reset();
    resetPreview();
    onClose();
  };

  const chooseFile = async (chosen: File | null) => {
    setFile(chosen);
    setText(null);
    importCsv.reset();
    resetPreview();
    if (chosen && chosen.size > MAX_NK_CSV_BYTES) {
      setFileProblem(
        `The file is larger than ${formatSizeLimit(MAX_NK_CSV_BYTES)} (${formatFileSize(chosen.size)}); split it or thin out its rows.`,
      );
      return;
    }
    setFileProblem(null);
    if (chosen) setText(await chosen.text());
  };

  const onSubmit = handleSubmit((values) => {
    if (!file || text === null) {
      setFileProblem('Choose an n,k file');
      return;
    }
    if (fileProblem || !preview.data) return;
    importCsv.mutate(
      {
        name: values.name.trim(),
        csv: text,
        ...(values.unit ? { unit: values.unit } : {}),
        interpolation: values.interpolation,
        clamp: values.holdOutside,
        fileName: file.name,
        typical: values.provenanceKind === 'typical',
        provenance: {
          kind: values.provenanceKind as ProvenanceKind,
          source: values.source.trim(),
          notes: values.notes.trim(),
          ...(values.date.trim() ? { date: values.date.trim() } : {}),
          ...(values.run.trim() ? { run: values.run.trim() } : {}),
        },
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

  // The provenance rules of the material form, on this form's fields.
  const asForm = (all: CsvValues) => ({ ...EMPTY_MATERIAL_VALUES, ...all, kind: 'table' as const });

  return (
    <FormDialog
      open={open}
      title="Upload n,k file"
      submitLabel="Import material"
      pending={importCsv.isPending}
      onSubmit={onSubmit}
      onClose={close}
      maxWidth="md"
    >
      <FileProblemsAlert error={importCsv.error ?? preview.error} />
      <Typography variant="body2" color="text.secondary" sx={{ mt: 1 }}>
        Columns wavelength, n and optionally k, separated by commas, semicolons or tabs, with or without a
        header row such as <code>wavelength_nm,n,k</code> or <code>Wavelength (µm);n;k</code>. Semicolon- and
        tab-separated files may use decimal commas. At most {formatSizeLimit(MAX_NK_CSV_BYTES)}.
      </Typography>
      <FileField
        label="n,k file"
        accept=".csv,.txt,.tsv,text/csv,text/plain"
        file={file}
        problem={fileProblem}
        onChange={(f) => void chooseFile(f)}
      />
      {preview.data && <CsvPreview preview={preview.data} />}
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
            { value: '', label: 'As the header says' },
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
        name="holdOutside"
        label="Outside the table, hold the end values and warn (otherwise calculations there are refused)"
      />
      <FormSelectField
        control={control}
        name="provenanceKind"
        rules={{ validate: (v) => materialRules.provenanceKind(String(v)) }}
        label="Provenance"
        size="small"
        placeholder="Choose…"
        options={PROVENANCE_KINDS.map((k) => ({ value: k, label: PROVENANCE_KIND_LABELS[k] }))}
      />
      <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', sm: '2fr 1fr 1fr' } }}>
        <FormTextField
          control={control}
          name="source"
          rules={{ validate: (v, all) => materialRules.source(String(v), asForm(all)) }}
          label={provenanceKind === 'published' ? 'Reference (authors, title, journal, DOI)' : 'Source'}
          size="small"
        />
        <FormTextField
          control={control}
          name="date"
          rules={{ validate: (v, all) => materialRules.measuredDate(String(v), asForm(all)) }}
          label="Date (YYYY-MM-DD)"
          size="small"
        />
        <FormTextField
          control={control}
          name="run"
          rules={{ validate: (v, all) => materialRules.run(String(v), asForm(all)) }}
          label="Run"
          size="small"
        />
      </Box>
      <FormTextField control={control} name="notes" label="Sample notes" size="small" multiline minRows={2} />
    </FormDialog>
  );
}

/** The parsed table (first and last rows) and its n and k plot, before saving. */
function CsvPreview({ preview }: { preview: NkCsvPreview }) {
  const { wavelengths, n, k } = preview.table;
  const count = wavelengths.length;
  const shown =
    count <= 2 * PREVIEW_ROWS
      ? wavelengths.map((_, i) => i)
      : [
          ...Array.from({ length: PREVIEW_ROWS }, (_, i) => i),
          -1,
          ...Array.from({ length: PREVIEW_ROWS }, (_, i) => count - PREVIEW_ROWS + i),
        ];
  return (
    <Box component="section" aria-label="Preview of the n,k table">
      <Typography variant="body2">
        {count} rows, {preview.rangeNm.from}–{preview.rangeNm.to} nm, wavelengths read in{' '}
        {preview.unit === 'um' ? 'µm' : 'nm'}
        {preview.decimalComma ? ', decimal commas' : ''}
        {preview.headerRow ? '' : ', no header row'}.
      </Typography>
      <Table size="small" aria-label="Parsed rows">
        <TableHead>
          <TableRow>
            <TableCell>Wavelength (nm)</TableCell>
            <TableCell>n</TableCell>
            <TableCell>k</TableCell>
          </TableRow>
        </TableHead>
        <TableBody>
          {shown.map((i) =>
            i < 0 ? (
              <TableRow key="gap">
                <TableCell colSpan={3}>… {count - 2 * PREVIEW_ROWS} more rows …</TableCell>
              </TableRow>
            ) : (
              <TableRow key={i}>
                <TableCell>{wavelengths[i]}</TableCell>
                <TableCell>{n[i]}</TableCell>
                <TableCell>{k[i]}</TableCell>
              </TableRow>
            ),
          )}
        </TableBody>
      </Table>
      <Plot
        title="n and k of the file"
        data={[
          { type: 'scatter', mode: 'lines+markers', name: 'n', x: wavelengths, y: n },
          { type: 'scatter', mode: 'lines+markers', name: 'k', x: wavelengths, y: k, yaxis: 'y2' },
        ]}
        layout={{
          xaxis: { title: { text: 'Wavelength (nm)' } },
          yaxis: { title: { text: 'n' } },
          yaxis2: { title: { text: 'k' }, overlaying: 'y', side: 'right', rangemode: 'tozero' },
        }}
        height={240}
        pngFileName="nk-file-preview"
      />
    </Box>
  );
}
