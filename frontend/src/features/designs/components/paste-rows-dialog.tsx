import Alert from '@mui/material/Alert';
import TextField from '@mui/material/TextField';
import { useState, type FormEvent } from 'react';
import { FormDialog } from '../../../components/form-dialog';
import {
  parsePastedRows,
  THICKNESS_UNIT_LABELS,
  type LayerRow,
  type LibraryMaterial,
  type ThicknessUnit,
} from '../layers';

interface PasteRowsDialogProps {
  open: boolean;
  materials: readonly LibraryMaterial[];
  /** The thickness unit when no header names one. */
  unit: ThicknessUnit;
  referenceWavelengthNm: number | null;
  onClose: () => void;
  /** Called with the parsed rows; only when every line was valid. */
  onPaste: (rows: LayerRow[]) => void;
}

/** Rows copied from a spreadsheet or CSV (material, thickness, notes) into the grid. */
export function PasteRowsDialog({
  open,
  materials,
  unit,
  referenceWavelengthNm,
  onClose,
  onPaste,
}: PasteRowsDialogProps) {
  const [text, setText] = useState('');
  const [problems, setProblems] = useState<string[]>([]);

  const close = () => {
    setText('');
    setProblems([]);
    onClose();
  };

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const result = parsePastedRows(text, materials, { unit, referenceNm: referenceWavelengthNm });
    if (!result.ok) {
      setProblems(result.problems);
      return;
    }
    onPaste(result.rows);
    close();
  };

  return (
    <FormDialog
      open={open}
      title="Paste rows"
      submitLabel="Add rows"
      pending={false}
      onSubmit={submit}
      onClose={close}
    >
      {problems.length > 0 && (
        <Alert severity="error" role="alert">
          Nothing was added. Fix these rows and try again:
          <ul aria-label="Paste problems" style={{ margin: '4px 0 0', paddingLeft: '1.25em' }}>
            {problems.map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
        </Alert>
      )}
      <TextField
        label="Rows from a spreadsheet"
        value={text}
        onChange={(event) => setText(event.target.value)}
        multiline
        minRows={6}
        fullWidth
        autoFocus
        sx={{ mt: 1 }}
        helperText={`One layer per line: material name, thickness (${THICKNESS_UNIT_LABELS[unit]} unless a header line names nm, QWOT or FWOT) and optional notes, separated by tabs, semicolons or commas; a decimal comma is fine.`}
        slotProps={{ htmlInput: { spellCheck: false, style: { fontFamily: 'monospace' } } }}
      />
    </FormDialog>
  );
}
