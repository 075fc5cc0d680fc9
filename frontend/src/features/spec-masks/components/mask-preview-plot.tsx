import type { LimitBand } from '@quietglass/shared';
import { Plot } from '../../../components/plot';
import { forbiddenRegions } from '../../../lib/mask-regions';

/** Axis tops: a little above the highest bound of R, the full 0–100 % for T. */
function topOf(bands: readonly LimitBand[], quantity: 'R' | 'T'): number {
  const bounds = bands
    .filter((b) => b.quantity === quantity)
    .map((b) => (b.max_percent ?? b.min_percent ?? b.target_percent ?? 0) + (b.tolerance_percent ?? 0));
  if (quantity === 'T') return 100;
  return Math.min(100, Math.max(1, ...bounds.map((v) => v * 2)));
}

/** A small plot of a mask's forbidden regions (shaded) over wavelength, R on the left and T on the right. */
export function MaskPreviewPlot({ bands, title }: { bands: readonly LimitBand[]; title: string }) {
  if (bands.length === 0) return null;
  const hasT = bands.some((b) => b.quantity === 'T');
  const hasR = bands.some((b) => b.quantity === 'R');
  const topR = topOf(bands, 'R');
  const from = Math.min(...bands.map((b) => b.from_nm));
  const to = Math.max(...bands.map((b) => b.to_nm));
  const margin = Math.max(10, (to - from) * 0.1);
  const regions = forbiddenRegions(bands, 100);
  return (
    <Plot
      title={title}
      height={220}
      // An invisible trace keeps the axes drawn; the regions themselves are shapes.
      data={[
        {
          type: 'scatter',
          mode: 'lines',
          x: [from - margin, to + margin],
          y: [0, 0],
          showlegend: false,
          hoverinfo: 'skip',
          line: { width: 0 },
        },
      ]}
      layout={{
        margin: { l: 48, r: hasT ? 48 : 16, t: 8, b: 40 },
        xaxis: { title: { text: 'Wavelength (nm)' }, range: [from - margin, to + margin] },
        yaxis: { title: { text: hasR ? 'R (%)' : 'T (%)' }, range: [0, hasR ? topR : 100] },
        ...(hasT && hasR
          ? { yaxis2: { title: { text: 'T (%)' }, overlaying: 'y', side: 'right', range: [0, 100] } }
          : {}),
        shapes: regions.map((r) => ({
          type: 'rect',
          xref: 'x',
          yref: r.quantity === 'T' && hasR ? 'y2' : 'y',
          x0: r.fromNm,
          x1: r.toNm,
          y0: r.lowPercent,
          y1: r.quantity === 'R' ? Math.min(r.highPercent, topR) : r.highPercent,
          fillcolor: r.quantity === 'R' ? 'rgba(179, 53, 59, 0.22)' : 'rgba(47, 102, 144, 0.22)',
          line: {
            width: 1,
            color: r.quantity === 'R' ? 'rgba(179, 53, 59, 0.6)' : 'rgba(47, 102, 144, 0.6)',
          },
          name: r.label,
        })),
      }}
    />
  );
}
