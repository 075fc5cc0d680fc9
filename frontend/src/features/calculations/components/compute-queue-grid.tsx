import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import LinearProgress from '@mui/material/LinearProgress';
import Link from '@mui/material/Link';
import { DataGrid, type GridColDef } from '@mui/x-data-grid';
import { useMemo } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import { ErrorAlert } from '../../../components/error-alert';
import { formatDateTime } from '../../../lib/format';
import { useCancelCalculation } from '../api/cancel-calculation';
import {
  isAnalysis,
  isLive,
  type CalculationKind,
  type CalculationStatus,
  type CalculationView,
} from '../api/get-calculation';
import { useCalculations } from '../api/get-calculations';

const STATUS_COLOURS: Record<CalculationStatus, 'default' | 'info' | 'success' | 'error' | 'warning'> = {
  queued: 'default',
  running: 'info',
  completed: 'success',
  failed: 'error',
  cancelled: 'warning',
};

/** The product's names for the jobs of the compute queue. */
const KIND_LABELS: Record<CalculationKind, string> = {
  analysis: 'Full analysis',
  fit: 'Fit to mask',
  grow: 'Grow layers',
  yield: 'Yield forecast',
  diagnosis: 'Run diagnosis',
};

function seconds(from: string | null, to: string | null): string {
  if (!from || !to) return '—';
  const s = (new Date(to).getTime() - new Date(from).getTime()) / 1000;
  return Number.isFinite(s) ? `${s.toFixed(1)} s` : '—';
}

interface ComputeQueueGridProps {
  /** Names of designs by id, for the design column (the number alone when unknown). */
  designNames: ReadonlyMap<number, string>;
  canCancel: boolean;
  pollMs?: number;
}

/** Where a finished calculation's result is shown: its run page, or its version's workspace tab. */
export function resultPath(c: CalculationView): string {
  if (c.kind === 'diagnosis' && c.runId !== null) return `/runs/${c.runId}`;
  const tab = c.kind === 'analysis' ? 'analysis' : 'optimise';
  return `/designs/${c.designId}?version=${c.versionNumber ?? ''}&tab=${tab}&calculation=${c.id}`;
}

/** The compute queue: recent calculations with status, progress and timings; cancel the live ones. */
export function ComputeQueueGrid({ designNames, canCancel, pollMs }: ComputeQueueGridProps) {
  const calculations = useCalculations(pollMs);
  const cancel = useCancelCalculation();
  const { mutate } = cancel;
  const cancelling = cancel.isPending ? cancel.variables : null;

  const columns = useMemo<GridColDef<CalculationView>[]>(
    () => [
      {
        field: 'id',
        headerName: 'No.',
        width: 80,
        type: 'number',
        // A finished calculation's number opens its result.
        renderCell: ({ row }) =>
          row.status === 'completed' ? (
            <Link
              component={RouterLink}
              to={resultPath(row)}
              aria-label={`Open the result of calculation ${row.id}`}
              title="Open the result"
            >
              {row.id}
            </Link>
          ) : (
            row.id
          ),
      },
      {
        field: 'status',
        headerName: 'Status',
        width: 120,
        renderCell: ({ row }) => <Chip size="small" label={row.status} color={STATUS_COLOURS[row.status]} />,
      },
      {
        field: 'progress',
        headerName: 'Progress',
        width: 140,
        renderCell: ({ row }) => (
          <Box sx={{ width: '100%' }}>
            <LinearProgress
              variant="determinate"
              value={Math.round(100 * (row.status === 'completed' ? 1 : row.progress))}
              aria-label={`Progress of calculation ${row.id}`}
            />
          </Box>
        ),
      },
      {
        field: 'design',
        headerName: 'Design',
        flex: 1,
        minWidth: 200,
        valueGetter: (_v, row) =>
          row.designId === null ? '' : (designNames.get(row.designId) ?? `Design ${row.designId}`),
        renderCell: ({ row, value }) =>
          row.designId === null ? (
            row.runId === null ? (
              '—'
            ) : (
              `Chamber run ${row.runId}`
            )
          ) : (
            <Link component={RouterLink} to={`/designs/${row.designId}?version=${row.versionNumber ?? ''}`}>
              {value as string} · v{row.versionNumber}
            </Link>
          ),
      },
      {
        field: 'kind',
        headerName: 'Kind',
        width: 140,
        valueGetter: (_v, row) => KIND_LABELS[row.kind] ?? row.kind,
      },
      {
        field: 'grid',
        headerName: 'Grid',
        width: 200,
        sortable: false,
        valueGetter: (_v, row) => {
          if (!isAnalysis(row)) return '—';
          const r = row.request;
          return `${r.fromNm}–${r.toNm} nm × ${r.wavelengthCount}, ${r.angleFromDeg}–${r.angleToDeg}° × ${r.angleCount}`;
        },
      },
      { field: 'createdBy', headerName: 'By', width: 140 },
      {
        field: 'createdAt',
        headerName: 'Queued',
        width: 170,
        valueFormatter: (v: string) => formatDateTime(v),
      },
      {
        field: 'wait',
        headerName: 'Waited',
        width: 90,
        valueGetter: (_v, row) => seconds(row.createdAt, row.startedAt),
      },
      {
        field: 'computeMs',
        headerName: 'Compute',
        width: 100,
        valueFormatter: (v: number | null) => (v === null ? '—' : `${(v / 1000).toFixed(2)} s`),
      },
      {
        field: 'finishedAt',
        headerName: 'Finished',
        width: 170,
        valueFormatter: (v: string | null) => formatDateTime(v),
      },
      {
        field: 'actions',
        headerName: '',
        width: 110,
        sortable: false,
        renderCell: ({ row }) =>
          canCancel && isLive(row.status) ? (
            <Button
              size="small"
              color="warning"
              disabled={cancelling === row.id}
              onClick={() => mutate(row.id)}
              aria-label={`Cancel calculation ${row.id}`}
            >
              Cancel
            </Button>
          ) : null,
      },
    ],
    [designNames, canCancel, cancelling, mutate],
  );

  if (calculations.isError)
    return <ErrorAlert error={calculations.error} title="The compute queue could not be loaded" />;
  return (
    <DataGrid
      aria-label="Compute queue"
      rows={calculations.data ?? []}
      columns={columns}
      loading={calculations.isPending}
      autoHeight
      disableRowSelectionOnClick
      localeText={{ noRowsLabel: 'No calculations yet' }}
      sx={{ '& .MuiDataGrid-cell': { display: 'flex', alignItems: 'center' } }}
    />
  );
}
