import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import type { Data, Layout } from 'plotly.js-dist-min';
import { lazy, Suspense } from 'react';

/** Quietglass plot colours: teal, copper, slate blue, plum, ochre, moss, in that order. */
export const PLOT_COLOURS = ['#1f6b70', '#b8622d', '#2f6690', '#7a4f8c', '#a86a12', '#4f7a3a'] as const;

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
  /** When set, a "Download PNG" button saves the plot under this name (the modebar offers it too). */
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
