import DownloadOutlined from '@mui/icons-material/DownloadOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { formatDateTime, formatFixed } from '../../../lib/format';
import { reportPdfUrl } from '../api/get-report';
import type { ReportView } from '../api/get-reports';
import { VerdictChip, verdictLabel } from './reports-grid';

interface ReportDetailProps {
  report: ReportView;
  designLabel: string;
  maskLabel: string;
}

function bandVerdict(pass: boolean | null, evaluated: boolean): string {
  if (!evaluated) return 'not evaluated';
  return verdictLabel({ pass });
}

/** A report's facts, its limit-band margins and the PDF itself, previewed and downloadable. */
export function ReportDetail({ report, designLabel, maskLabel }: ReportDetailProps) {
  const pdfUrl = reportPdfUrl(report.id);
  const { summary } = report;
  return (
    <Box sx={{ display: 'grid', gap: 3 }}>
      <Paper variant="outlined" sx={{ p: 2, display: 'grid', gap: 1 }}>
        <Box sx={{ display: 'flex', gap: 2, alignItems: 'center', flexWrap: 'wrap' }}>
          <VerdictChip summary={summary} />
          <Typography>
            {designLabel} version {report.versionNumber} against {maskLabel}
          </Typography>
          <Box sx={{ flex: 1 }} />
          <Button
            variant="outlined"
            startIcon={<DownloadOutlined />}
            href={pdfUrl}
            download={`compliance-report-${report.id}.pdf`}
          >
            Download PDF
          </Button>
        </Box>
        <Typography variant="body2" color="text.secondary">
          {summary.source === 'measured'
            ? `Measured values: run ${report.runId}, spectrum ${report.spectrumId}.`
            : 'Designed values computed from the approved version.'}{' '}
          {report.hideLayers ? 'The layer table is hidden.' : 'The layer table is included.'} Worst margin{' '}
          {formatFixed(summary.worstMargin, 3)} percentage points. Made by {report.createdBy},{' '}
          {formatDateTime(report.createdAt)}.
        </Typography>
        {summary.colour && (
          <Typography variant="body2" color="text.secondary">
            Reflected colour (D65, 2°): L* {formatFixed(summary.colour.L, 2)}, a*{' '}
            {formatFixed(summary.colour.a, 2)}, b* {formatFixed(summary.colour.b, 2)}; luminous reflectance Rv{' '}
            {formatFixed(summary.colour.Rv * 100, 3)} %
          </Typography>
        )}
      </Paper>

      <Box component="section" aria-labelledby="report-margins-title">
        <Typography id="report-margins-title" variant="h2" gutterBottom>
          Limit-band margins
        </Typography>
        <Table size="small" aria-labelledby="report-margins-title">
          <TableHead>
            <TableRow>
              <TableCell>Band</TableCell>
              <TableCell>Rule</TableCell>
              <TableCell>Angles</TableCell>
              <TableCell>Polarisation</TableCell>
              <TableCell>Result</TableCell>
              <TableCell align="right">Worst margin (pp)</TableCell>
              <TableCell align="right">At (nm)</TableCell>
              <TableCell align="right">Value (%)</TableCell>
            </TableRow>
          </TableHead>
          <TableBody>
            {summary.bands.map((b) => (
              <TableRow key={b.band}>
                <TableCell>{b.label || `Band ${b.band + 1}`}</TableCell>
                <TableCell>{b.rule}</TableCell>
                <TableCell>{b.angles}</TableCell>
                <TableCell>{b.polarisation}</TableCell>
                <TableCell title={b.reason}>{bandVerdict(b.pass, b.evaluated)}</TableCell>
                <TableCell align="right">{formatFixed(b.worstMargin, 3)}</TableCell>
                <TableCell align="right">{formatFixed(b.worstAtNm, 1)}</TableCell>
                <TableCell align="right">{formatFixed(b.valuePercent, 3)}</TableCell>
              </TableRow>
            ))}
          </TableBody>
        </Table>
      </Box>

      <Box component="section" aria-labelledby="report-pdf-title">
        <Typography id="report-pdf-title" variant="h2" gutterBottom>
          PDF
        </Typography>
        <Box
          component="iframe"
          title={`Compliance report R-${report.id} (PDF)`}
          src={pdfUrl}
          sx={{ width: '100%', height: 720, border: 1, borderColor: 'divider' }}
        />
      </Box>
    </Box>
  );
}
