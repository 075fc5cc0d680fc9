import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import { thicknessRows, type TableLayer } from '../results';
import { formatSigned } from '../../../lib/format';

interface ThicknessTableProps {
  before: readonly TableLayer[];
  after: readonly TableLayer[];
}

/** Layer by layer, incident side first: material and thickness before and after, and the change. */
export function ThicknessTable({ before, after }: ThicknessTableProps) {
  const rows = thicknessRows(before, after);
  const sameMaterials = rows.every((r) => r.before?.material === r.after?.material);
  return (
    <Table size="small" aria-label="Thicknesses before and after">
      <TableHead>
        <TableRow>
          <TableCell>Layer</TableCell>
          {sameMaterials ? (
            <TableCell>Material</TableCell>
          ) : (
            <>
              <TableCell>Material before</TableCell>
              <TableCell>Material after</TableCell>
            </>
          )}
          <TableCell align="right">Before (nm)</TableCell>
          <TableCell align="right">After (nm)</TableCell>
          <TableCell align="right">Change (nm)</TableCell>
        </TableRow>
      </TableHead>
      <TableBody>
        {rows.map((row) => (
          <TableRow key={row.layer}>
            <TableCell>{row.layer}</TableCell>
            {sameMaterials ? (
              <TableCell>{row.after?.material}</TableCell>
            ) : (
              <>
                <TableCell>{row.before?.material ?? '—'}</TableCell>
                <TableCell>{row.after?.material ?? '—'}</TableCell>
              </>
            )}
            <TableCell align="right">{row.before ? row.before.thicknessNm.toFixed(2) : '—'}</TableCell>
            <TableCell align="right">{row.after ? row.after.thicknessNm.toFixed(2) : '—'}</TableCell>
            <TableCell align="right">{row.changeNm === null ? '—' : formatSigned(row.changeNm, 2)}</TableCell>
          </TableRow>
        ))}
      </TableBody>
    </Table>
  );
}
