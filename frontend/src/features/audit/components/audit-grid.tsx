import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Link from '@mui/material/Link';
import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';
import {
  AUDIT_ENTITIES,
  AUDIT_ENTITY_LABELS,
  type AuditEntity,
  type AuditEventView,
} from '@quietglass/shared';
import { DataGrid, type GridColDef } from '@mui/x-data-grid';
import { useMemo } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import { ErrorAlert } from '../../../components/error-alert';
import { formatDateTime } from '../../../lib/format';
import { auditCsvUrl, useAudit, type AuditFilter } from '../api/get-audit';

interface AuditGridProps {
  filter: AuditFilter;
  onFilterChange: (filter: AuditFilter) => void;
  /** Names of the designs, by id, for the Record column. */
  designs: readonly { id: number; name: string }[];
  /** The people who can appear as actors, for the Who filter. */
  people: readonly { id: number; displayName: string }[];
}

/** Pages of the client that show one record, where there is one. */
const RECORD_PAGES: Partial<Record<AuditEntity, (id: number) => string>> = {
  design: (id) => `/designs/${id}`,
  run: (id) => `/runs/${id}`,
};

/** A whole number > 0 typed into a field, or undefined. */
function idValue(text: string): number | undefined {
  const n = Number(text);
  return text.trim() !== '' && Number.isInteger(n) && n > 0 ? n : undefined;
}

/** Every recorded change to every record that matters: who did what, to which record, when. */
export function AuditGrid({ filter, onFilterChange, designs, people }: AuditGridProps) {
  const audit = useAudit(filter);
  const names = useMemo(() => new Map(designs.map((d) => [d.id, d.name])), [designs]);
  const columns = useMemo<GridColDef<AuditEventView>[]>(
    () => [
      {
        field: 'at',
        headerName: 'When',
        width: 180,
        valueFormatter: (value: string) => formatDateTime(value),
      },
      {
        field: 'record',
        headerName: 'Record',
        flex: 1,
        minWidth: 220,
        valueGetter: (_v, row) =>
          row.entity === 'design' && names.has(row.entityId)
            ? `Stack design ${names.get(row.entityId)}`
            : `${AUDIT_ENTITY_LABELS[row.entity]} #${row.entityId}`,
        renderCell: ({ row, value }) => {
          const page = RECORD_PAGES[row.entity];
          return page ? (
            <Link component={RouterLink} to={page(row.entityId)}>
              {String(value)}
            </Link>
          ) : (
            String(value)
          );
        },
      },
      { field: 'action', headerName: 'Action', width: 160 },
      { field: 'summary', headerName: 'What changed', flex: 1.5, minWidth: 260 },
      {
        field: 'actor',
        headerName: 'Who',
        width: 170,
        valueGetter: (_v, row) => row.actor?.displayName ?? 'system',
      },
    ],
    [names],
  );

  return (
    <Box sx={{ display: 'grid', gap: 2 }}>
      <Box sx={{ display: 'flex', gap: 2, flexWrap: 'wrap', alignItems: 'center' }}>
        <TextField
          select
          size="small"
          label="Record"
          value={filter.entity ?? ''}
          onChange={(e) =>
            onFilterChange({
              ...filter,
              entity: e.target.value === '' ? undefined : (e.target.value as AuditEntity),
              entityId: e.target.value === '' ? undefined : filter.entityId,
            })
          }
          slotProps={{ select: { displayEmpty: true }, inputLabel: { shrink: true } }}
          sx={{ minWidth: 200 }}
        >
          <MenuItem value="">All records</MenuItem>
          {AUDIT_ENTITIES.map((e) => (
            <MenuItem key={e} value={e}>
              {AUDIT_ENTITY_LABELS[e]}
            </MenuItem>
          ))}
        </TextField>
        <TextField
          size="small"
          label="Record id"
          value={filter.entityId === undefined ? '' : String(filter.entityId)}
          disabled={filter.entity === undefined}
          onChange={(e) => onFilterChange({ ...filter, entityId: idValue(e.target.value) })}
          slotProps={{ htmlInput: { inputMode: 'numeric' }, inputLabel: { shrink: true } }}
          sx={{ width: 120 }}
        />
        <TextField
          select
          size="small"
          label="Who"
          value={filter.actorId === undefined ? '' : String(filter.actorId)}
          onChange={(e) =>
            onFilterChange({ ...filter, actorId: e.target.value === '' ? undefined : Number(e.target.value) })
          }
          slotProps={{ select: { displayEmpty: true }, inputLabel: { shrink: true } }}
          sx={{ minWidth: 200 }}
        >
          <MenuItem value="">Everyone</MenuItem>
          {people.map((p) => (
            <MenuItem key={p.id} value={String(p.id)}>
              {p.displayName}
            </MenuItem>
          ))}
        </TextField>
        <TextField
          size="small"
          type="date"
          label="From"
          value={filter.from ?? ''}
          onChange={(e) => onFilterChange({ ...filter, from: e.target.value || undefined })}
          slotProps={{ inputLabel: { shrink: true } }}
        />
        <TextField
          size="small"
          type="date"
          label="To"
          value={filter.to ?? ''}
          onChange={(e) => onFilterChange({ ...filter, to: e.target.value || undefined })}
          slotProps={{ inputLabel: { shrink: true } }}
        />
        <Button
          component="a"
          href={auditCsvUrl(filter)}
          download="audit-trail.csv"
          variant="outlined"
          size="small"
        >
          Export CSV
        </Button>
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
          localeText={{ noRowsLabel: 'No recorded changes match' }}
        />
      )}
    </Box>
  );
}
