import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Plotly, { type Config } from 'plotly.js-dist-min';
import createPlotlyComponent from 'react-plotly.js/factory';
import { useEffect, useMemo, useRef } from 'react';
import { downloadText } from '../lib/download';
import { plotCsv, styleSeries, withAxisDefaults } from '../lib/plot-style';
import { PLOT_COLOURS, type PlotLayout, type PlotProps } from './plot';

const PlotlyChart = createPlotlyComponent(Plotly);

/** The Plotly chart behind components/plot (loaded on first use: plotly.js is large). */
export default function PlotlyPlot({
  title,
  data,
  layout,
  height = 320,
  pngFileName,
  printWidthPx,
}: PlotProps) {
  const graph = useRef<HTMLElement | null>(null);
  useEffect(() => {
    if (printWidthPx === undefined) return;
    let screenWidth: number | null = null;
    const toPaper = () => {
      const div = graph.current;
      if (!div || screenWidth !== null) return;
      screenWidth = div.clientWidth;
      if (screenWidth > printWidthPx) void Plotly.relayout(div, { width: printWidthPx });
      else screenWidth = null;
    };
    const toScreen = () => {
      const div = graph.current;
      if (!div || screenWidth === null) return;
      void Plotly.relayout(div, { width: screenWidth });
      screenWidth = null;
    };
    const print = window.matchMedia('print');
    const onMedia = (event: MediaQueryListEvent) => (event.matches ? toPaper() : toScreen());
    print.addEventListener('change', onMedia);
    window.addEventListener('beforeprint', toPaper);
    window.addEventListener('afterprint', toScreen);
    return () => {
      print.removeEventListener('change', onMedia);
      window.removeEventListener('beforeprint', toPaper);
      window.removeEventListener('afterprint', toScreen);
    };
  }, [printWidthPx]);
  const config: Partial<Config> = {
    displaylogo: false,
    responsive: true,
    toImageButtonOptions: { format: 'png', filename: pngFileName ?? 'quietglass-plot' },
  };
  const styled = useMemo(() => styleSeries(data), [data]);
  const fullLayout = useMemo(
    (): PlotLayout =>
      withAxisDefaults({
        autosize: true,
        height,
        margin: { l: 56, r: 56, t: 36, b: 48 },
        font: { family: '"IBM Plex Sans", system-ui, sans-serif', size: 12, color: '#152a2f' },
        paper_bgcolor: '#ffffff',
        plot_bgcolor: '#ffffff',
        colorway: [...PLOT_COLOURS],
        // Above the plot area, so it never covers the x axis title.
        legend: { orientation: 'h', x: 0, xanchor: 'left', y: 1, yanchor: 'bottom' },
        ...layout,
      }),
    [height, layout],
  );
  return (
    <Box role="figure" aria-label={title} sx={{ width: '100%' }}>
      <PlotlyChart
        data={styled}
        layout={fullLayout}
        config={config}
        useResizeHandler
        style={{ width: '100%', height }}
        onInitialized={(_figure, div) => {
          graph.current = div;
        }}
        onUpdate={(_figure, div) => {
          graph.current = div;
        }}
      />
      {pngFileName && (
        <Box sx={{ display: 'flex', gap: 1 }}>
          <Button
            size="small"
            onClick={() => {
              if (graph.current)
                void Plotly.downloadImage(graph.current, { format: 'png', filename: pngFileName });
            }}
          >
            Download PNG
          </Button>
          <Button
            size="small"
            onClick={() =>
              downloadText(plotCsv(data, fullLayout), `${pngFileName}.csv`, 'text/csv;charset=utf-8')
            }
          >
            Download CSV
          </Button>
        </Box>
      )}
    </Box>
  );
}
