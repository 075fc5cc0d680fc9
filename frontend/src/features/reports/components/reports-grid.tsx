import Chip from '@mui/material/Chip';
import Link from '@mui/material/Link';
import { DataGrid, type GridColDef } from '@mui/x-data-grid';
import { useMemo } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import { ErrorAlert } from '../../../components/error-alert';
import { formatDateTime, formatFixed } from '../../../lib/format';
import { useReports, type ReportSummary, type ReportView } from '../api/get-reports';

interface ReportsGridProps {
  /** Names for the ids a report holds; the id is shown where a name is unknown. */
  designName: (designId: number) => string | undefined;
  maskName: (specMaskId: number) => string | undefined;
}

/** PASS, FAIL, or "not evaluated" when no band could be evaluated (a measurement of other angles). */
export function verdictLabel(summary: Pick<ReportSummary, 'pass'>): string {
  return summary.pass === null ? 'not evaluated' : summary.pass ? 'PASS' : 'FAIL';
}

export function VerdictChip({ summary }: { summary: Pick<ReportSummary, 'pass'> }) {
  const color = summary.pass === null ? 'default' : summary.pass ? 'success' : 'error';
  return <Chip size="small" color={color} label={verdictLabel(summary)} />;
}

/** Every compliance report, newest first: open one by its number. */
export function ReportsGrid({ designName, maskName }: ReportsGridProps) {
  const reports = useReports();
  const columns = useMemo<GridColDef<ReportView>[]>(
    () => [
      {
        field: 'id',
        headerName: 'Report',
        width: 110,
        renderCell: ({ row }) => (
          <Link component={RouterLink} to={`/reports/${row.id}`}>
            {`R-${row.id}`}
          </Link>
        ),
      },
      {
        field: 'design',
        headerName: 'Design',
        flex: 1.2,
        minWidth: 180,
        valueGetter: (_v, row) =>
          `${designName(row.designId) ?? `Design ${row.designId}`} v${row.versionNumber}`,
      },
      {
        field: 'mask',
        headerName: 'Spec mask',
        flex: 1,
        minWidth: 160,
        valueGetter: (_v, row) => maskName(row.specMaskId) ?? `Mask ${row.specMaskId}`,
      },
      {
        field: 'source',
        headerName: 'Values',
        width: 110,
        valueGetter: (_v, row) => row.summary.source,
      },
      {
        field: 'pass',
        headerName: 'Result',
        width: 130,
        valueGetter: (_v, row) => verdictLabel(row.summary),
        renderCell: ({ row }) => <VerdictChip summary={row.summary} />,
      },
      {
        field: 'worstMargin',
        headerName: 'Worst margin (pp)',
        width: 150,
        type: 'number',
        valueGetter: (_v, row) => row.summary.worstMargin,
        valueFormatter: (value: number | null) => formatFixed(value, 3),
      },
      { field: 'createdBy', headerName: 'By', width: 150 },
      {
        field: 'createdAt',
        headerName: 'Created',
        width: 180,
        valueFormatter: (value: string) => formatDateTime(value),
      },
    ],
    [designName, maskName],
  );
  if (reports.isError) return <ErrorAlert error={reports.error} title="The reports could not be loaded" />;
  return (
    <DataGrid
      aria-label="Compliance reports"
      rows={reports.data ?? []}
      columns={columns}
      loading={reports.isPending}
      autoHeight
      disableRowSelectionOnClick
      initialState={{ sorting: { sortModel: [{ field: 'id', sort: 'desc' }] } }}
      localeText={{ noRowsLabel: 'No compliance reports yet' }}
    />
  );
}
