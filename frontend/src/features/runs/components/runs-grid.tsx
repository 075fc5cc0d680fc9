import Link from '@mui/material/Link';
import { DataGrid, type GridColDef } from '@mui/x-data-grid';
import { useMemo } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import { ErrorAlert } from '../../../components/error-alert';
import type { ReleasedRecipeView, RunChamberView } from '../run-inputs';
import { useRuns, type RunView } from '../api/get-runs';
import { durabilityOutcome, recipeLabel } from '../run-labels';

interface RunsGridProps {
  recipes: readonly ReleasedRecipeView[] | undefined;
  chambers: readonly RunChamberView[] | undefined;
}

/** The latest chamber runs: lot, recipe, chamber, date, operator and durability result. */
export function RunsGrid({ recipes, chambers }: RunsGridProps) {
  const runs = useRuns();
  const columns = useMemo<GridColDef<RunView>[]>(
    () => [
      {
        field: 'lotNumber',
        headerName: 'Lot',
        flex: 1,
        minWidth: 140,
        renderCell: ({ row }) => (
          <Link component={RouterLink} to={`/runs/${row.id}`}>
            {row.lotNumber}
          </Link>
        ),
      },
      {
        field: 'recipe',
        headerName: 'Recipe',
        flex: 1.4,
        minWidth: 200,
        valueGetter: (_value, row) => recipeLabel(recipes, row.designId, row.versionNumber),
      },
      {
        field: 'chamber',
        headerName: 'Chamber',
        flex: 1,
        minWidth: 140,
        valueGetter: (_value, row) =>
          chambers?.find((c) => c.id === row.chamberId)?.name ?? `Chamber ${row.chamberId}`,
      },
      { field: 'runDate', headerName: 'Date', width: 120 },
      {
        field: 'operator',
        headerName: 'Operator',
        flex: 1,
        minWidth: 140,
        valueGetter: (_value, row) => row.operator.displayName,
      },
      {
        field: 'result',
        headerName: 'Durability',
        width: 120,
        valueGetter: (_value, row) => durabilityOutcome(row.durability),
      },
    ],
    [recipes, chambers],
  );

  if (runs.isError) return <ErrorAlert error={runs.error} title="The runs could not be loaded" />;
  return (
    <DataGrid
      aria-label="Chamber runs"
      rows={runs.data ?? []}
      columns={columns}
      loading={runs.isPending}
      autoHeight
      disableRowSelectionOnClick
      localeText={{ noRowsLabel: 'No runs yet: start one from a released recipe' }}
    />
  );
}
