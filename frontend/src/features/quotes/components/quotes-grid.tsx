import Box from '@mui/material/Box';
import Link from '@mui/material/Link';
import TextField from '@mui/material/TextField';
import { DataGrid, type GridColDef, type GridFilterModel } from '@mui/x-data-grid';
import { useMemo, useState } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import { ErrorAlert } from '../../../components/error-alert';
import { formatDateTime } from '../../../lib/format';
import { QUOTE_STATUSES, useQuotes, type QuoteView } from '../api/get-quotes';
import { QuoteStatusChip } from './quote-status-chip';

/** Lowest unit price of a quote (the largest break), for the list. */
function fromPrice(q: QuoteView): string {
  if (q.quantityBreaks.length === 0) return '—';
  const lowest = Math.min(...q.quantityBreaks.map((b) => b.unitPrice));
  return `${lowest.toFixed(2)} ${q.currency}`;
}

const columns: GridColDef<QuoteView>[] = [
  {
    field: 'id',
    headerName: 'Quote',
    width: 100,
    renderCell: ({ row }) => (
      <Link component={RouterLink} to={`/quotes/${row.id}`}>
        {`Q-${row.id}`}
      </Link>
    ),
  },
  {
    field: 'customer',
    headerName: 'Customer',
    flex: 1,
    minWidth: 170,
    valueGetter: (_v, row) => row.customer.name,
  },
  { field: 'partDescription', headerName: 'Part', flex: 1.4, minWidth: 200 },
  {
    field: 'status',
    headerName: 'Status',
    width: 120,
    type: 'singleSelect',
    valueOptions: [...QUOTE_STATUSES],
    renderCell: ({ row }) => <QuoteStatusChip status={row.status} />,
  },
  { field: 'price', headerName: 'From (unit price)', width: 150, valueGetter: (_v, row) => fromPrice(row) },
  { field: 'validUntil', headerName: 'Valid until', width: 120 },
  { field: 'contactEmail', headerName: 'Contact', flex: 1, minWidth: 180 },
  {
    field: 'updatedAt',
    headerName: 'Updated',
    width: 180,
    valueFormatter: (value: string) => formatDateTime(value),
  },
];

/** Every quote, filtered by status and customer: open one by its number. */
export function QuotesGrid() {
  const quotes = useQuotes();
  const [filterModel, setFilterModel] = useState<GridFilterModel>({ items: [] });
  const [customerId, setCustomerId] = useState('');
  const customers = useMemo(() => {
    const byId = new Map((quotes.data ?? []).map((q) => [q.customer.id, q.customer.name]));
    return [...byId].sort((a, b) => a[1].localeCompare(b[1]));
  }, [quotes.data]);
  // The status is the grid's own filter model (its toolbar shows, changes and clears it); the
  // customer narrows the rows, as the grid holds one filter at a time.
  const statusItem = filterModel.items.find((i) => i.field === 'status' && i.operator === 'is');
  const status = typeof statusItem?.value === 'string' ? statusItem.value : '';
  const rows = useMemo(
    () => (quotes.data ?? []).filter((q) => customerId === '' || String(q.customer.id) === customerId),
    [quotes.data, customerId],
  );

  if (quotes.isError) return <ErrorAlert error={quotes.error} title="The quotes could not be loaded" />;
  return (
    <>
      <Box sx={{ display: 'flex', gap: 2, mb: 2, flexWrap: 'wrap' }}>
        <TextField
          select
          size="small"
          label="Status"
          value={status}
          onChange={(e) =>
            setFilterModel({
              items:
                e.target.value === ''
                  ? []
                  : [{ id: 1, field: 'status', operator: 'is', value: e.target.value }],
            })
          }
          slotProps={{ select: { native: true }, inputLabel: { shrink: true } }}
          sx={{ minWidth: 180 }}
        >
          <option value="">All statuses</option>
          {QUOTE_STATUSES.map((s) => (
            <option key={s} value={s}>
              {s}
            </option>
          ))}
        </TextField>
        <TextField
          select
          size="small"
          label="Customer"
          value={customerId}
          onChange={(e) => setCustomerId(e.target.value)}
          slotProps={{ select: { native: true }, inputLabel: { shrink: true } }}
          sx={{ minWidth: 260 }}
        >
          <option value="">All customers</option>
          {customers.map(([id, name]) => (
            <option key={id} value={String(id)}>
              {name}
            </option>
          ))}
        </TextField>
      </Box>
      <DataGrid
        aria-label="Quotes"
        rows={rows}
        columns={columns}
        loading={quotes.isPending}
        autoHeight
        disableRowSelectionOnClick
        showToolbar
        filterModel={filterModel}
        onFilterModelChange={setFilterModel}
        initialState={{ sorting: { sortModel: [{ field: 'id', sort: 'desc' }] } }}
        localeText={{ noRowsLabel: 'No quotes yet' }}
      />
    </>
  );
}
