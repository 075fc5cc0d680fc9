import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { DataGrid, type GridColDef, type GridRowSelectionModel } from '@mui/x-data-grid';
import { useMemo } from 'react';
import { SPEC_MASK_KIND_LABELS } from '@quietglass/shared';
import { ErrorAlert } from '../../../components/error-alert';
import { apiUrl } from '../../../lib/api-client';
import { formatDateTime } from '../../../lib/format';
import { describeBand } from '../../../lib/mask-regions';
import { useSpecMasks, type SpecMaskView } from '../api/get-spec-masks';
import { MaskPreviewPlot } from './mask-preview-plot';

const columns: GridColDef<SpecMaskView>[] = [
  { field: 'name', headerName: 'Name', flex: 1, minWidth: 180 },
  { field: 'revision', headerName: 'Rev', width: 80 },
  {
    field: 'kind',
    headerName: 'Kind',
    width: 190,
    valueGetter: (_v, row) => SPEC_MASK_KIND_LABELS[row.kind],
  },
  {
    field: 'customer',
    headerName: 'Customer',
    flex: 1,
    minWidth: 160,
    valueGetter: (_v, row) => row.customer.name,
  },
  { field: 'bands', headerName: 'Bands', width: 90, valueGetter: (_v, row) => row.bands.length },
  { field: 'updatedAt', headerName: 'Updated', width: 180, valueFormatter: (v: string) => formatDateTime(v) },
];

interface SpecMasksListProps {
  /** One customer's masks, or every mask when null. */
  customerId: number | null;
  selectedId: number | null;
  onSelect: (mask: SpecMaskView | null) => void;
  canEdit: boolean;
  onEdit: (mask: SpecMaskView) => void;
}

/** The spec masks of a customer, and the chosen one's bands, forbidden regions and CSV export. */
export function SpecMasksList({ customerId, selectedId, onSelect, canEdit, onEdit }: SpecMasksListProps) {
  const masks = useSpecMasks(customerId === null ? {} : { customerId });
  const selection = useMemo<GridRowSelectionModel>(
    () => ({ type: 'include', ids: new Set(selectedId === null ? [] : [selectedId]) }),
    [selectedId],
  );
  const selected = masks.data?.find((m) => m.id === selectedId) ?? null;
  if (masks.isError) return <ErrorAlert error={masks.error} title="The spec masks could not be loaded" />;
  return (
    <Box sx={{ display: 'grid', gap: 2 }}>
      <DataGrid
        aria-label="Spec masks"
        rows={masks.data ?? []}
        columns={columns}
        loading={masks.isPending}
        autoHeight
        disableMultipleRowSelection
        rowSelectionModel={selection}
        onRowSelectionModelChange={(model) => {
          const id = [...model.ids][0];
          onSelect(masks.data?.find((m) => m.id === id) ?? null);
        }}
        localeText={{ noRowsLabel: 'No spec masks for this customer yet' }}
      />
      {selected && (
        <Paper variant="outlined" sx={{ p: 2 }} component="section" aria-label={`Spec mask ${selected.name}`}>
          <Box sx={{ display: 'flex', gap: 1, alignItems: 'center', flexWrap: 'wrap', mb: 1 }}>
            <Typography variant="h2" component="h2" sx={{ flexGrow: 1 }}>
              {selected.name} rev {selected.revision}
            </Typography>
            <Button
              component="a"
              href={apiUrl(`/spec-masks/${selected.id}/csv`)}
              download={`spec-mask-${selected.id}.csv`}
              variant="outlined"
              size="small"
            >
              Download CSV
            </Button>
            {canEdit && (
              <Button variant="outlined" size="small" onClick={() => onEdit(selected)}>
                Edit
              </Button>
            )}
          </Box>
          <Typography variant="body2" color="text.secondary">
            {selected.customer.name}
            {selected.notes ? ` · ${selected.notes}` : ''}
          </Typography>
          <ul aria-label="Limit bands">
            {selected.bands.map((band, i) => (
              <li key={i}>
                <Typography variant="body2">{describeBand(band)}</Typography>
              </li>
            ))}
          </ul>
          <MaskPreviewPlot bands={selected.bands} title={`Forbidden regions of ${selected.name}`} />
        </Paper>
      )}
    </Box>
  );
}
