import Link from '@mui/material/Link';
import { DataGrid, type GridColDef } from '@mui/x-data-grid';
import { Link as RouterLink } from 'react-router-dom';
import { ErrorAlert } from '../../../components/error-alert';
import { formatDateTime } from '../../../lib/format';
import { useRecipes, type RecipeSummaryView } from '../api/get-recipes';

export function runSheetPath(recipe: { designId: number; number: number }): string {
  return `/recipes/${recipe.designId}/${recipe.number}`;
}

const columns: GridColDef<RecipeSummaryView>[] = [
  {
    field: 'name',
    headerName: 'Design',
    flex: 1.4,
    minWidth: 220,
    renderCell: ({ row }) => (
      <Link component={RouterLink} to={runSheetPath(row)}>
        {row.name}
      </Link>
    ),
  },
  { field: 'number', headerName: 'Version', width: 100, type: 'number', align: 'left', headerAlign: 'left' },
  { field: 'customer', headerName: 'Customer', flex: 1, minWidth: 180 },
  {
    field: 'releasedAt',
    headerName: 'Released',
    width: 190,
    valueFormatter: (value: string) => formatDateTime(value),
  },
  {
    field: 'releasedBy',
    headerName: 'Released by',
    width: 170,
    valueFormatter: (value: string | null) => value ?? '—',
  },
  {
    field: 'runSheet',
    headerName: 'Run sheet',
    width: 150,
    sortable: false,
    renderCell: ({ row }) => (
      <Link
        component={RouterLink}
        to={runSheetPath(row)}
        aria-label={`Run sheet of ${row.name} version ${row.number}`}
      >
        Open run sheet
      </Link>
    ),
  },
];

/** Released recipes: open one to choose a chamber and print its run sheet. */
export function RecipesGrid() {
  const recipes = useRecipes();
  if (recipes.isError) return <ErrorAlert error={recipes.error} title="The recipes could not be loaded" />;
  return (
    <DataGrid
      aria-label="Released recipes"
      rows={recipes.data ?? []}
      columns={columns}
      getRowId={(row) => `${row.designId}:${row.number}`}
      loading={recipes.isPending}
      autoHeight
      disableRowSelectionOnClick
      initialState={{ sorting: { sortModel: [{ field: 'releasedAt', sort: 'desc' }] } }}
      localeText={{ noRowsLabel: 'No released recipes yet' }}
    />
  );
}
