import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import type { DesignVersionContent, LimitBand, NamedModel } from '@quietglass/shared';
import { useEffect, useMemo, useState } from 'react';
import { Plot, PLOT_COLOURS, type PlotData, type PlotLayout } from '../../../components/plot';
import { maskPlotLayout } from '../../../components/mask-plot-layout';
import type { PreviewResult } from '../../../lib/preview/compute-preview';
import { usePreviewComputer } from '../../../lib/preview/preview-context';
import {
  DEFAULT_PREVIEW_OPTIONS,
  previewRequestFor,
  type PreviewOptions,
} from '../../../lib/preview/preview-request';

/** Most mask angles drawn on the overlay. */
const MAX_OVERLAY_ANGLES = 3;

/** The wavelengths and angles of the overlay: the mask's span with a margin, at the mask's angles. */
export function overlayOptions(maskBands: readonly LimitBand[] | null): PreviewOptions {
  const bands = (maskBands ?? []).filter((b) => b.quantity === 'R');
  if (bands.length === 0) return DEFAULT_PREVIEW_OPTIONS;
  const from = Math.min(...bands.map((b) => b.from_nm));
  const to = Math.max(...bands.map((b) => b.to_nm));
  const pad = Math.max(20, 0.1 * (to - from));
  const angles = [...new Set(bands.flatMap((b) => b.angles_deg ?? [0]))].sort((a, b) => a - b);
  return {
    ...DEFAULT_PREVIEW_OPTIONS,
    fromNm: Math.max(1, from - pad),
    toNm: to + pad,
    count: 401,
    anglesDeg: angles.slice(0, MAX_OVERLAY_ANGLES),
    polarisation: 'avg',
  };
}

/** Traces and layout: R before (dotted) and after (solid) at each angle, over the mask's forbidden regions. */
export function overlayFigure(
  before: PreviewResult,
  after: PreviewResult,
  maskBands: readonly LimitBand[] | null,
): { data: PlotData[]; layout: PlotLayout } {
  const data: PlotData[] = [];
  let maxAfter = 0;
  const add = (result: PreviewResult, label: string, dash: 'dot' | 'solid') => {
    result.curves.forEach((curve, i) => {
      const y = Array.from(curve.R, (v) => 100 * v);
      if (dash === 'solid') for (const v of y) maxAfter = Math.max(maxAfter, v);
      data.push({
        type: 'scatter',
        mode: 'lines',
        name: `${label} ${curve.angleDeg}°`,
        x: Array.from(result.wavelengthsNm),
        y,
        line: { dash, color: PLOT_COLOURS[i % PLOT_COLOURS.length] },
      });
    });
  };
  add(before, 'Before', 'dot');
  add(after, 'After', 'solid');
  const bands = (maskBands ?? []).filter((b) => b.quantity === 'R');
  const maxBound = Math.max(0, ...bands.map((b) => b.max_percent ?? b.min_percent ?? b.target_percent ?? 0));
  // The result and the mask always fit; a far-off start may run off the top.
  const top = Math.min(100, Math.max(1, maxBound * 4, maxAfter * 1.1));
  return { data, layout: maskPlotLayout(bands, 'R', top) };
}

interface SpectrumOverlayProps {
  /** A name for the computation slots, unique on the page. */
  slot: string;
  before: DesignVersionContent;
  after: DesignVersionContent;
  materials: ReadonlyMap<number, NamedModel>;
  maskBands: LimitBand[] | null;
}

/**
 * Reflectance of the version before and after the optimisation against the spec mask. The summaries
 * hold thicknesses only, so both spectra are computed here with the design preview's engine.
 */
export function SpectrumOverlay({ slot, before, after, materials, maskBands }: SpectrumOverlayProps) {
  const computer = usePreviewComputer();
  const [state, setState] = useState<
    { before: PreviewResult; after: PreviewResult } | { error: string } | null
  >(null);
  const requests = useMemo(() => {
    const options = overlayOptions(maskBands);
    const b = previewRequestFor(`${slot}-before`, before, materials, maskBands, options);
    const a = previewRequestFor(`${slot}-after`, after, materials, maskBands, options);
    if (!b.ok) return { error: b.error };
    if (!a.ok) return { error: a.error };
    return { before: b.request, after: a.request };
  }, [slot, before, after, materials, maskBands]);

  useEffect(() => {
    if ('error' in requests) return;
    let live = true;
    Promise.all([computer.compute(requests.before), computer.compute(requests.after)]).then(
      ([b, a]) => {
        if (live) setState({ before: b, after: a });
      },
      (error: unknown) => {
        if (live) setState({ error: error instanceof Error ? error.message : String(error) });
      },
    );
    return () => {
      live = false;
    };
  }, [computer, requests]);

  const error = 'error' in requests ? requests.error : state && 'error' in state ? state.error : null;
  const figure = useMemo(
    () => (state && 'before' in state ? overlayFigure(state.before, state.after, maskBands) : null),
    [state, maskBands],
  );
  if (error) return <Alert severity="error">The spectra could not be computed: {error}</Alert>;
  if (!figure) return null;
  return (
    <Box>
      <Typography variant="subtitle2" component="h3">
        Reflectance before (dotted) and after (solid), unpolarised, against the spec mask
      </Typography>
      <Plot title="Reflectance before and after" data={figure.data} layout={figure.layout} height={320} />
    </Box>
  );
}
