import { formatToolingFactor } from '@quietglass/shared';
import { Plot, type PlotData } from '../../../components/plot';
import type { CalibrationSeriesView } from '../api/get-chamber-calibration';

/**
 * Colour-blind-safe choices (blue / orange pair, after Okabe & Ito's palette, with shape and dash
 * carrying the meaning too): runs are blue dots with their 1σ bars, out-of-control runs an orange
 * cross, the estimate a solid dark line, control limits dashed, the threshold dotted.
 */
const RUN_BLUE = '#0072b2';
const OUT_ORANGE = '#d55e00';
const ESTIMATE_INK = '#222222';
const LIMIT_GREY = '#6b6b6b';

const pct = (v: number) => (v - 1) * 100;

/** Control chart of one chamber × material: each run's correction, the estimate and its limits. */
export function CalibrationChart({
  series,
  chamberName,
  thresholdPercent,
}: {
  series: CalibrationSeriesView;
  chamberName: string;
  thresholdPercent: number;
}) {
  const runs = series.runs.filter((r) => r.correction && r.tracked);
  const x = runs.map((r) => `${r.lotNumber} (${r.runDate})`);
  const out = runs.filter((r) => r.tracked!.outOfControl);
  const limited = runs.filter((r) => r.tracked!.limitLow !== null);
  const xl = limited.map((r) => `${r.lotNumber} (${r.runDate})`);
  // The threshold lines span the runs shown; with none, their ends are gaps (null).
  const span = [x[0] ?? null, x[x.length - 1] ?? null];
  const data: PlotData[] = [
    {
      type: 'scatter',
      mode: 'markers',
      name: 'Runs (±1σ)',
      x,
      y: runs.map((r) => pct(r.correction!.value)),
      error_y: { type: 'data', array: runs.map((r) => r.correction!.sigma * 100), color: RUN_BLUE },
      marker: { color: RUN_BLUE, symbol: 'circle', size: 8 },
    },
    {
      type: 'scatter',
      mode: 'lines',
      name: 'Estimate',
      x,
      y: runs.map((r) => pct(r.tracked!.estimate)),
      line: { color: ESTIMATE_INK, width: 2 },
    },
    {
      type: 'scatter',
      mode: 'lines',
      name: 'Control limits (±3σ of the prediction)',
      x: xl,
      y: limited.map((r) => pct(r.tracked!.limitHigh!)),
      line: { color: LIMIT_GREY, dash: 'dash', width: 1 },
    },
    {
      type: 'scatter',
      mode: 'lines',
      name: 'Lower control limit',
      showlegend: false,
      x: xl,
      y: limited.map((r) => pct(r.tracked!.limitLow!)),
      line: { color: LIMIT_GREY, dash: 'dash', width: 1 },
    },
    {
      type: 'scatter',
      mode: 'markers',
      name: 'Out of control',
      x: out.map((r) => `${r.lotNumber} (${r.runDate})`),
      y: out.map((r) => pct(r.correction!.value)),
      marker: { color: OUT_ORANGE, symbol: 'x', size: 14, line: { width: 2, color: OUT_ORANGE } },
    },
    {
      type: 'scatter',
      mode: 'lines',
      name: `Threshold ±${thresholdPercent} %`,
      x: span,
      y: [thresholdPercent, thresholdPercent],
      line: { color: OUT_ORANGE, dash: 'dot', width: 1 },
    },
    {
      type: 'scatter',
      mode: 'lines',
      name: 'Lower threshold',
      showlegend: false,
      x: span,
      y: [-thresholdPercent, -thresholdPercent],
      line: { color: OUT_ORANGE, dash: 'dot', width: 1 },
    },
  ];
  return (
    <Plot
      title={`Control chart ${chamberName} ${series.materialName}`}
      data={data}
      height={340}
      pngFileName={`calibration-${chamberName}-${series.materialName}`}
      layout={{
        xaxis: { title: { text: 'Diagnosed run' }, type: 'category' },
        yaxis: {
          title: {
            text: `Correction, % (actual ÷ tooling factor ${formatToolingFactor(series.currentToolingFactor)} − 1)`,
          },
          zeroline: true,
        },
        legend: { orientation: 'h', y: -0.3 },
      }}
    />
  );
}
