import Box from '@mui/material/Box';
import Link from '@mui/material/Link';
import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';
import type { VersionEventView } from '@quietglass/shared';
import { DataGrid, type GridColDef } from '@mui/x-data-grid';
import { useMemo } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import { ErrorAlert } from '../../../components/error-alert';
import { formatDateTime } from '../../../lib/format';
import { useAudit, type AuditFilter } from '../api/get-audit';

interface AuditGridProps {
  filter: AuditFilter;
  onFilterChange: (filter: AuditFilter) => void;
  /** Names of the designs, by id, for the grid and the design filter. */
  designs: readonly { id: number; name: string }[];
  /** The people who can appear as actors, for the actor filter. */
  people: readonly { id: number; displayName: string }[];
}

/** Every lifecycle step of every design: who moved which version from where to where, when and why. */
export function AuditGrid({ filter, onFilterChange, designs, people }: AuditGridProps) {
  const audit = useAudit(filter);
  const names = useMemo(() => new Map(designs.map((d) => [d.id, d.name])), [designs]);
  const columns = useMemo<GridColDef<VersionEventView>[]>(
    () => [
      {
        field: 'at',
        headerName: 'When',
        width: 180,
        valueFormatter: (value: string) => formatDateTime(value),
      },
      {
        field: 'designId',
        headerName: 'Design',
        flex: 1.3,
        minWidth: 220,
        valueGetter: (_v, row) => names.get(row.designId) ?? `Design ${row.designId}`,
        renderCell: ({ row, value }) => (
          <Link component={RouterLink} to={`/designs/${row.designId}?version=${row.versionNumber}`}>
            {String(value)}
          </Link>
        ),
      },
      { field: 'versionNumber', headerName: 'Version', width: 90, type: 'number' },
      {
        field: 'change',
        headerName: 'Status change',
        width: 200,
        valueGetter: (_v, row) => `${row.from} → ${row.to}`,
      },
      {
        field: 'actor',
        headerName: 'Who',
        width: 170,
        valueGetter: (_v, row) => row.actor.displayName,
      },
      {
        field: 'comment',
        headerName: 'Comment',
        flex: 1,
        minWidth: 200,
        valueFormatter: (value: string) => (value === '' ? '—' : value),
      },
    ],
    [names],
  );

  return (
    <Box sx={{ display: 'grid', gap: 2 }}>
      <Box sx={{ display: 'flex', gap: 2, flexWrap: 'wrap' }}>
        <TextField
          select
          size="small"
          label="Design"
          value={filter.designId === undefined ? '' : String(filter.designId)}
          onChange={(e) =>
            onFilterChange({
              ...filter,
              designId: e.target.value === '' ? undefined : Number(e.target.value),
            })
          }
          slotProps={{ select: { displayEmpty: true }, inputLabel: { shrink: true } }}
          sx={{ minWidth: 260 }}
        >
          <MenuItem value="">All designs</MenuItem>
          {designs.map((d) => (
            <MenuItem key={d.id} value={String(d.id)}>
              {d.name}
            </MenuItem>
          ))}
        </TextField>
        <TextField
          select
          size="small"
          label="Who"
          value={filter.actorId === undefined ? '' : String(filter.actorId)}
          onChange={(e) =>
            onFilterChange({ ...filter, actorId: e.target.value === '' ? undefined : Number(e.target.value) })
          }
          slotProps={{ select: { displayEmpty: true }, inputLabel: { shrink: true } }}
          sx={{ minWidth: 220 }}
        >
          <MenuItem value="">Everyone</MenuItem>
          {people.map((p) => (
            <MenuItem key={p.id} value={String(p.id)}>
              {p.displayName}
            </MenuItem>
          ))}
        </TextField>
      </Box>
      {audit.isError ? (
        <ErrorAlert error={audit.error} title="The audit trail could not be loaded" />
      ) : (
        <DataGrid
          aria-label="Audit trail"
          rows={audit.data ?? []}
          columns={columns}
          loading={audit.isPending}
          autoHeight
          disableRowSelectionOnClick
          initialState={{ sorting: { sortModel: [{ field: 'at', sort: 'desc' }] } }}
          localeText={{ noRowsLabel: 'No lifecycle steps match' }}
        />
      )}
    </Box>
  );
}
