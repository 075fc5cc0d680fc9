import Chip from '@mui/material/Chip';
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

/**
 * Layer by layer, incident side first: each layer paired with itself before and after (not by
 * position), its thickness before and after and the change; layers the result inserted are marked
 * new, layers it dropped removed.
 */
export function ThicknessTable({ before, after }: ThicknessTableProps) {
  const rows = thicknessRows(before, after);
  return (
    <Table size="small" aria-label="Thicknesses before and after">
      <TableHead>
        <TableRow>
          <TableCell>Layer</TableCell>
          <TableCell>Material</TableCell>
          <TableCell align="right">Before (nm)</TableCell>
          <TableCell align="right">After (nm)</TableCell>
          <TableCell align="right">Change (nm)</TableCell>
        </TableRow>
      </TableHead>
      <TableBody>
        {rows.map((row) => (
          <TableRow key={`${row.beforeLayer ?? '-'}:${row.layer ?? '-'}`}>
            <TableCell>
              {row.status === 'removed' ? `— (was ${row.beforeLayer})` : row.layer}
              {row.status === 'new' && (
                <Chip size="small" label="new" color="info" variant="outlined" sx={{ ml: 1, height: 20 }} />
              )}
              {row.status === 'removed' && (
                <Chip size="small" label="removed" variant="outlined" sx={{ ml: 1, height: 20 }} />
              )}
            </TableCell>
            <TableCell>{(row.after ?? row.before)?.material}</TableCell>
            <TableCell align="right">{row.before ? row.before.thicknessNm.toFixed(2) : '—'}</TableCell>
            <TableCell align="right">{row.after ? row.after.thicknessNm.toFixed(2) : '—'}</TableCell>
            <TableCell align="right">{row.changeNm === null ? '—' : formatSigned(row.changeNm, 2)}</TableCell>
          </TableRow>
        ))}
      </TableBody>
    </Table>
  );
}
