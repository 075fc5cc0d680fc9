import type { LimitBand } from '../optics/mask.js';

/** A wavelength range and the angles of incidence to plot a design at. */
export interface PlotRange {
  fromNm: number;
  toNm: number;
  anglesDeg: number[];
}

/** What a design without a spec mask is plotted over: the visible range at normal incidence. */
export const DEFAULT_PLOT_RANGE: Readonly<PlotRange> = Object.freeze({
  fromNm: 380,
  toNm: 780,
  anglesDeg: [0],
});

/** The margin each side of the mask's bands: a tenth of their span, at least this, nm. */
export const PLOT_RANGE_MIN_MARGIN_NM = 20;
/** Plot ends are rounded outward to this step, nm, so the axis starts and ends on round values. */
export const PLOT_RANGE_STEP_NM = 10;
/** The shortest wavelength a default range reaches down to, nm (the engine's UV limit for plots). */
export const PLOT_RANGE_FLOOR_NM = 200;
/** Most angles plotted at once. */
export const MAX_PLOT_ANGLES = 6;

/**
 * The range that shows every band of a spec mask with a margin either side (a tenth of the span,
 * at least 20 nm, rounded outward to 10 nm) and the mask's angles (at most six, ascending). A
 * design without bands is plotted over 380–780 nm at 0°. Common practice (no source).
 */
export function plotRangeForMask(bands: readonly LimitBand[] | null | undefined): PlotRange {
  if (!bands || bands.length === 0) return { ...DEFAULT_PLOT_RANGE, anglesDeg: [0] };
  const from = Math.min(...bands.map((b) => b.from_nm));
  const to = Math.max(...bands.map((b) => b.to_nm));
  const margin = Math.max(PLOT_RANGE_MIN_MARGIN_NM, (to - from) / 10);
  const fromNm = Math.max(
    PLOT_RANGE_FLOOR_NM,
    Math.floor((from - margin) / PLOT_RANGE_STEP_NM) * PLOT_RANGE_STEP_NM,
  );
  const toNm = Math.ceil((to + margin) / PLOT_RANGE_STEP_NM) * PLOT_RANGE_STEP_NM;
  const angles = [...new Set(bands.flatMap((b) => b.angles_deg ?? [0]))].sort((a, b) => a - b);
  return {
    fromNm,
    toNm: Math.max(toNm, fromNm + PLOT_RANGE_STEP_NM),
    anglesDeg: angles.slice(0, MAX_PLOT_ANGLES),
  };
}
