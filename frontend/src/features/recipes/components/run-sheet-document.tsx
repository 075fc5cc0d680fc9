import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableFooter from '@mui/material/TableFooter';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { runSheetCalibrationLine } from '@quietglass/shared';
import { formatFixed } from '../../../lib/format';
import type { RunSheetView } from '../api/get-run-sheet';
import { formatDuration } from '../run-sheet-format';
import { MonitorSignalPlot } from './monitor-signal-plot';

interface RunSheetDocumentProps {
  sheet: RunSheetView;
}

/**
 * What the operator sets for a released recipe on one chamber: the cautions first, then the layers
 * in deposition order with part and monitor thicknesses, QWOT, rate and time, the totals, and the
 * monitor signal to expect.
 */
export function RunSheetDocument({ sheet }: RunSheetDocumentProps) {
  const lambda = sheet.monitorWavelengthNm;
  return (
    <Box sx={{ display: 'grid', gap: 2 }}>
      <Alert
        severity="warning"
        role="region"
        aria-label="Safety cautions"
        sx={{ '@media print': { breakInside: 'avoid' } }}
      >
        <AlertTitle>Safety before and during the run</AlertTitle>
        <ul style={{ margin: 0, paddingLeft: '1.25em' }}>
          {sheet.cautions.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      </Alert>
      <Paper variant="outlined" sx={{ p: 2 }} component="section" aria-label="Layers to deposit">
        <Typography variant="h2" component="h2" gutterBottom>
          Layers in deposition order
        </Typography>
        <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
          Step 1 goes on the substrate first; the last step is the outermost layer. Chamber{' '}
          {sheet.chamber.name}, monitor wavelength {lambda} nm. {sheet.convention}
        </Typography>
        <Typography variant="body2" sx={{ mb: 1 }} aria-label="Calibration used">
          {runSheetCalibrationLine(
            sheet.calibration,
            sheet.layers.map((l) => l.material),
          )}
        </Typography>
        <Table size="small" aria-label="Run sheet layers">
          <TableHead>
            <TableRow>
              <TableCell>Step</TableCell>
              <TableCell>Design layer</TableCell>
              <TableCell>Material</TableCell>
              <TableCell align="right">On the part (nm)</TableCell>
              <TableCell align="right">Tooling factor</TableCell>
              <TableCell align="right">Set on the monitor (nm)</TableCell>
              <TableCell align="right">QWOT at {lambda} nm</TableCell>
              <TableCell align="right">Rate (nm/s)</TableCell>
              <TableCell align="right">Time (s)</TableCell>
              <TableCell>Turning points (nm into the layer)</TableCell>
            </TableRow>
          </TableHead>
          <TableBody>
            {sheet.layers.map((l) => (
              <TableRow key={l.step}>
                <TableCell>{l.step}</TableCell>
                <TableCell>{l.designLayer}</TableCell>
                <TableCell>{l.material}</TableCell>
                <TableCell align="right">{formatFixed(l.partThicknessNm, 2)}</TableCell>
                <TableCell align="right">{formatFixed(l.toolingFactor, 3)}</TableCell>
                <TableCell align="right">{formatFixed(l.monitorThicknessNm, 2)}</TableCell>
                <TableCell align="right">{formatFixed(l.qwotAtMonitor, 3)}</TableCell>
                <TableCell align="right">{formatFixed(l.rateNmPerS, 2)}</TableCell>
                <TableCell align="right">{formatFixed(l.timeS, 1)}</TableCell>
                <TableCell>
                  {l.turningPointsNm.length === 0
                    ? '—'
                    : l.turningPointsNm.map((t) => t.toFixed(1)).join(', ')}
                </TableCell>
              </TableRow>
            ))}
          </TableBody>
          <TableFooter
            sx={{ '& .MuiTableCell-root': { color: 'text.primary', fontWeight: 600, fontSize: 'inherit' } }}
          >
            <TableRow>
              <TableCell colSpan={3}>Totals</TableCell>
              <TableCell align="right">{formatFixed(sheet.totals.partThicknessNm, 2)}</TableCell>
              <TableCell />
              <TableCell align="right">{formatFixed(sheet.totals.monitorThicknessNm, 2)}</TableCell>
              <TableCell />
              <TableCell />
              <TableCell align="right">{formatFixed(sheet.totals.timeS, 1)}</TableCell>
              <TableCell />
            </TableRow>
          </TableFooter>
        </Table>
        <Typography variant="body1" sx={{ mt: 1.5 }} aria-label="Run time">
          Deposition time {formatDuration(sheet.totals.timeS)} ({sheet.layers.length} layers, at the rates
          above; pump-down, heating and venting not included).
        </Typography>
      </Paper>
      <Paper
        variant="outlined"
        sx={{ p: 2, '@media print': { breakInside: 'avoid' } }}
        component="section"
        aria-label="Monitor signal"
      >
        <Typography variant="h2" component="h2" gutterBottom>
          Expected monitor signal
        </Typography>
        <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
          Transmittance through the monitor chip at {lambda} nm as each layer grows; diamonds mark turning
          points, ticks the thickness at which each layer stops.
        </Typography>
        <MonitorSignalPlot layers={sheet.layers} monitorWavelengthNm={lambda} />
      </Paper>
    </Box>
  );
}
