import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { zodResolver } from '@hookform/resolvers/zod';
import {
  MAX_SPECTRUM_CSV_BYTES,
  SPECTRUM_QUANTITIES,
  uploadSpectrumSchema,
  type SpectrumQuantity,
  type SpectrumSample,
} from '@quietglass/shared';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { FileField } from '../../../components/file-field';
import { FileProblemsAlert } from '../../../components/file-problems-alert';
import { FormSelectField } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import { notify } from '../../../lib/notifier';
import { typedNumber } from '../../../lib/validation';
import type { RunSpectrumView } from '../api/get-run';
import { useUploadSpectrum } from '../api/upload-spectrum';
import { formatFileSize, formatSizeLimit } from '../../../lib/format';

interface UploadValues {
  angleDeg: string;
  sample: SpectrumSample;
  /** '' reads the one quantity the file has; R or T picks one from a file with both. */
  quantity: '' | SpectrumQuantity;
}

// Spectrophotometer reflectance accessories usually measure near normal at about 8° (common
// practice, no source); the mask counts up to 8° as normal incidence.
const DEFAULTS: UploadValues = { angleDeg: '8', sample: 'witness', quantity: '' };

const { shape } = uploadSpectrumSchema;

/** How the spectrum was measured, checked by the API's upload schema (the file is sent beside it). */
const uploadFormSchema = z.object({
  angleDeg: typedNumber.pipe(shape.angleDeg),
  sample: shape.sample,
  quantity: z
    .enum(['', ...SPECTRUM_QUANTITIES])
    .transform((q) => (q === '' ? undefined : q))
    .pipe(shape.quantity),
});

interface SpectrumUploadProps {
  runId: number;
  onUploaded: (spectrum: RunSpectrumView) => void;
}

/** A measured spectrum file of the run's witness or part; a bad row rejects the whole file. */
export function SpectrumUpload({ runId, onUploaded }: SpectrumUploadProps) {
  const upload = useUploadSpectrum(runId);
  const [file, setFile] = useState<File | null>(null);
  const [fileProblem, setFileProblem] = useState<string | null>(null);
  const { control, handleSubmit } = useForm<UploadValues, unknown, z.output<typeof uploadFormSchema>>({
    defaultValues: DEFAULTS,
    resolver: zodResolver(uploadFormSchema),
    mode: 'onTouched',
  });

  const chooseFile = (chosen: File | null) => {
    setFile(chosen);
    upload.reset();
    if (chosen && chosen.size > MAX_SPECTRUM_CSV_BYTES)
      setFileProblem(
        `The file is larger than ${formatSizeLimit(MAX_SPECTRUM_CSV_BYTES)} (${formatFileSize(chosen.size)}).`,
      );
    else setFileProblem(null);
  };

  const onSubmit = handleSubmit(async ({ quantity, ...measured }) => {
    if (!file) {
      setFileProblem('Choose a spectrum file');
      return;
    }
    if (fileProblem) return;
    const csv = await file.text();
    upload.mutate(
      { filename: file.name, csv, ...measured, ...(quantity ? { quantity } : {}) },
      {
        onSuccess: (spectrum) => {
          notify(`${spectrum.filename} uploaded.`, 'success');
          onUploaded(spectrum);
        },
      },
    );
  });

  return (
    <Paper variant="outlined" sx={{ p: 2 }} component="section" aria-label="Spectrum upload">
      <Typography variant="h2" component="h2" gutterBottom>
        Measured spectrum
      </Typography>
      <Typography variant="body2" color="text.secondary" sx={{ mb: 1.5 }}>
        A CSV file with a header naming <code>wavelength_nm</code> and one of <code>R_percent</code> or{' '}
        <code>T_percent</code>, one row per wavelength in increasing order. The calculation CLI&apos;s output
        (<code>R</code> and <code>T</code> as fractions, with <code>angle_deg</code> and <code>pol</code>) is
        read too: the rows at the angle below, the average polarisation, the quantity you choose. At most 2
        MB.
      </Typography>
      <Box component="form" noValidate onSubmit={onSubmit} sx={{ display: 'grid', gap: 2 }}>
        <FileProblemsAlert error={upload.error} />
        <FileField
          label="Spectrum file"
          accept=".csv,.txt,text/csv,text/plain"
          file={file}
          problem={fileProblem}
          onChange={chooseFile}
        />
        <Box sx={{ display: 'flex', gap: 1.5, flexWrap: 'wrap' }}>
          <FormTextField
            control={control}
            name="angleDeg"
            label="Angle of incidence (°)"
            size="small"
            sx={{ width: 190 }}
            slotProps={{ htmlInput: { inputMode: 'decimal' } }}
          />
          <FormSelectField
            control={control}
            name="sample"
            label="Sample"
            size="small"
            sx={{ width: 190 }}
            options={[
              { value: 'witness', label: 'Witness sample' },
              { value: 'part', label: 'Part' },
            ]}
          />
          <FormSelectField
            control={control}
            name="quantity"
            label="Quantity"
            size="small"
            sx={{ width: 230 }}
            options={[
              { value: '', label: 'The one in the file' },
              { value: 'R', label: 'Reflectance R' },
              { value: 'T', label: 'Transmittance T' },
            ]}
          />
        </Box>
        <Box>
          <Button type="submit" variant="contained" loading={upload.isPending}>
            Upload spectrum
          </Button>
        </Box>
      </Box>
    </Paper>
  );
}
