import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import MenuItem from '@mui/material/MenuItem';
import Paper from '@mui/material/Paper';
import Stack from '@mui/material/Stack';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { IDENTIFIABLE_MAX_FACTOR_SIGMA, elementAt, formatToolingFactor } from '@quietglass/shared';
import { ErrorAlert } from '../../../components/error-alert';
import { LoadingBlock } from '../../../components/loading-block';
import { formatDateTime } from '../../../lib/format';
import {
  useChamberCalibration,
  type CalibrationSeriesView,
  type CalibrationSuggestionView,
} from '../api/get-chamber-calibration';
import { CalibrationChart } from './calibration-chart';
import { DecisionDialog } from './decision-dialog';

const signedPercent = (v: number, d = 2) => `${v >= 0 ? '+' : '−'}${Math.abs(v).toFixed(d)} %`;

/**
 * Chamber calibration on the Chambers page: per material, what the diagnosed runs say the tooling
 * factor really is, a control chart, and the suggestions an engineer accepts or rejects.
 */
export function CalibrationPanel({
  chambers,
  canDecide,
}: {
  chambers: { id: number; name: string }[];
  canDecide: boolean;
}) {
  const [chamberId, setChamberId] = useState<number | null>(chambers[0]?.id ?? null);
  const [materialId, setMaterialId] = useState<number | null>(null);
  const [deciding, setDeciding] = useState<{
    s: CalibrationSuggestionView;
    decision: 'accepted' | 'rejected';
  } | null>(null);
  const calibration = useChamberCalibration(chamberId);
  const chamber = chambers.find((c) => c.id === chamberId);
  const view = calibration.data;
  const withData = view?.series.filter((s) => s.runs.length > 0) ?? [];
  const suggested = view?.suggestions.find((s) => s.kind === 'material')?.materialIds[0];
  const shown =
    withData.find((s) => s.materialId === materialId) ??
    withData.find((s) => s.materialId === suggested) ??
    withData.find((s) => s.estimate) ??
    null;
  const names = new Map(view?.series.map((s) => [s.materialId, s.materialName]));

  return (
    <Paper variant="outlined" sx={{ p: 2, mt: 3 }} component="section" aria-label="Chamber calibration">
      <Typography variant="h2" component="h2" gutterBottom>
        Calibration from the run history
      </Typography>
      <Typography variant="body2" color="text.secondary" sx={{ mb: 2 }}>
        Each diagnosed run gives, per material, the tooling factor the chamber really had (fitted thickness on
        the part ÷ on the monitor). A robust Kalman filter follows it from run to run; a suggestion appears
        when the estimate leaves the shop’s threshold.
      </Typography>
      {chambers.length > 1 && (
        <TextField
          select
          label="Chamber"
          size="small"
          value={chamberId ?? ''}
          onChange={(e) => {
            setChamberId(Number(e.target.value));
            setMaterialId(null);
          }}
          sx={{ minWidth: 240, mb: 2 }}
        >
          {chambers.map((c) => (
            <MenuItem key={c.id} value={c.id}>
              {c.name}
            </MenuItem>
          ))}
        </TextField>
      )}
      {calibration.isPending && chamberId !== null && <LoadingBlock label="Loading the calibration" />}
      {calibration.isError && (
        <ErrorAlert error={calibration.error} title="The calibration could not be loaded" />
      )}
      {view && chamber && (
        <Stack spacing={2}>
          {view.suggestions.length === 0 && (
            <Alert severity="info">
              No suggested correction pending. Suggestions already decided stay hidden until a new run is
              diagnosed.
            </Alert>
          )}
          {view.suggestions.map((s) => (
            <Alert
              key={s.key}
              severity={s.kind === 'common' ? 'info' : 'warning'}
              role="region"
              aria-label={
                s.kind === 'common'
                  ? 'Suggested check'
                  : `Suggested tooling factor ${names.get(elementAt(s.materialIds, 0, 'the suggested materials'))}`
              }
              action={
                canDecide && (
                  <Stack direction="row" spacing={1}>
                    <Button
                      color="inherit"
                      size="small"
                      onClick={() => setDeciding({ s, decision: 'accepted' })}
                    >
                      {s.kind === 'common' ? 'Acknowledge' : 'Accept'}
                    </Button>
                    <Button
                      color="inherit"
                      size="small"
                      onClick={() => setDeciding({ s, decision: 'rejected' })}
                    >
                      Reject
                    </Button>
                  </Stack>
                )
              }
            >
              {s.message}
              {s.kind === 'material' && (
                <Typography variant="body2">
                  Accepting changes run sheets made from now on; printed sheets keep theirs.
                </Typography>
              )}
            </Alert>
          ))}
          {!canDecide && view.suggestions.length > 0 && (
            <Typography variant="body2" color="text.secondary">
              Engineers and administrators accept or reject suggestions.
            </Typography>
          )}
          <SummaryTable series={view.series} thresholdPercent={view.settings.thresholdPercent} />
          {withData.length > 0 && shown ? (
            <Box>
              <TextField
                select
                label="Material"
                size="small"
                value={shown.materialId}
                onChange={(e) => setMaterialId(Number(e.target.value))}
                sx={{ minWidth: 200, mb: 1 }}
              >
                {withData.map((s) => (
                  <MenuItem key={s.materialId} value={s.materialId}>
                    {s.materialName}
                  </MenuItem>
                ))}
              </TextField>
              <CalibrationChart
                series={shown}
                chamberName={chamber.name}
                thresholdPercent={view.settings.thresholdPercent}
              />
              <RunHistoryTable series={shown} />
            </Box>
          ) : (
            <Typography variant="body2">No diagnosed runs on this chamber yet.</Typography>
          )}
          {view.decisions.length > 0 && (
            <Table size="small" aria-label="Calibration decisions">
              <TableHead>
                <TableRow>
                  <TableCell>When</TableCell>
                  <TableCell>Who</TableCell>
                  <TableCell>Decision</TableCell>
                  <TableCell>Materials</TableCell>
                  <TableCell>Tooling factor</TableCell>
                  <TableCell>Comment</TableCell>
                </TableRow>
              </TableHead>
              <TableBody>
                {view.decisions.map((d) => (
                  <TableRow key={d.id}>
                    <TableCell>{formatDateTime(d.decidedAt)}</TableCell>
                    <TableCell>{d.decidedBy}</TableCell>
                    <TableCell>{d.decision}</TableCell>
                    <TableCell>{d.materialIds.map((id) => names.get(id) ?? id).join(', ')}</TableCell>
                    <TableCell>
                      {d.newToolingFactor !== null
                        ? `${d.previousToolingFactor} → ${d.newToolingFactor}`
                        : (d.previousToolingFactor ?? '—')}
                    </TableCell>
                    <TableCell>{d.comment}</TableCell>
                  </TableRow>
                ))}
              </TableBody>
            </Table>
          )}
        </Stack>
      )}
      {deciding && chamberId !== null && (
        <DecisionDialog
          chamberId={chamberId}
          suggestion={deciding.s}
          decision={deciding.decision}
          onClose={() => setDeciding(null)}
        />
      )}
    </Paper>
  );
}

function SummaryTable({
  series,
  thresholdPercent,
}: {
  series: CalibrationSeriesView[];
  thresholdPercent: number;
}) {
  const rows = series.filter((s) => s.runs.length > 0);
  if (rows.length === 0) return null;
  return (
    <Table size="small" aria-label="Calibration estimates">
      <TableHead>
        <TableRow>
          <TableCell>Material</TableCell>
          <TableCell align="right">Tooling factor</TableCell>
          <TableCell align="right">Correction (±1σ)</TableCell>
          <TableCell align="right">Drift per run</TableCell>
          <TableCell align="right">Runs</TableCell>
          <TableCell align="right">Layers left out</TableCell>
          <TableCell align="right">Rate entered ÷ set</TableCell>
        </TableRow>
      </TableHead>
      <TableBody>
        {rows.map((s) => {
          const left = s.runs.reduce((n, r) => n + r.layers.filter((l) => !l.identified).length, 0);
          const c = s.estimate?.correction;
          const off = c && Math.abs(c.value - 1) * 100 >= thresholdPercent;
          return (
            <TableRow key={s.materialId}>
              <TableCell>{s.materialName}</TableCell>
              <TableCell align="right">{formatToolingFactor(s.currentToolingFactor)}</TableCell>
              <TableCell align="right" sx={off ? { fontWeight: 700 } : undefined}>
                {c
                  ? `${signedPercent((c.value - 1) * 100)} ± ${(c.sigma * 100).toFixed(2)} %`
                  : 'not identified'}
              </TableCell>
              <TableCell align="right">
                {s.estimate
                  ? `${signedPercent(s.estimate.driftPercentPerRun.value, 3)} ± ${s.estimate.driftPercentPerRun.sigma.toFixed(3)} %`
                  : '—'}
              </TableCell>
              <TableCell align="right">{s.estimate?.runs ?? 0}</TableCell>
              <TableCell
                align="right"
                title="Too thin, too weakly constrained by the spectrum, or trading thickness with such a layer"
              >
                {left}
              </TableCell>
              <TableCell align="right">{s.rate ? s.rate.ratio.value.toFixed(3) : '—'}</TableCell>
            </TableRow>
          );
        })}
      </TableBody>
    </Table>
  );
}

/** What one diagnosed layer contributed: its factor with σ, or why it was left out. */
function layerStatus(l: CalibrationSeriesView['runs'][number]['layers'][number]): string {
  const sigma = l.factorSigma === null ? '' : ` ± ${(l.factorSigma * 100).toFixed(2)} %`;
  const value = `${signedPercent((l.factor - 1) * 100)}${sigma}`;
  if (l.identified) return `layer ${l.layer}: ${value}`;
  if (l.correlatedWith && l.fitFactorSigma !== null && l.fitFactorSigma <= IDENTIFIABLE_MAX_FACTOR_SIGMA)
    return `layer ${l.layer}: ${value}, correlated with layer ${l.correlatedWith.layer} (ρ ${l.correlatedWith.correlation.toFixed(2)}), not used`;
  return `layer ${l.layer}: ${value}, not identified, not used`;
}

function RunHistoryTable({ series }: { series: CalibrationSeriesView }) {
  return (
    <Table size="small" aria-label={`Run history ${series.materialName}`} sx={{ mt: 1 }}>
      <TableHead>
        <TableRow>
          <TableCell>Run</TableCell>
          <TableCell align="right">Tooling factor used</TableCell>
          <TableCell align="right">Correction (±1σ)</TableCell>
          <TableCell>Layers (fitted ÷ design)</TableCell>
        </TableRow>
      </TableHead>
      <TableBody>
        {series.runs.map((r) => (
          <TableRow key={r.runId}>
            <TableCell>{`${r.lotNumber} (${r.runDate})`}</TableCell>
            <TableCell align="right">{formatToolingFactor(r.toolingFactorInEffect)}</TableCell>
            <TableCell align="right">
              {r.correction
                ? `${signedPercent((r.correction.value - 1) * 100)} ± ${(r.correction.sigma * 100).toFixed(2)} %`
                : 'no identified layer'}
            </TableCell>
            <TableCell>{r.layers.map(layerStatus).join('; ')}</TableCell>
          </TableRow>
        ))}
      </TableBody>
    </Table>
  );
}
