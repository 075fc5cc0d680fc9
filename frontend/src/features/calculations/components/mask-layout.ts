import type { LimitBand } from '@quietglass/shared';
import type { PlotLayout } from '../../../components/plot';
import { forbiddenRegions } from '../../../lib/mask-regions';

/**
 * Layout of a plot of one quantity (percent) against wavelength from 0 to `topPercent`, with the
 * mask's forbidden regions shaded below the curves (cut at the top of the plot).
 */
export function maskPlotLayout(
  bands: readonly LimitBand[],
  quantity: 'R' | 'T',
  topPercent: number,
): PlotLayout {
  return {
    xaxis: { title: { text: 'Wavelength (nm)' } },
    yaxis: { title: { text: `${quantity} (%)` }, range: [0, topPercent] },
    shapes: forbiddenRegions(
      bands.filter((b) => b.quantity === quantity),
      100,
    ).map((region) => ({
      type: 'rect',
      xref: 'x',
      yref: 'y',
      x0: region.fromNm,
      x1: region.toNm,
      y0: region.lowPercent,
      y1: Math.min(region.highPercent, topPercent),
      fillcolor: 'rgba(179, 53, 59, 0.16)',
      line: { width: 0 },
      layer: 'below',
      name: region.label,
    })),
  };
}
