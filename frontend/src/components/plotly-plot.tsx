import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Plotly, { type Config } from 'plotly.js-dist-min';
import createPlotlyComponent from 'react-plotly.js/factory';
import { useEffect, useRef } from 'react';
import { PLOT_COLOURS, type PlotProps } from './plot';

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
  return (
    <Box role="figure" aria-label={title} sx={{ width: '100%' }}>
      <PlotlyChart
        data={data}
        layout={{
          autosize: true,
          height,
          margin: { l: 56, r: 56, t: 16, b: 48 },
          font: { family: '"IBM Plex Sans", system-ui, sans-serif', size: 12, color: '#152a2f' },
          paper_bgcolor: '#ffffff',
          plot_bgcolor: '#ffffff',
          colorway: [...PLOT_COLOURS],
          legend: { orientation: 'h', y: -0.2 },
          ...layout,
        }}
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
        <Button
          size="small"
          onClick={() => {
            if (graph.current)
              void Plotly.downloadImage(graph.current, { format: 'png', filename: pngFileName });
          }}
        >
          Download PNG
        </Button>
      )}
    </Box>
  );
}
