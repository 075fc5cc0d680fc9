import { elementAt } from '../checked.js';

/** Round axis ticks: the axis ends, the step between ticks and the tick values. */
export interface NiceTicks {
  /** First tick (≤ the data minimum). */
  min: number;
  /** Last tick (≥ the data maximum). */
  max: number;
  step: number;
  ticks: number[];
  /** Decimals that print every tick exactly. */
  decimals: number;
}

/**
 * A "nice" number near x: 1, 2 or 5 times a power of ten (P. S. Heckbert, "Nice numbers for graph
 * labels", Graphics Gems, 1990). Rounded to the nearest when round is true, else the next above.
 */
export function niceNumber(x: number, round: boolean): number {
  const exponent = Math.floor(Math.log10(x));
  const fraction = x / 10 ** exponent;
  let nice: number;
  if (round) nice = fraction < 1.5 ? 1 : fraction < 3 ? 2 : fraction < 7 ? 5 : 10;
  else nice = fraction <= 1 ? 1 : fraction <= 2 ? 2 : fraction <= 5 ? 5 : 10;
  return nice * 10 ** exponent;
}

/**
 * Loose labelling of the range [lo, hi] with about `count` ticks (Heckbert, Graphics Gems, 1990):
 * the step is a nice number, the axis ends are multiples of the step at or beyond lo and hi.
 * A range of zero width is widened by one unit either side.
 */
export function niceTicks(lo: number, hi: number, count = 5): NiceTicks {
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) throw new Error('niceTicks: the range must be finite');
  if (!Number.isInteger(count) || count < 2) throw new Error('niceTicks: count must be an integer ≥ 2');
  if (hi < lo) [lo, hi] = [hi, lo];
  if (hi === lo) {
    lo -= 1;
    hi += 1;
  }
  const step = niceNumber(niceNumber(hi - lo, false) / (count - 1), true);
  const decimals = Math.max(0, -Math.floor(Math.log10(step)));
  const first = Math.floor(lo / step);
  const last = Math.ceil(hi / step);
  const ticks: number[] = [];
  // Multiplying integers by the step and rounding to the printed decimals keeps 0.1 + 0.2 noise out.
  for (let i = first; i <= last; i++) ticks.push(Number((i * step).toFixed(decimals)));
  // first ≤ last, so the loop pushed at least one tick.
  const min = elementAt(ticks, 0, 'the ticks');
  return { min, max: elementAt(ticks, ticks.length - 1, 'the ticks'), step, ticks, decimals };
}
