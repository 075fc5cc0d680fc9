import Box from '@mui/material/Box';
import TextField from '@mui/material/TextField';

export interface ChamberChoice {
  id: number;
  name: string;
  monitorWavelengthsNm: readonly number[];
}

interface RunSheetControlsProps {
  chambers: readonly ChamberChoice[];
  chamberId: number | null;
  monitorWavelengthNm: number | null;
  onChange: (choice: { chamberId: number | null; monitorWavelengthNm: number | null }) => void;
}

/** Which chamber runs the recipe, and which of its monitor wavelengths is used. */
export function RunSheetControls({
  chambers,
  chamberId,
  monitorWavelengthNm,
  onChange,
}: RunSheetControlsProps) {
  const chamber = chambers.find((c) => c.id === chamberId) ?? null;
  return (
    <Box sx={{ display: 'flex', gap: 2, flexWrap: 'wrap' }} data-print="hide">
      <TextField
        select
        size="small"
        label="Chamber"
        value={chamberId === null ? '' : String(chamberId)}
        onChange={(event) => {
          const next = chambers.find((c) => c.id === Number(event.target.value)) ?? null;
          onChange({
            chamberId: next?.id ?? null,
            monitorWavelengthNm: next?.monitorWavelengthsNm[0] ?? null,
          });
        }}
        slotProps={{ select: { native: true }, inputLabel: { shrink: true } }}
        sx={{ minWidth: 240 }}
      >
        <option value="">Choose a chamber…</option>
        {chambers.map((c) => (
          <option key={c.id} value={String(c.id)}>
            {c.name}
          </option>
        ))}
      </TextField>
      <TextField
        select
        size="small"
        label="Monitor wavelength (nm)"
        value={monitorWavelengthNm === null ? '' : String(monitorWavelengthNm)}
        disabled={!chamber}
        onChange={(event) => onChange({ chamberId, monitorWavelengthNm: Number(event.target.value) })}
        slotProps={{ select: { native: true }, inputLabel: { shrink: true } }}
        sx={{ minWidth: 220 }}
      >
        {!chamber && <option value="">Choose a chamber first</option>}
        {chamber?.monitorWavelengthsNm.map((w) => (
          <option key={w} value={String(w)}>
            {w}
          </option>
        ))}
      </TextField>
    </Box>
  );
}
