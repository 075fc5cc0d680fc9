import { pickableMaterials } from '@quietglass/shared';
import Alert from '@mui/material/Alert';
import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';
import { useState, type FormEvent } from 'react';
import { FormDialog } from '../../../components/form-dialog';
import { parseNumberInput } from '../../../lib/format';
import { emptyRow, MAX_LAYERS, thicknessForQwot, type LayerRow, type LibraryMaterial } from '../layers';

/** Most repeats of a period inserted at once. */
const MAX_PERIODS = Math.floor(MAX_LAYERS / 2);

interface PeriodDialogProps {
  open: boolean;
  materials: readonly LibraryMaterial[];
  referenceWavelengthNm: number | null;
  onClose: () => void;
  /** The high- and low-index rows of one period and the number of periods. */
  onInsert: (high: LayerRow, low: LayerRow, count: number) => void;
}

/** A period (H L)^n: two materials with their QWOT at the reference wavelength, repeated n times. */
export function PeriodDialog({
  open,
  materials,
  referenceWavelengthNm,
  onClose,
  onInsert,
}: PeriodDialogProps) {
  const [high, setHigh] = useState('');
  const [low, setLow] = useState('');
  const [highQwot, setHighQwot] = useState('1');
  const [lowQwot, setLowQwot] = useState('1');
  const [count, setCount] = useState('4');
  const [problem, setProblem] = useState<string | null>(null);

  const close = () => {
    setProblem(null);
    onClose();
  };

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const h = materials.find((m) => String(m.id) === high);
    const l = materials.find((m) => String(m.id) === low);
    const hq = parseNumberInput(highQwot);
    const lq = parseNumberInput(lowQwot);
    const n = parseNumberInput(count);
    if (!h || !l) return setProblem('Choose the H and the L material');
    if (hq === null || !(hq > 0) || lq === null || !(lq > 0))
      return setProblem('Each QWOT must be a number > 0');
    if (n === null || !Number.isInteger(n) || n < 1 || n > MAX_PERIODS)
      return setProblem(`The number of periods must be a whole number from 1 to ${MAX_PERIODS}`);
    const hNm = thicknessForQwot(h, hq, referenceWavelengthNm);
    const lNm = thicknessForQwot(l, lq, referenceWavelengthNm);
    if (hNm === null || lNm === null) return setProblem('The reference wavelength of the stack is not valid');
    onInsert(
      { ...emptyRow(h.id), thicknessNm: String(hNm), notes: 'H' },
      { ...emptyRow(l.id), thicknessNm: String(lNm), notes: 'L' },
      n,
    );
    close();
  };

  const materialField = (label: string, value: string, set: (v: string) => void) => (
    <TextField select label={label} value={value} onChange={(e) => set(e.target.value)} size="small">
      {pickableMaterials(materials).map((m) => (
        <MenuItem key={m.id} value={String(m.id)}>
          {m.name}
        </MenuItem>
      ))}
    </TextField>
  );

  return (
    <FormDialog
      open={open}
      title="Insert period"
      submitLabel="Insert"
      pending={false}
      onSubmit={submit}
      onClose={close}
    >
      {problem && (
        <Alert severity="error" role="alert">
          {problem}
        </Alert>
      )}
      {materialField('H material', high, setHigh)}
      <TextField label="H QWOT" size="small" value={highQwot} onChange={(e) => setHighQwot(e.target.value)} />
      {materialField('L material', low, setLow)}
      <TextField label="L QWOT" size="small" value={lowQwot} onChange={(e) => setLowQwot(e.target.value)} />
      <TextField
        label="Periods (n)"
        size="small"
        value={count}
        onChange={(e) => setCount(e.target.value)}
        helperText={`(H L)^n after the selected layer; QWOT at ${referenceWavelengthNm ?? '—'} nm`}
      />
    </FormDialog>
  );
}

interface ReverseDialogProps {
  open: boolean;
  rowCount: number;
  /** 1-based layer the block starts at by default. */
  initialFrom: number;
  onClose: () => void;
  /** 1-based first and last layer of the block. */
  onReverse: (from: number, to: number) => void;
}

/** Reverses the order of a block of layers, e.g. to mirror a symmetric period. */
export function ReverseDialog({ open, rowCount, initialFrom, onClose, onReverse }: ReverseDialogProps) {
  const [from, setFrom] = useState<string | null>(null);
  const [to, setTo] = useState<string | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const fromText = from ?? String(initialFrom);
  const toText = to ?? String(rowCount);

  const close = () => {
    setFrom(null);
    setTo(null);
    setProblem(null);
    onClose();
  };

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const a = parseNumberInput(fromText);
    const b = parseNumberInput(toText);
    const valid = (v: number | null): v is number =>
      v !== null && Number.isInteger(v) && v >= 1 && v <= rowCount;
    if (!valid(a) || !valid(b) || b <= a)
      return setProblem(`From and To must be layers 1 to ${rowCount}, To after From`);
    onReverse(a, b);
    close();
  };

  return (
    <FormDialog
      open={open}
      title="Reverse block"
      submitLabel="Reverse"
      pending={false}
      onSubmit={submit}
      onClose={close}
      maxWidth="xs"
    >
      {problem && (
        <Alert severity="error" role="alert">
          {problem}
        </Alert>
      )}
      <TextField label="From layer" size="small" value={fromText} onChange={(e) => setFrom(e.target.value)} />
      <TextField label="To layer" size="small" value={toText} onChange={(e) => setTo(e.target.value)} />
    </FormDialog>
  );
}
