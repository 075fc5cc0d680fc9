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
import { formatToolingFactor, processLines, SIDES_LABELS } from '@quietglass/shared';
import { apiUrl } from '../../../lib/api-client';
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
/** Label of the QWOT column: the monitor's QWOT, at the monitor wavelength. */
export function qwotLabel(monitorWavelengthNm: number): string {
  return `Monitor QWOT at ${monitorWavelengthNm} nm`;
}

const WRITE_IN = { minWidth: 72, borderLeft: 1, borderColor: 'divider', height: 44 } as const;

export function RunSheetDocument({ sheet }: RunSheetDocumentProps) {
  const lambda = sheet.monitorWavelengthNm;
  const { substrate, job } = sheet;
  const thickness =
    substrate.thicknessMm === substrate.designThicknessMm
      ? `${substrate.thicknessMm} mm`
      : `${substrate.thicknessMm} mm (design: ${substrate.designThicknessMm} mm)`;
  const fields: [string, string][] = [
    ['Customer', sheet.recipe.customer],
    ['Recipe', `${sheet.recipe.name}, version ${sheet.recipe.number} (released)`],
    ['Part', job.part || '—'],
    ['Quantity', job.quantity === null ? '—' : `${job.quantity} pcs`],
    ['Substrate', `${substrate.material}, ${thickness} thick`],
    ['Sides to coat', SIDES_LABELS[job.sides]],
    ['Chamber', sheet.chamber.name],
    ['Monitor', `λ = ${lambda} nm, transmittance through the monitor chip`],
  ];
  return (
    <Box sx={{ display: 'grid', gap: 2 }}>
      <Box
        component="header"
        aria-label="Run sheet header"
        sx={{
          display: 'flex',
          alignItems: 'center',
          gap: 2,
          borderBottom: 1,
          borderColor: 'text.primary',
          pb: 1,
        }}
      >
        {sheet.shop.hasLogo && (
          <Box
            component="img"
            src={apiUrl('/shop-settings/logo')}
            alt={`${sheet.shop.name} logo`}
            sx={{ maxHeight: 48, maxWidth: 160, objectFit: 'contain' }}
          />
        )}
        <Box sx={{ flexGrow: 1 }}>
          <Typography variant="h2" component="p">
            Run sheet
          </Typography>
          <Typography variant="body2" color="text.secondary">
            {sheet.shop.name}
          </Typography>
        </Box>
      </Box>
      <Box
        component="dl"
        aria-label="Job"
        sx={{
          display: 'grid',
          gridTemplateColumns: { xs: 'max-content 1fr', md: 'max-content 1fr max-content 1fr' },
          columnGap: 2,
          rowGap: 0.5,
          m: 0,
          '& dt': { fontWeight: 600, color: 'text.secondary' },
          '& dd': { m: 0 },
        }}
      >
        {fields.map(([label, value]) => (
          <Box key={label} sx={{ display: 'contents' }}>
            <dt>{label}</dt>
            <dd>{value}</dd>
          </Box>
        ))}
      </Box>
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
        {/* Fourteen columns: tight cell padding keeps them inside a 1440 px screen beside the
            navigation; on a narrower one the table scrolls on its own, never the whole page. */}
        <Box sx={{ overflowX: 'auto', '@media print': { overflowX: 'visible' } }}>
          <Table size="small" aria-label="Run sheet layers" sx={{ '& .MuiTableCell-root': { px: 1 } }}>
            <TableHead>
              <TableRow>
                <TableCell>Step</TableCell>
                <TableCell>Design layer</TableCell>
                <TableCell>Material</TableCell>
                <TableCell align="right">On the part (nm)</TableCell>
                <TableCell align="right">Tooling factor</TableCell>
                <TableCell align="right">Set on the monitor (nm)</TableCell>
                <TableCell align="right">{qwotLabel(lambda)}</TableCell>
                <TableCell align="right">Rate (nm/s)</TableCell>
                <TableCell align="right">Time (s)</TableCell>
                <TableCell>Turning points (monitor nm into the layer)</TableCell>
                <TableCell>Process settings</TableCell>
                <TableCell>Actual end thickness (nm)</TableCell>
                <TableCell>Actual rate (nm/s)</TableCell>
                <TableCell sx={{ minWidth: 120 }}>Remarks</TableCell>
              </TableRow>
            </TableHead>
            <TableBody>
              {sheet.layers.map((l) => (
                <TableRow key={l.step}>
                  <TableCell>{l.step}</TableCell>
                  <TableCell>{l.designLayer}</TableCell>
                  <TableCell>{l.material}</TableCell>
                  <TableCell align="right">{formatFixed(l.partThicknessNm, 2)}</TableCell>
                  <TableCell align="right">{formatToolingFactor(l.toolingFactor)}</TableCell>
                  <TableCell align="right">{formatFixed(l.monitorThicknessNm, 2)}</TableCell>
                  <TableCell align="right">{formatFixed(l.qwotAtMonitor, 3)}</TableCell>
                  <TableCell align="right">{formatFixed(l.rateNmPerS, 2)}</TableCell>
                  <TableCell align="right">{formatFixed(l.timeS, 1)}</TableCell>
                  <TableCell>
                    {l.turningPointsNm.length === 0
                      ? '—'
                      : l.turningPointsNm.map((t) => t.toFixed(1)).join(', ')}
                  </TableCell>
                  <TableCell sx={{ whiteSpace: 'pre-line', fontSize: '0.8em', minWidth: 180 }}>
                    {l.process
                      ? processLines(l.process).join('\n')
                      : 'None kept for this material on this chamber'}
                  </TableCell>
                  <TableCell sx={WRITE_IN} aria-label={`Actual end thickness, step ${l.step}`} />
                  <TableCell sx={WRITE_IN} aria-label={`Actual rate, step ${l.step}`} />
                  <TableCell sx={WRITE_IN} aria-label={`Remarks, step ${l.step}`} />
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
                <TableCell colSpan={5} />
              </TableRow>
            </TableFooter>
          </Table>
        </Box>
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
      <Paper
        variant="outlined"
        sx={{ p: 2, '@media print': { breakInside: 'avoid' } }}
        component="section"
        aria-label="Sign-off"
      >
        <Typography variant="h2" component="h2" gutterBottom>
          Sign-off
        </Typography>
        <Box sx={{ display: 'grid', gridTemplateColumns: { xs: '1fr', md: '1fr 1fr' }, gap: 4 }}>
          {['Run by (operator)', 'Checked by'].map((who) => (
            <Box key={who} role="group" aria-label={who}>
              <Typography variant="subtitle2">{who}</Typography>
              {['Name', 'Signature', 'Date and time'].map((field) => (
                <Box key={field} sx={{ display: 'flex', alignItems: 'flex-end', gap: 1, mt: 2 }}>
                  <Typography variant="body2" color="text.secondary" sx={{ width: 110 }}>
                    {field}
                  </Typography>
                  <Box sx={{ flexGrow: 1, borderBottom: 1, borderColor: 'text.primary', height: 20 }} />
                </Box>
              ))}
            </Box>
          ))}
        </Box>
      </Paper>
    </Box>
  );
}
