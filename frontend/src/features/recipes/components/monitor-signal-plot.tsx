import type { RunSheetLayer } from '@quietglass/shared';
import { useMemo } from 'react';
import { Plot, PLOT_COLOURS, type PlotData } from '../../../components/plot';
import { monitorPlotData } from '@quietglass/shared';

/**
 * Width of the chart on paper, CSS px: A4 landscape with 10 mm margins leaves 277 mm ≈ 1047 px,
 * less the section's padding and border.
 */
export const MONITOR_PRINT_WIDTH_PX = 960;

interface MonitorSignalPlotProps {
  layers: readonly RunSheetLayer[];
  monitorWavelengthNm: number;
}

/** Expected optical-monitor transmittance against deposited monitor thickness, turning points marked. */
export function MonitorSignalPlot({ layers, monitorWavelengthNm }: MonitorSignalPlotProps) {
  const data = useMemo<PlotData[]>(() => {
    const { traces, turningPoints, layerEnds } = monitorPlotData(layers);
    const materials = [...new Set(traces.map((t) => t.material))];
    return [
      ...traces.map((t): PlotData => ({
        type: 'scatter',
        mode: 'lines',
        name: t.name,
        x: t.x,
        y: t.y,
        line: { color: PLOT_COLOURS[materials.indexOf(t.material) % PLOT_COLOURS.length], width: 2 },
        hovertemplate: `${t.name}<br>%{x:.1f} nm, T %{y:.2f} %<extra></extra>`,
      })),
      {
        type: 'scatter',
        mode: 'markers',
        name: 'Turning points',
        x: turningPoints.x,
        y: turningPoints.y,
        text: turningPoints.text,
        marker: { symbol: 'diamond', size: 9, color: '#3b1d0c' },
        hovertemplate: '%{text}<br>T %{y:.2f} %<extra></extra>',
      },
      {
        type: 'scatter',
        mode: 'markers',
        name: 'Layer ends',
        x: layerEnds.x,
        y: layerEnds.y,
        text: layerEnds.text,
        marker: { symbol: 'line-ns-open', size: 14, color: '#555555' },
        hovertemplate: '%{text}<br>T %{y:.2f} %<extra></extra>',
      },
    ];
  }, [layers]);

  return (
    <Plot
      title="Expected monitor signal"
      data={data}
      height={340}
      pngFileName="monitor-signal"
      printWidthPx={MONITOR_PRINT_WIDTH_PX}
      layout={{
        xaxis: { title: { text: 'Thickness deposited on the monitor (nm)' } },
        yaxis: { title: { text: `Transmittance at ${monitorWavelengthNm} nm (%)` } },
        legend: { orientation: 'h', y: -0.25 },
      }}
    />
  );
}
