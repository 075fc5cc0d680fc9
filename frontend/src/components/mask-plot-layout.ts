import type { LimitBand } from '@quietglass/shared';
import type { Shape } from 'plotly.js-dist-min';
import { forbiddenRegions } from '../lib/mask-regions';
import type { PlotLayout } from './plot';

/** Fill of a spec mask's forbidden regions on every spectrum plot. */
const FORBIDDEN_FILL = 'rgba(179, 53, 59, 0.16)';

/**
 * The mask's forbidden regions as shaded rectangles below the curves: R regions on the y axis cut
 * at `topR`, T regions on `tAxis` (the right-hand axis of a plot showing both) cut at `topT`.
 */
export function maskShapes(
  bands: readonly LimitBand[],
  options: { topR: number; topT: number; tAxis?: 'y' | 'y2' },
): Partial<Shape>[] {
  return forbiddenRegions(bands, 100).map((region) => {
    const isR = region.quantity === 'R';
    return {
      type: 'rect',
      xref: 'x',
      yref: isR ? 'y' : (options.tAxis ?? 'y'),
      x0: region.fromNm,
      x1: region.toNm,
      y0: region.lowPercent,
      y1: Math.min(region.highPercent, isR ? options.topR : options.topT),
      fillcolor: FORBIDDEN_FILL,
      line: { width: 0 },
      layer: 'below',
      name: region.label,
    };
  });
}

/**
 * Layout of a plot of one quantity (percent) against wavelength from 0 to `topPercent`, with the
 * mask's forbidden regions for that quantity shaded below the curves (cut at the top of the plot).
 */
export function maskPlotLayout(
  bands: readonly LimitBand[],
  quantity: 'R' | 'T',
  topPercent: number,
): PlotLayout {
  return {
    xaxis: { title: { text: 'Wavelength (nm)' } },
    yaxis: { title: { text: `${quantity} (%)` }, range: [0, topPercent] },
    shapes: maskShapes(
      bands.filter((b) => b.quantity === quantity),
      { topR: topPercent, topT: topPercent },
    ),
  };
}
