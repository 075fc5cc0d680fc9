import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import { MAX_CONSTANTS_FILE_CHARS, parseConstantsFile, type ConstantsFile } from '@quietglass/shared';
import { useMemo, useState } from 'react';
import { useForm } from 'react-hook-form';
import { ErrorAlert } from '../../../components/error-alert';
import { FileField } from '../../../components/file-field';
import { FormCheckboxField } from '../../../components/form-checkbox-field';
import { FormDialog } from '../../../components/form-dialog';
import { FormTextField } from '../../../components/form-text-field';
import { Plot } from '../../../components/plot';
import { formatFileSize, formatSizeLimit } from '../../../lib/format';
import { notify } from '../../../lib/notifier';
import type { MaterialView } from '../api/get-materials';
import { useImportConstantsFile } from '../api/import-constants-file';
import { materialRules } from '../material-form';
import { indexCurve } from './material-detail';

/**
 * Largest constants file offered to the API, in bytes: the engine's limit in characters (a file
 * has at least as many bytes as characters, so one under it is never refused for its size).
 */
const MAX_CONSTANTS_FILE_BYTES = MAX_CONSTANTS_FILE_CHARS;

interface ConstantsValues {
  name: string;
  holdOutside: boolean;
  notes: string;
}

const EMPTY: ConstantsValues = { name: '', holdOutside: false, notes: '' };

/**
 * A material from a published optical-constants file (YAML with REFERENCES, COMMENTS and DATA):
 * tabulated n,k, or the stated formula with its wavelength range. The file is read here with the
 * engine's reader for a preview (reference, data, plot); the API reads it again, saves the
 * reference as the provenance and keeps the file.
 */
export function ConstantsFileDialog({
  open,
  onClose,
  onSaved,
}: {
  open: boolean;
  onClose: () => void;
  onSaved?: (saved: MaterialView) => void;
}) {
  const importFile = useImportConstantsFile();
  const [file, setFile] = useState<File | null>(null);
  const [text, setText] = useState<string | null>(null);
  const [fileProblem, setFileProblem] = useState<string | null>(null);
  const { control, handleSubmit, reset } = useForm<ConstantsValues>({
    defaultValues: EMPTY,
    mode: 'onTouched',
  });

  const parsed = useMemo<{ file: ConstantsFile } | { error: string } | null>(() => {
    if (text === null) return null;
    try {
      return { file: parseConstantsFile(text) };
    } catch (error) {
      return { error: error instanceof Error ? error.message : String(error) };
    }
  }, [text]);

  const close = () => {
    reset(EMPTY);
    setFile(null);
    setText(null);
    setFileProblem(null);
    importFile.reset();
    onClose();
  };

  const chooseFile = async (chosen: File | null) => {
    setFile(chosen);
    setText(null);
    importFile.reset();
    if (chosen && chosen.size > MAX_CONSTANTS_FILE_BYTES) {
      setFileProblem(
        `The file is larger than ${formatSizeLimit(MAX_CONSTANTS_FILE_BYTES)} (${formatFileSize(chosen.size)}).`,
      );
      return;
    }
    setFileProblem(null);
    if (chosen) setText(await chosen.text());
  };

  const onSubmit = handleSubmit((values) => {
    if (!file || text === null) {
      setFileProblem('Choose a constants file');
      return;
    }
    if (!parsed || 'error' in parsed) return;
    importFile.mutate(
      {
        name: values.name.trim(),
        text,
        fileName: file.name,
        clamp: values.holdOutside,
        ...(values.notes.trim() ? { notes: values.notes.trim() } : {}),
      },
      {
        onSuccess: (saved) => {
          notify(`${saved.name} imported with its published reference.`, 'success');
          onSaved?.(saved);
          close();
        },
      },
    );
  });

  return (
    <FormDialog
      open={open}
      title="Import published constants"
      submitLabel="Import material"
      pending={importFile.isPending}
      onSubmit={onSubmit}
      onClose={close}
      maxWidth="md"
    >
      {importFile.error && <ErrorAlert error={importFile.error} title="Not imported" />}
      <Typography variant="body2" color="text.secondary" sx={{ mt: 1 }}>
        A published optical-constants file (YAML with REFERENCES, COMMENTS and DATA; wavelengths in µm):
        tabulated n,k, n or k, or a Sellmeier or Cauchy formula with its wavelength range. Its reference
        becomes the material&apos;s source.
      </Typography>
      <FileField
        label="Constants file"
        accept=".yml,.yaml,text/yaml,application/yaml,text/plain"
        file={file}
        problem={fileProblem}
        onChange={(f) => void chooseFile(f)}
      />
      {parsed && 'error' in parsed && <Alert severity="error">The file cannot be read: {parsed.error}</Alert>}
      {parsed && 'file' in parsed && <ConstantsPreview file={parsed.file} />}
      <FormTextField
        control={control}
        name="name"
        rules={{ validate: (v) => materialRules.name(String(v)) }}
        label="Material name"
        size="small"
      />
      <FormCheckboxField
        control={control}
        name="holdOutside"
        label="Outside the stated range, hold the end values and warn (otherwise calculations there are refused)"
      />
      <FormTextField control={control} name="notes" label="Notes to add" size="small" multiline minRows={2} />
    </FormDialog>
  );
}

function ConstantsPreview({ file }: { file: ConstantsFile }) {
  const curve = useMemo(() => indexCurve(file.model, file.rangeNm), [file]);
  return (
    <Box component="section" aria-label="Preview of the constants file">
      <Typography variant="body2" sx={{ whiteSpace: 'pre-line' }}>
        <strong>Reference:</strong> {file.reference}
        {file.doi ? `\nDOI: ${file.doi}` : ''}
      </Typography>
      <Typography variant="body2" color="text.secondary" sx={{ whiteSpace: 'pre-line' }}>
        {file.notes}
      </Typography>
      <Typography variant="body2">
        Data: {file.form}; valid {file.rangeNm.from}–{file.rangeNm.to} nm.
      </Typography>
      {'error' in curve ? (
        <Alert severity="error">The index could not be evaluated: {curve.error}</Alert>
      ) : (
        <Plot
          title="n and k of the file"
          data={[
            { type: 'scatter', mode: 'lines', name: 'n', x: curve.wavelengthsNm, y: curve.n },
            { type: 'scatter', mode: 'lines', name: 'k', x: curve.wavelengthsNm, y: curve.k, yaxis: 'y2' },
          ]}
          layout={{
            xaxis: { title: { text: 'Wavelength (nm)' } },
            yaxis: { title: { text: 'n' } },
            yaxis2: { title: { text: 'k' }, overlaying: 'y', side: 'right', rangemode: 'tozero' },
          }}
          height={240}
          pngFileName="constants-file-preview"
        />
      )}
    </Box>
  );
}
