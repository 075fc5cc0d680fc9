import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';
import Tooltip from '@mui/material/Tooltip';
import Typography from '@mui/material/Typography';
import { elementAt, type AnalysisQuantity, type LimitBand } from '@quietglass/shared';
import { useState } from 'react';
import { ErrorAlert } from '../../../components/error-alert';
import { maskShapes } from '../../../components/mask-plot-layout';
import { HEAT_COLOUR_SCALE, Plot, type PlotData } from '../../../components/plot';
import { apiUrl } from '../../../lib/api-client';
import { parseNumberList } from '../../../lib/format';
import { roundAxis } from '../../../lib/plot-style';
import { labToXyz, swatchHex } from '../../../lib/srgb';
import type { AnalysisCalculationView } from '../api/get-calculation';
import { useCalculationResult, type ResultPolarisation } from '../api/get-calculation-result';

const QUANTITY_LABELS: Record<AnalysisQuantity, string> = {
  R: 'Reflectance R',
  T: 'Transmittance T',
  A: 'Absorptance A',
};
const POLARISATION_LABELS: Record<ResultPolarisation, string> = { s: 's', p: 'p', avg: 'Average' };

/** Index of the analysed angle nearest to `angle`. */
function nearestIndex(values: readonly number[], angle: number): number {
  const distance = (i: number) => Math.abs(elementAt(values, i, 'the analysed angles') - angle);
  let best = 0;
  for (let i = 1; i < values.length; i++) if (distance(i) < distance(best)) best = i;
  return best;
}

function defaultSlices(angles: readonly number[]): string {
  const picks = [
    ...new Set([angles[0], angles[Math.floor((angles.length - 1) / 2)], angles[angles.length - 1]]),
  ];
  return picks.filter((a) => a !== undefined).join(', ');
}

/** A completed analysis: heat map, line slices, colour and Rv against angle, field profile, exports. */
export function AnalysisResults({
  calculation,
  maskBands = null,
}: {
  calculation: AnalysisCalculationView;
  /** The design's spec mask: its forbidden regions are shaded on the line slices. */
  maskBands?: readonly LimitBand[] | null;
}) {
  const summary = calculation.summary;
  const [quantity, setQuantity] = useState<AnalysisQuantity>('R');
  const [polarisation, setPolarisation] = useState<ResultPolarisation>('avg');
  const [slicesText, setSlicesText] = useState(() => defaultSlices(summary?.anglesDeg ?? [0]));
  const result = useCalculationResult(calculation.id, { quantity, polarisation }, summary !== null);
  if (!summary) return <Alert severity="warning">The calculation completed without a summary.</Alert>;

  const slices = parseNumberList(slicesText);
  const sliceIndices = slices ? [...new Set(slices.map((a) => nearestIndex(summary.anglesDeg, a)))] : [];
  const unit = `${quantity} (%)`;
  const base = `analysis-${calculation.id}-${quantity}-${polarisation}`;

  let heat: PlotData[] = [];
  let lines: PlotData[] = [];
  if (result.data) {
    const { wavelengthsNm, anglesDeg, values } = result.data;
    heat = [
      {
        type: 'heatmap',
        x: wavelengthsNm,
        y: anglesDeg,
        z: values.map((row) => row.map((v) => 100 * v)),
        colorscale: HEAT_COLOUR_SCALE,
        colorbar: { title: { text: unit } },
        hovertemplate: '%{x} nm, %{y}°: %{z:.3f} %<extra></extra>',
      },
    ];
    lines = sliceIndices.map((ia) => ({
      type: 'scatter',
      mode: 'lines',
      name: `${anglesDeg[ia]}°`,
      x: wavelengthsNm,
      y: elementAt(values, ia, 'the values per angle').map((v) => 100 * v),
    }));
  }

  const sliceValues = result.data
    ? sliceIndices.flatMap((ia) =>
        elementAt(result.data.values, ia, 'the values per angle').map((v) => 100 * v),
      )
    : [];
  const sliceTop = (roundAxis(sliceValues, { fromZero: true }).range as [number, number])[1];
  const colour = summary.colour;
  const field = summary.field;

  return (
    <Box sx={{ display: 'grid', gap: 2 }}>
      <Box sx={{ display: 'flex', gap: 1.5, flexWrap: 'wrap', alignItems: 'center' }}>
        <TextField
          select
          size="small"
          label="Quantity"
          value={quantity}
          onChange={(e) => setQuantity(e.target.value as AnalysisQuantity)}
          sx={{ width: 190 }}
        >
          {(Object.keys(QUANTITY_LABELS) as AnalysisQuantity[]).map((q) => (
            <MenuItem key={q} value={q}>
              {QUANTITY_LABELS[q]}
            </MenuItem>
          ))}
        </TextField>
        <TextField
          select
          size="small"
          label="Polarisation"
          value={polarisation}
          onChange={(e) => setPolarisation(e.target.value as ResultPolarisation)}
          sx={{ width: 140 }}
        >
          {(Object.keys(POLARISATION_LABELS) as ResultPolarisation[]).map((p) => (
            <MenuItem key={p} value={p}>
              {POLARISATION_LABELS[p]}
            </MenuItem>
          ))}
        </TextField>
        <Button
          component="a"
          href={apiUrl(`/calculations/${calculation.id}/result.csv`)}
          download
          variant="outlined"
        >
          Download CSV
        </Button>
      </Box>
      {summary.warnings.length > 0 && (
        <Alert severity="warning">
          {summary.warnings.map((w) => (
            <div key={w}>{w}</div>
          ))}
        </Alert>
      )}
      {result.isError && <ErrorAlert error={result.error} title="The result could not be loaded" />}
      {result.data && (
        <>
          <Typography variant="h3" component="h3">
            {QUANTITY_LABELS[quantity]}, {POLARISATION_LABELS[polarisation]} polarisation
          </Typography>
          <Plot
            title="Heat map"
            data={heat}
            layout={{
              xaxis: { title: { text: 'Wavelength (nm)' } },
              yaxis: { title: { text: 'Angle of incidence (°)' } },
            }}
            height={380}
            pngFileName={`${base}-heat-map`}
          />
          <TextField
            size="small"
            label="Slice angles (°)"
            value={slicesText}
            onChange={(e) => setSlicesText(e.target.value)}
            error={slices === null}
            helperText={slices === null ? 'A comma list of angles' : 'Nearest analysed angles are drawn'}
            sx={{ maxWidth: 260 }}
          />
          <Plot
            title="Line slices"
            data={lines}
            layout={{
              xaxis: { title: { text: 'Wavelength (nm)' } },
              yaxis: { title: { text: unit }, ...roundAxis(sliceValues, { fromZero: true }) },
              shapes:
                quantity === 'A'
                  ? []
                  : maskShapes(
                      (maskBands ?? []).filter((b) => b.quantity === quantity),
                      { topR: sliceTop, topT: sliceTop },
                    ),
            }}
            pngFileName={`${base}-slices`}
          />
        </>
      )}
      {colour ? (
        <>
          <Typography variant="h3" component="h3">
            Reflected colour and Rv against angle (unpolarised, D65)
          </Typography>
          <Box
            role="list"
            aria-label="Reflected colour by angle"
            sx={{ display: 'flex', gap: 0.5, flexWrap: 'wrap' }}
          >
            {colour.map((c) => {
              const hex = swatchHex(labToXyz(c.L, c.a, c.b));
              return (
                <Tooltip
                  key={c.angleDeg}
                  title={`${c.angleDeg}°: L* ${c.L.toFixed(1)} a* ${c.a.toFixed(1)} b* ${c.b.toFixed(1)}`}
                >
                  <Box
                    role="listitem"
                    aria-label={`${c.angleDeg}°: Rv ${(100 * c.Rv).toFixed(2)} %, a* ${c.a.toFixed(1)}, b* ${c.b.toFixed(1)}`}
                    sx={{
                      width: 22,
                      height: 22,
                      borderRadius: 0.5,
                      border: 1,
                      borderColor: 'divider',
                      bgcolor: hex,
                    }}
                  />
                </Tooltip>
              );
            })}
          </Box>
          <Plot
            title="Colour and Rv against angle"
            data={[
              {
                type: 'scatter',
                mode: 'lines+markers',
                name: 'Rv (%)',
                x: colour.map((c) => c.angleDeg),
                y: colour.map((c) => 100 * c.Rv),
              },
              {
                type: 'scatter',
                mode: 'lines',
                name: 'a*',
                x: colour.map((c) => c.angleDeg),
                y: colour.map((c) => c.a),
                yaxis: 'y2',
              },
              {
                type: 'scatter',
                mode: 'lines',
                name: 'b*',
                x: colour.map((c) => c.angleDeg),
                y: colour.map((c) => c.b),
                yaxis: 'y2',
              },
            ]}
            layout={{
              xaxis: { title: { text: 'Angle of incidence (°)' } },
              yaxis: {
                title: { text: 'Rv (%)' },
                ...roundAxis(
                  colour.map((c) => 100 * c.Rv),
                  { fromZero: true },
                ),
              },
              // Its own round ticks, without a second grid over the Rv grid.
              yaxis2: {
                title: { text: 'a*, b*' },
                overlaying: 'y',
                side: 'right',
                showgrid: false,
                zeroline: true,
                ...roundAxis(colour.flatMap((c) => [c.a, c.b, 0])),
              },
            }}
            pngFileName={`analysis-${calculation.id}-colour`}
          />
        </>
      ) : (
        <Typography variant="body2" color="text.secondary">
          No colour: the materials do not all cover 380–780 nm.
        </Typography>
      )}
      {field && (
        <>
          <Typography variant="h3" component="h3">
            Field profile at {field.wavelengthNm} nm, {field.angleDeg}°
          </Typography>
          <Plot
            title="Field profile"
            data={[
              { type: 'scatter', mode: 'lines', name: '|E|² s', x: field.depthsNm, y: field.s },
              { type: 'scatter', mode: 'lines', name: '|E|² p', x: field.depthsNm, y: field.p },
            ]}
            layout={{
              xaxis: { title: { text: 'Depth from the first layer’s front (nm)' } },
              yaxis: { title: { text: '|E|² / |E incident|²' }, rangemode: 'tozero' },
              margin: { t: 56 },
              shapes: field.interfacesNm.map((x) => ({
                type: 'line',
                xref: 'x',
                yref: 'paper',
                x0: x,
                x1: x,
                y0: 0,
                y1: 1,
                line: { color: 'rgba(18, 52, 59, 0.35)', width: 1, dash: 'dot' },
              })),
              // Each layer's name over its middle, above the plot area (under the legend).
              annotations: (field.layerLabels ?? []).map((text, i) => ({
                text,
                x:
                  (elementAt(field.interfacesNm, i, 'the interfaces') +
                    elementAt(field.interfacesNm, i + 1, 'the interfaces')) /
                  2,
                xref: 'x',
                y: 1,
                yref: 'paper',
                yanchor: 'bottom',
                showarrow: false,
                textangle: (field.layerLabels?.length ?? 0) > 8 ? -60 : 0,
                font: { size: 10 },
              })),
            }}
            pngFileName={`analysis-${calculation.id}-field-profile`}
          />
        </>
      )}
    </Box>
  );
}
