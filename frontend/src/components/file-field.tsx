import Box from '@mui/material/Box';
import FormHelperText from '@mui/material/FormHelperText';
import Typography from '@mui/material/Typography';
import { useId } from 'react';
import { formatFileSize } from '../lib/format';

interface FileFieldProps {
  label: string;
  /** File types offered by the browser's picker, e.g. ".csv,text/csv". */
  accept: string;
  file: File | null;
  /** What is wrong with the choice, shown in place of the file's name. */
  problem: string | null;
  onChange: (file: File | null) => void;
}

function describe(file: File): string {
  return `${file.name}, ${formatFileSize(file.size)}`;
}

/** A labelled file input with its chosen file (or problem) underneath. */
export function FileField({ label, accept, file, problem, onChange }: FileFieldProps) {
  const inputId = useId();
  const helpId = useId();
  return (
    <Box>
      <Typography
        component="label"
        htmlFor={inputId}
        variant="body2"
        sx={{ display: 'block', mb: 0.5, fontWeight: 500 }}
      >
        {label}
      </Typography>
      <input
        id={inputId}
        type="file"
        accept={accept}
        aria-describedby={helpId}
        aria-invalid={problem ? 'true' : undefined}
        onChange={(event) => onChange(event.target.files?.[0] ?? null)}
      />
      <FormHelperText id={helpId} error={Boolean(problem)}>
        {problem ?? (file ? describe(file) : 'No file chosen')}
      </FormHelperText>
    </Box>
  );
}
