import Chip from '@mui/material/Chip';
import { DataGrid, type GridColDef, type GridRowSelectionModel } from '@mui/x-data-grid';
import { PROVENANCE_KIND_LABELS } from '@quietglass/shared';
import { useMemo } from 'react';
import { ErrorAlert } from '../../../components/error-alert';
import { useMaterials, type MaterialView } from '../api/get-materials';
import { MODEL_KIND_LABELS } from '../material-form';

const columns: GridColDef<MaterialView>[] = [
  {
    field: 'name',
    headerName: 'Name',
    flex: 1,
    minWidth: 160,
    renderCell: ({ row }) => (row.retiredAt ? `${row.name} (retired)` : row.name),
  },
  {
    field: 'model',
    headerName: 'Model',
    width: 150,
    valueGetter: (_v, row) => MODEL_KIND_LABELS[row.model.model],
  },
  {
    field: 'range',
    headerName: 'Range (nm)',
    width: 140,
    valueGetter: (_v, row) => `${row.rangeNm.from}–${row.rangeNm.to}`,
    sortComparator: (a: string, b: string) => parseFloat(a) - parseFloat(b),
  },
  {
    field: 'provenance',
    headerName: 'Data',
    width: 200,
    valueGetter: (_v, row) => PROVENANCE_KIND_LABELS[row.provenance.kind],
    renderCell: ({ row }) =>
      row.provenance.kind === 'typical' ? (
        <Chip size="small" color="warning" variant="outlined" label={PROVENANCE_KIND_LABELS.typical} />
      ) : (
        PROVENANCE_KIND_LABELS[row.provenance.kind]
      ),
  },
  {
    field: 'source',
    headerName: 'Source',
    flex: 2,
    minWidth: 220,
    valueGetter: (_v, row) => row.provenance.source,
  },
];

interface MaterialsGridProps {
  selectedId: number | null;
  onSelect: (material: MaterialView | null) => void;
  /** Also list retired materials (default: only those in use for new work). */
  showRetired?: boolean;
}

/** The materials library; choosing a row opens its detail. */
export function MaterialsGrid({ selectedId, onSelect, showRetired = false }: MaterialsGridProps) {
  const materials = useMaterials();
  const rows = useMemo(
    () => (materials.data ?? []).filter((m) => showRetired || !m.retiredAt || m.id === selectedId),
    [materials.data, showRetired, selectedId],
  );
  const selection = useMemo<GridRowSelectionModel>(
    () => ({ type: 'include', ids: new Set(selectedId === null ? [] : [selectedId]) }),
    [selectedId],
  );
  if (materials.isError)
    return <ErrorAlert error={materials.error} title="The materials could not be loaded" />;
  return (
    <DataGrid
      aria-label="Materials"
      rows={rows}
      columns={columns}
      loading={materials.isPending}
      autoHeight
      disableMultipleRowSelection
      rowSelectionModel={selection}
      onRowSelectionModelChange={(model) => {
        const id = [...model.ids][0];
        onSelect(materials.data?.find((m) => m.id === id) ?? null);
      }}
      initialState={{ sorting: { sortModel: [{ field: 'name', sort: 'asc' }] } }}
    />
  );
}
