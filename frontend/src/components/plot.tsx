import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import type { Data, Layout } from 'plotly.js-dist-min';
import { lazy, Suspense } from 'react';
import { SERIES_COLOURS } from '../lib/plot-style';

/** Series colours, colour-blind safe (see lib/plot-style); series also differ by dash style. */
export const PLOT_COLOURS = SERIES_COLOURS;

/** Heat-map colour scale from pale glass to deep ink through teal and copper. */
export const HEAT_COLOUR_SCALE: [number, string][] = [
  [0, '#f2f6f6'],
  [0.25, '#9cc7c4'],
  [0.5, '#1f6b70'],
  [0.75, '#b8622d'],
  [1, '#3b1d0c'],
];

export type PlotData = Data;
export type PlotLayout = Partial<Layout>;

export interface PlotProps {
  /** Accessible name of the figure. */
  title: string;
  data: PlotData[];
  layout?: PlotLayout;
  height?: number;
  /**
   * When set, "Download PNG" and "Download CSV" save the plot and its named series under this name
   * (the modebar offers the PNG too).
   */
  pngFileName?: string;
  /**
   * Width to draw at while the page prints, CSS px: a chart drawn for a wide screen would otherwise
   * be cut at the paper's right edge. Its size on screen comes back after printing.
   */
  printWidthPx?: number;
}

const PlotlyPlot = lazy(() => import('./plotly-plot'));

/** A Plotly chart in the app's look, named for assistive technology; plotly.js loads on first use. */
export function Plot(props: PlotProps) {
  return (
    <Suspense
      fallback={
        <Box
          role="figure"
          aria-label={props.title}
          aria-busy="true"
          sx={{ height: props.height ?? 320, display: 'grid', placeItems: 'center' }}
        >
          <Typography variant="body2" color="text.secondary">
            Loading the plot…
          </Typography>
        </Box>
      }
    >
      <PlotlyPlot {...props} />
    </Suspense>
  );
}
