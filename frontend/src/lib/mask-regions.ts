import { bandAllowedRange, type LimitBand } from '@quietglass/shared';

/** A forbidden rectangle of a spec mask on a plot of R or T (percent) against wavelength (nm). */
export interface ForbiddenRegion {
  quantity: 'R' | 'T';
  fromNm: number;
  toNm: number;
  /** Percent. */
  lowPercent: number;
  highPercent: number;
  /** What the band says, e.g. "R ≤ 0.5 % (0, 15, 30°, avg)". */
  label: string;
}

/** A band that names a single wavelength is drawn this wide, nm, so it can be seen. */
const SINGLE_WAVELENGTH_WIDTH_NM = 1;

export function describeBand(band: LimitBand): string {
  const angles =
    band.angle_step_deg !== undefined
      ? `${band.angle_from_deg}–${band.angle_to_deg} every ${band.angle_step_deg}`
      : (band.angles_deg ?? [0]).join(', ');
  const where = `${band.from_nm}–${band.to_nm} nm, ${angles}°, ${band.polarisation ?? 'avg'}`;
  const q = band.quantity;
  let bound = '';
  if (band.max_percent !== undefined) bound = `${q} ≤ ${band.max_percent} %`;
  else if (band.min_percent !== undefined) bound = `${q} ≥ ${band.min_percent} %`;
  else if (band.target_percent !== undefined)
    bound = `${q} = ${band.target_percent} ± ${band.tolerance_percent ?? 0} %`;
  // The margin is the shop's design aim, never part of the customer's limit.
  const margin = band.margin_percent ? `; design margin ${band.margin_percent} % points` : '';
  return `${band.label ? `${band.label}: ` : ''}${bound} (${where})${margin}`;
}

/**
 * The regions a spectrum must stay out of: above a maximum, below a minimum, outside a target's
 * tolerance. `topPercent` is the top of the plot (the regions reach it).
 */
export function forbiddenRegions(bands: readonly LimitBand[], topPercent = 100): ForbiddenRegion[] {
  const regions: ForbiddenRegion[] = [];
  for (const band of bands) {
    let fromNm = band.from_nm;
    let toNm = band.to_nm;
    if (toNm - fromNm < SINGLE_WAVELENGTH_WIDTH_NM) {
      fromNm -= SINGLE_WAVELENGTH_WIDTH_NM / 2;
      toNm += SINGLE_WAVELENGTH_WIDTH_NM / 2;
    }
    const label = describeBand(band);
    const region = (lowPercent: number, highPercent: number) => {
      if (highPercent > lowPercent)
        regions.push({ quantity: band.quantity, fromNm, toNm, lowPercent, highPercent, label });
    };
    // Forbidden: below and above what the band allows (the engine's rule), up to the plot's top.
    const [low, high] = bandAllowedRange(band);
    region(0, low);
    region(high, topPercent);
  }
  return regions;
}
