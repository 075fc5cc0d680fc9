import Link from '@mui/material/Link';
import { DataGrid, type GridColDef } from '@mui/x-data-grid';
import { Link as RouterLink } from 'react-router-dom';
import { ErrorAlert } from '../../../components/error-alert';
import { formatDateTime } from '../../../lib/format';
import { useOutbox, type OutboxMessageView } from '../api/get-outbox';

/** The quote a message sends, read from its subject ("Quote Q-12: …"); null for other mail. */
export function quoteIdOf(subject: string): number | null {
  const match = /^Quote Q-(\d+):/.exec(subject);
  return match ? Number(match[1]) : null;
}

const columns: GridColDef<OutboxMessageView>[] = [
  {
    field: 'receivedAt',
    headerName: 'When',
    width: 180,
    valueFormatter: (value: string) => formatDateTime(value),
  },
  { field: 'to', headerName: 'To', flex: 1, minWidth: 200 },
  { field: 'subject', headerName: 'Subject', flex: 1.6, minWidth: 240 },
  {
    field: 'quote',
    headerName: 'Quote',
    width: 100,
    valueGetter: (_v, row) => quoteIdOf(row.subject),
    renderCell: ({ value }) =>
      typeof value === 'number' ? (
        <Link component={RouterLink} to={`/quotes/${value}`} onClick={(e) => e.stopPropagation()}>
          {`Q-${value}`}
        </Link>
      ) : (
        '—'
      ),
  },
  {
    field: 'attachments',
    headerName: 'Attachments',
    width: 120,
    type: 'number',
    valueGetter: (_v, row) => row.attachments.length,
  },
];

interface OutboxGridProps {
  selectedId: number | null;
  onSelect: (id: number) => void;
}

/** Every message the local SMTP fake received, newest first: choose one to read it. */
export function OutboxGrid({ selectedId, onSelect }: OutboxGridProps) {
  const outbox = useOutbox();
  if (outbox.isError) return <ErrorAlert error={outbox.error} title="The outbox could not be loaded" />;
  return (
    <DataGrid
      aria-label="Outbox"
      rows={outbox.data ?? []}
      columns={columns}
      loading={outbox.isPending}
      autoHeight
      rowSelectionModel={{ type: 'include', ids: new Set(selectedId === null ? [] : [selectedId]) }}
      onRowClick={({ row }: { row: { id: number } }) => onSelect(row.id)}
      initialState={{ sorting: { sortModel: [{ field: 'receivedAt', sort: 'desc' }] } }}
      localeText={{ noRowsLabel: 'No messages sent yet' }}
    />
  );
}
