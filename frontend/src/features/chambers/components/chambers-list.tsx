import EditOutlined from '@mui/icons-material/EditOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { formatToolingFactor } from '@quietglass/shared';
import { formatDateTime, formatFixed } from '../../../lib/format';
import type { ChamberView } from '../api/get-chambers';

interface ChambersListProps {
  chambers: readonly ChamberView[];
  materials: readonly { id: number; name: string }[];
  /** Shows an Edit button per chamber; omitted for readers. */
  onEdit?: (chamber: ChamberView) => void;
  /** Opens a chamber's process settings per material. */
  onProcessSettings?: (chamber: ChamberView) => void;
}

/** Each chamber with its monitor and its tooling factor and rate per material. */
export function ChambersList({ chambers, materials, onEdit, onProcessSettings }: ChambersListProps) {
  const nameOf = (id: number) => materials.find((m) => m.id === id)?.name ?? `Material ${id}`;
  if (chambers.length === 0) {
    return (
      <Typography variant="body2" color="text.secondary">
        No chambers yet.
      </Typography>
    );
  }
  return (
    <Box sx={{ display: 'grid', gap: 2 }}>
      {chambers.map((c) => (
        <Paper key={c.id} variant="outlined" sx={{ p: 2 }} component="section" aria-label={c.name}>
          <Box sx={{ display: 'flex', alignItems: 'flex-start', gap: 2, mb: 1 }}>
            <Box sx={{ flexGrow: 1 }}>
              <Typography variant="h2" component="h2">
                {c.name}
              </Typography>
              <Typography variant="body2" color="text.secondary">
                Monitor at {c.monitorWavelengthsNm.join(', ')} nm through a {nameOf(c.monitorChipMaterialId)}{' '}
                chip · updated {formatDateTime(c.updatedAt)}
              </Typography>
            </Box>
            {onProcessSettings && (
              <Button onClick={() => onProcessSettings(c)} aria-label={`Process settings of ${c.name}`}>
                Process settings
              </Button>
            )}
            {onEdit && (
              <Button startIcon={<EditOutlined />} onClick={() => onEdit(c)} aria-label={`Edit ${c.name}`}>
                Edit
              </Button>
            )}
          </Box>
          {c.notes && (
            <Typography variant="body2" sx={{ mb: 1, whiteSpace: 'pre-wrap' }}>
              {c.notes}
            </Typography>
          )}
          <Table size="small" aria-label={`Tooling factors and rates of ${c.name}`}>
            <TableHead>
              <TableRow>
                <TableCell>Material</TableCell>
                <TableCell align="right">Tooling factor (part ÷ monitor)</TableCell>
                <TableCell align="right">Rate (nm/s)</TableCell>
              </TableRow>
            </TableHead>
            <TableBody>
              {c.materials.map((m) => (
                <TableRow key={m.materialId}>
                  <TableCell>{nameOf(m.materialId)}</TableCell>
                  <TableCell align="right">{formatToolingFactor(m.toolingFactor)}</TableCell>
                  <TableCell align="right">{formatFixed(m.rateNmPerS, 2)}</TableCell>
                </TableRow>
              ))}
              {c.materials.length === 0 && (
                <TableRow>
                  <TableCell colSpan={3}>No materials set up.</TableCell>
                </TableRow>
              )}
            </TableBody>
          </Table>
        </Paper>
      ))}
    </Box>
  );
}
