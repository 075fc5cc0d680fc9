import Chip from '@mui/material/Chip';
import Link from '@mui/material/Link';
import { DataGrid, type GridColDef } from '@mui/x-data-grid';
import type { DesignSummaryView } from '@quietglass/shared';
import { Link as RouterLink } from 'react-router-dom';
import { ErrorAlert } from '../../../components/error-alert';
import { formatDateTime } from '../../../lib/format';
import { useDesigns } from '../api/get-designs';

const columns: GridColDef<DesignSummaryView>[] = [
  {
    field: 'name',
    headerName: 'Name',
    flex: 1.3,
    minWidth: 200,
    renderCell: ({ row }) => (
      <Link component={RouterLink} to={`/designs/${row.id}`}>
        {row.name}
      </Link>
    ),
  },
  {
    field: 'customer',
    headerName: 'Customer',
    flex: 1,
    minWidth: 160,
    valueGetter: (_v, row) => row.customer.name,
  },
  {
    field: 'latestVersion',
    headerName: 'Latest version',
    width: 170,
    valueGetter: (_v, row) => row.latestVersion.number,
    renderCell: ({ row }) => (
      <>
        {row.latestVersion.number}
        <Chip size="small" label={row.latestVersion.status} sx={{ ml: 1 }} />
      </>
    ),
  },
  { field: 'author', headerName: 'Author', width: 160, valueGetter: (_v, row) => row.createdBy.displayName },
  {
    field: 'updated',
    headerName: 'Updated',
    width: 180,
    valueGetter: (_v, row) => row.latestVersion.updatedAt,
    valueFormatter: (value: string) => formatDateTime(value),
  },
];

/** Every stack design: open one by its name. */
export function DesignsGrid() {
  const designs = useDesigns();
  if (designs.isError) return <ErrorAlert error={designs.error} title="The designs could not be loaded" />;
  return (
    <DataGrid
      aria-label="Stack designs"
      rows={designs.data ?? []}
      columns={columns}
      loading={designs.isPending}
      autoHeight
      disableRowSelectionOnClick
      initialState={{ sorting: { sortModel: [{ field: 'updated', sort: 'desc' }] } }}
      localeText={{ noRowsLabel: 'No designs yet' }}
    />
  );
}
