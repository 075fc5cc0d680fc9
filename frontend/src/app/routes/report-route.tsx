import Button from '@mui/material/Button';
import { useQuery } from '@tanstack/react-query';
import { Link as RouterLink, useParams } from 'react-router-dom';
import { ErrorAlert } from '../../components/error-alert';
import { LoadingBlock } from '../../components/loading-block';
import { PageHeader } from '../../components/page-header';
import { getDesignQueryOptions } from '../../features/designs/api/get-design';
import { useReport } from '../../features/reports/api/get-report';
import { ReportDetail } from '../../features/reports/components/report-detail';
import { useSpecMask } from '../../features/spec-masks/api/get-spec-mask';
import { NotFoundRoute } from './not-found-route';

export function ReportRoute() {
  const params = useParams();
  const reportId = Number(params.id);
  const valid = Number.isInteger(reportId) && reportId > 0;
  const report = useReport(valid ? reportId : 0);
  const design = useQuery({
    ...getDesignQueryOptions(report.data?.designId ?? 0),
    enabled: report.data !== undefined,
  });
  const mask = useSpecMask(report.data?.specMaskId ?? null);

  if (!valid) return <NotFoundRoute />;
  if (report.isPending) return <LoadingBlock label="Loading the report" />;
  if (report.isError) return <ErrorAlert error={report.error} title="The report could not be loaded" />;

  const designLabel = design.data
    ? `${design.data.name} (${design.data.customer.name})`
    : `Design ${report.data.designId}`;
  const maskLabel = mask.data
    ? `${mask.data.name} rev ${mask.data.revision}`
    : `spec mask ${report.data.specMaskId}`;

  return (
    <>
      <PageHeader
        title={`Compliance report R-${report.data.id}`}
        description={`${designLabel}, version ${report.data.versionNumber}`}
        actions={
          <Button component={RouterLink} to="/reports" variant="text">
            All reports
          </Button>
        }
      />
      <ReportDetail report={report.data} designLabel={designLabel} maskLabel={maskLabel} />
    </>
  );
}
