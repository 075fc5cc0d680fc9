/*
 * Spec masks: a customer's limits on R or T. A mask is a list of limit bands, each a wavelength
 * range at one or more angles and one polarisation with a bound in percent: a maximum, a minimum,
 * or a target ± tolerance. The JSON form below is also the API form (snake_case, like the stack
 * file), so field paths in errors match what the user wrote.
 */
import {
  arrayValue,
  finiteNumber,
  incidenceAngle,
  numberList,
  oneOf,
  onlyKeys,
  plainObject,
  positiveNumber,
} from './checks.js';
import { OpticsInputError, fieldPath } from './errors.js';
import {
  MAX_RANGE_POINTS,
  POLARISATIONS,
  calculateSpectrum,
  evenWavelengthsNm,
  roundWavelengthNm,
  type Polarisation,
  type SpectralGrid,
  type SpectrumOptions,
  type SpectrumOutput,
  type SpectrumPlan,
} from './batch.js';
import type { OpticalStack } from './stack.js';
import { elementAt } from '../checked.js';

export type MaskQuantity = 'R' | 'T';

/** One limit band of a spec mask. Exactly one of max_percent, min_percent, target_percent. */
export interface LimitBand {
  /** Wavelength range in nm, from_nm ≤ to_nm (equal: a single wavelength). */
  from_nm: number;
  to_nm: number;
  /**
   * Angles of incidence in degrees (default [0]). A band given as a range (angle_from_deg,
   * angle_to_deg, angle_step_deg) gets the range's angles here once validated.
   */
  angles_deg?: number[];
  /** Angle range, degrees: from, from + step, … and to itself (both ends included). */
  angle_from_deg?: number;
  angle_to_deg?: number;
  angle_step_deg?: number;
  /** Polarisation (default `avg`, unpolarised). */
  polarisation?: Polarisation;
  quantity: MaskQuantity;
  /** Upper limit, percent. */
  max_percent?: number;
  /** Lower limit, percent. */
  min_percent?: number;
  /** Target, percent, with `tolerance_percent` (> 0) either side. */
  target_percent?: number;
  tolerance_percent?: number;
  /**
   * Design margin, percentage points ≥ 0: how far inside the customer's limit the design aims
   * (a maximum of 1 % with margin 0.2 is designed to 0.8 %). Compliance is judged against the
   * customer's limit alone; the margin only tightens design-time targets.
   */
  margin_percent?: number;
  /** Weight in the merit value (default 1). */
  weight?: number;
  /** Sampling step in nm inside the band (default: the mask's step_nm, else 1 nm). */
  step_nm?: number;
  label?: string;
}

export interface SpecMask {
  bands: LimitBand[];
  /** Default sampling step in nm for bands without their own (1 nm when omitted). */
  step_nm?: number;
  name?: string;
}

/** Where a band's worst sample lies. */
export interface MaskPoint {
  wavelengthNm: number;
  angleDeg: number;
  polarisation: Polarisation;
  /** The computed value there, percent. */
  valuePercent: number;
}

export interface BandResult {
  band: number;
  label?: string;
  pass: boolean;
  /** Smallest margin over the band's samples, percentage points; ≥ 0 passes, < 0 is the violation. */
  worstMargin: number;
  worstAt: MaskPoint;
  samples: number;
}

export interface MaskResult {
  pass: boolean;
  /** Smallest margin over all bands, percentage points (signed as in BandResult). */
  worstMargin: number;
  /** Band index and point of the overall worst margin. */
  worstBand: number;
  worstAt: MaskPoint;
  /**
   * Weighted RMS deviation in percentage points over all samples: targets count value − target,
   * limits count only their violation. 0 when every limit holds and every target is met exactly.
   */
  merit: number;
  bands: BandResult[];
}

/** The fields a limit band may have, in a natural column order (e.g. for CSV import/export). */
export const LIMIT_BAND_FIELDS = [
  'from_nm',
  'to_nm',
  'angles_deg',
  'angle_from_deg',
  'angle_to_deg',
  'angle_step_deg',
  'polarisation',
  'quantity',
  'max_percent',
  'min_percent',
  'target_percent',
  'tolerance_percent',
  'margin_percent',
  'weight',
  'step_nm',
  'label',
] as const satisfies readonly (keyof LimitBand)[];

interface Bound {
  kind: 'max' | 'min' | 'target';
  value: number;
  tolerance: number;
}

/** Most limit bands of one mask. */
export const MAX_MASK_BANDS = 10_000;
/** Most angles of one limit band. */
export const MAX_BAND_ANGLES = 91;
/** Most wavelength-angle samples of one mask, summed over its bands. */
export const MAX_MASK_SAMPLES = 500_000;

/**
 * Checks a spec mask and returns a normalised copy (defaults filled in). Throws
 * {@link OpticsInputError} naming the field for NaN or missing values, from_nm > to_nm, bounds
 * outside 0–100 %, and for overlapping bands that contradict each other (e.g. R ≤ 1 % and R ≥ 2 %
 * over the same wavelengths, angle and polarisation, or minimum R and T adding to more than 100 %).
 */
export function validateSpecMask(input: unknown): SpecMask {
  const obj = plainObject(input, '');
  onlyKeys(obj, ['bands', 'step_nm', 'name'], '');
  const defaultStep = obj.step_nm === undefined ? 1 : positiveNumber(obj.step_nm, 'step_nm');
  const list = arrayValue(obj.bands, 'bands');
  if (list.length === 0) throw new OpticsInputError('bands', 'must hold at least one limit band');
  if (list.length > MAX_MASK_BANDS)
    throw new OpticsInputError('bands', `holds ${list.length} bands; a mask has at most ${MAX_MASK_BANDS}`);
  const bands = list.map((item, i) => validateBand(item, fieldPath('bands', i), defaultStep));
  let samples = 0;
  for (const band of bands) samples += bandSampleCount(band) * (band.angles_deg?.length ?? 1);
  if (samples > MAX_MASK_SAMPLES) {
    throw new OpticsInputError(
      'bands',
      `sample ${samples} wavelength-angle points; a mask has at most ${MAX_MASK_SAMPLES} (use a coarser step_nm or fewer angles)`,
    );
  }
  checkAllConsistent(bands);
  const out: SpecMask = { bands, step_nm: defaultStep };
  if (obj.name !== undefined) {
    if (typeof obj.name !== 'string') throw new OpticsInputError('name', 'must be text');
    out.name = obj.name;
  }
  return out;
}

function validateBand(item: unknown, field: string, defaultStep: number): LimitBand {
  const obj = plainObject(item, field);
  onlyKeys(obj, LIMIT_BAND_FIELDS, field);
  const at = (key: string) => fieldPath(field, key);
  const from = positiveNumber(obj.from_nm, at('from_nm'));
  const to = positiveNumber(obj.to_nm, at('to_nm'));
  if (from > to) {
    throw new OpticsInputError(at('from_nm'), `must not exceed to_nm (${from} nm > ${to} nm)`);
  }
  const range = bandAngleRange(obj, at);
  const listed =
    obj.angles_deg === undefined ? null : numberList(obj.angles_deg, at('angles_deg'), incidenceAngle);
  const angles = range ? expandAngleRange(range, at('angle_step_deg')) : (listed ?? [0]);
  // A validated range band carries its expansion in angles_deg; anything else is two answers.
  if (range && listed && !sameNumbers([...new Set(listed)], angles)) {
    throw new OpticsInputError(
      at('angles_deg'),
      `give either an angle list or an angle range, not both (the range gives ${angles.join(', ')}°)`,
    );
  }
  if (angles.length === 0) throw new OpticsInputError(at('angles_deg'), 'must list at least one angle');
  if (angles.length > MAX_BAND_ANGLES)
    throw new OpticsInputError(
      at(range ? 'angle_step_deg' : 'angles_deg'),
      `gives ${angles.length} angles; a band has at most ${MAX_BAND_ANGLES}`,
    );
  const polarisation =
    obj.polarisation === undefined ? 'avg' : oneOf(obj.polarisation, POLARISATIONS, at('polarisation'));
  const quantity = oneOf(obj.quantity, ['R', 'T'] as const, at('quantity'));
  const given = (['max_percent', 'min_percent', 'target_percent'] as const).filter(
    (k) => obj[k] !== undefined,
  );
  const [key] = given;
  if (key === undefined || given.length !== 1) {
    throw new OpticsInputError(
      field,
      given.length === 0
        ? 'needs a bound: max_percent, min_percent, or target_percent with tolerance_percent'
        : `give only one bound (got ${given.join(' and ')})`,
    );
  }
  const percent = (key: string) => {
    const v = finiteNumber(obj[key], at(key));
    if (v < 0 || v > 100)
      throw new OpticsInputError(at(key), `must lie between 0 and 100 percent (got ${v})`);
    return v;
  };
  const band: LimitBand = {
    from_nm: from,
    to_nm: to,
    angles_deg: [...new Set(angles)],
    ...(range && { angle_from_deg: range.from, angle_to_deg: range.to, angle_step_deg: range.step }),
    polarisation,
    quantity,
    weight: obj.weight === undefined ? 1 : positiveNumber(obj.weight, at('weight')),
    step_nm: obj.step_nm === undefined ? defaultStep : positiveNumber(obj.step_nm, at('step_nm')),
  };
  band[key] = percent(key);
  if (key === 'target_percent') {
    if (obj.tolerance_percent === undefined) {
      throw new OpticsInputError(at('tolerance_percent'), 'is required with target_percent');
    }
    band.tolerance_percent = positiveNumber(obj.tolerance_percent, at('tolerance_percent'));
  } else if (obj.tolerance_percent !== undefined) {
    throw new OpticsInputError(at('tolerance_percent'), 'applies only to target_percent');
  }
  if (obj.margin_percent !== undefined) {
    band.margin_percent = checkedMargin(band, obj.margin_percent, at('margin_percent'));
  }
  if ((to - from) / (band.step_nm ?? 1) > MAX_RANGE_POINTS) {
    throw new OpticsInputError(at('step_nm'), `gives more than ${MAX_RANGE_POINTS} samples in this band`);
  }
  if (obj.label !== undefined) {
    if (typeof obj.label !== 'string') throw new OpticsInputError(at('label'), 'must be text');
    band.label = obj.label;
  }
  return band;
}

function boundOf(band: LimitBand): Bound {
  if (band.max_percent !== undefined) return { kind: 'max', value: band.max_percent, tolerance: 0 };
  if (band.min_percent !== undefined) return { kind: 'min', value: band.min_percent, tolerance: 0 };
  return { kind: 'target', value: band.target_percent ?? 0, tolerance: band.tolerance_percent ?? 0 };
}

/**
 * The margin of one value against a band's limit, percentage points: how far it is inside the
 * allowed values (≥ 0 passes, < 0 is the violation). A maximum: limit − value; a minimum: value −
 * limit; a target ± tolerance: tolerance − |value − target|. Every margin in the product (design,
 * measured spectrum, report, optimisers' verdicts) is this one rule.
 */
export function bandMargin(band: LimitBand, valuePercent: number): number {
  return marginOf(boundOf(band), valuePercent);
}

/** The values (percent) a band allows, [low, high]. */
export function bandAllowedRange(band: LimitBand): [number, number] {
  return allowed(boundOf(band));
}

/**
 * The design margin of a value against a band, percentage points: {@link bandMargin} less the
 * band's margin_percent, i.e. the margin against the design target (limit tightened by the
 * margin). ≥ 0 means the design has the spare the band asks for. Compliance uses bandMargin.
 */
export function bandDesignMargin(band: LimitBand, valuePercent: number): number {
  return bandMargin(band, valuePercent) - (band.margin_percent ?? 0);
}

/** The values (percent) a band's design target allows: its allowed range shrunk by the margin. */
export function bandDesignRange(band: LimitBand): [number, number] {
  const b = boundOf(band);
  const m = band.margin_percent ?? 0;
  if (b.kind === 'max') return [0, b.value - m];
  if (b.kind === 'min') return [b.value + m, 100];
  return [b.value - b.tolerance + m, b.value + b.tolerance - m];
}

/** A band's angle range as given, or null for a band with an angle list (or no angles). */
function bandAngleRange(
  obj: Record<string, unknown>,
  at: (key: string) => string,
): { from: number; to: number; step: number } | null {
  const keys = ['angle_from_deg', 'angle_to_deg', 'angle_step_deg'] as const;
  const given = keys.filter((k) => obj[k] !== undefined);
  if (given.length === 0) return null;
  if (given.length < keys.length) {
    const missing = keys.filter((k) => obj[k] === undefined);
    throw new OpticsInputError(
      at(elementAt(missing, 0, 'the missing angle keys')),
      `an angle range needs angle_from_deg, angle_to_deg and angle_step_deg (missing ${missing.join(', ')})`,
    );
  }
  const from = incidenceAngle(obj.angle_from_deg, at('angle_from_deg'));
  const to = incidenceAngle(obj.angle_to_deg, at('angle_to_deg'));
  const step = positiveNumber(obj.angle_step_deg, at('angle_step_deg'));
  if (from > to)
    throw new OpticsInputError(at('angle_from_deg'), `must not exceed angle_to_deg (${from}° > ${to}°)`);
  return { from, to, step };
}

/**
 * The angles of an angle range, degrees: from, from + step, … while below to, then to itself, so
 * both ends are always included (0–20° every 5° gives 0, 5, 10, 15, 20; every 6° gives 0, 6, 12,
 * 18, 20). Values are rounded to 1e-6° so 0.1° steps do not drift. Throws when the range gives
 * more than {@link MAX_BAND_ANGLES} angles.
 */
export function expandAngleRange(
  range: { from: number; to: number; step: number },
  field = 'angle_step_deg',
): number[] {
  const { from, to, step } = range;
  if (!(step > 0) || !Number.isFinite(step)) throw new OpticsInputError(field, 'must be greater than 0');
  if ((to - from) / step > MAX_BAND_ANGLES) {
    throw new OpticsInputError(
      field,
      `gives more than ${MAX_BAND_ANGLES} angles from ${from}° to ${to}°; a band has at most ${MAX_BAND_ANGLES}`,
    );
  }
  const out: number[] = [];
  for (let i = 0; ; i++) {
    const a = Math.round((from + i * step) * 1e6) / 1e6;
    if (a >= to - 1e-9) break;
    out.push(a);
  }
  out.push(to);
  return out;
}

function sameNumbers(a: readonly number[], b: readonly number[]): boolean {
  return a.length === b.length && a.every((x, i) => Math.abs(x - elementAt(b, i, 'the numbers')) < 1e-9);
}

/** A band's margin: ≥ 0 and leaving a design target inside 0–100 % (and a tolerance > 0). */
function checkedMargin(band: LimitBand, value: unknown, field: string): number {
  const m = finiteNumber(value, field);
  if (m < 0) throw new OpticsInputError(field, `must be 0 or more percentage points (got ${m})`);
  const [low, high] = bandDesignRange({ ...band, margin_percent: m });
  if (band.target_percent !== undefined && !(low < high)) {
    throw new OpticsInputError(
      field,
      `must be less than tolerance_percent (${band.tolerance_percent} %), or no design target is left`,
    );
  }
  if (low > 100 || high < 0) {
    throw new OpticsInputError(
      field,
      `puts the design target outside 0–100 % (${band.quantity} ${low > 100 ? `≥ ${percentText(low)}` : `≤ ${percentText(high)}`} %)`,
    );
  }
  return m;
}

/** A limit worked out from the mask (e.g. 0.5 − 0.6) as a person would write it: −0.1, not −0.09999999999999998. */
function percentText(x: number): string {
  return String(Math.round(x * 1e6) / 1e6);
}

function marginOf(bound: Bound, value: number): number {
  if (bound.kind === 'max') return bound.value - value;
  if (bound.kind === 'min') return value - bound.value;
  return bound.tolerance - Math.abs(value - bound.value);
}

/** Interval of values (percent) a band allows. */
function allowed(bound: Bound): [number, number] {
  if (bound.kind === 'max') return [0, bound.value];
  if (bound.kind === 'min') return [bound.value, 100];
  return [bound.value - bound.tolerance, bound.value + bound.tolerance];
}

function describeBand(band: LimitBand, index: number): string {
  const b = boundOf(band);
  const rule =
    b.kind === 'max'
      ? `${band.quantity} ≤ ${b.value} %`
      : b.kind === 'min'
        ? `${band.quantity} ≥ ${b.value} %`
        : `${band.quantity} = ${b.value} ± ${b.tolerance} %`;
  return `bands[${index}] (${rule})`;
}

/** Samples of a band: from_nm, from_nm + step, … and to_nm itself. */
function bandSampleCount(band: LimitBand): number {
  const step = band.step_nm ?? 1;
  return Math.max(0, Math.ceil((band.to_nm - band.from_nm) / step - 1e-9)) + 1;
}

interface SweepItem {
  band: LimitBand;
  index: number;
  lo: number;
  hi: number;
}

/** Binary heap of sweep items, best first by `better`. */
class ItemHeap {
  private readonly items: SweepItem[] = [];
  constructor(private readonly better: (a: SweepItem, b: SweepItem) => boolean) {}

  /** The best item whose band still reaches `fromNm` (bands that end before it are dropped for good). */
  top(fromNm: number): SweepItem | undefined {
    for (let first = this.items[0]; first && first.band.to_nm < fromNm; first = this.items[0]) this.pop();
    return this.items[0];
  }

  push(item: SweepItem): void {
    const a = this.items;
    a.push(item);
    // Sift up: `item` rises past every parent it beats (indices stay inside the heap).
    let i = a.length - 1;
    while (i > 0) {
      const parent = (i - 1) >> 1;
      const above = elementAt(a, parent, 'the heap');
      if (!this.better(item, above)) break;
      a[i] = above;
      i = parent;
    }
    a[i] = item;
  }

  private pop(): void {
    const a = this.items;
    const last = a.pop();
    if (last === undefined || a.length === 0) return;
    // Sift down: the last item sinks below every child that beats it.
    let i = 0;
    for (;;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let best = last;
      let at = i;
      const left = a[l];
      const right = a[r];
      if (left && this.better(left, best)) [best, at] = [left, l];
      if (right && this.better(right, best)) [best, at] = [right, r];
      if (at === i) break;
      a[i] = best;
      i = at;
    }
    a[i] = last;
  }
}

/**
 * Finds overlapping bands that contradict each other in O(n log n): per polarisation and angle, a
 * sweep over the bands in order of from_nm keeps, for R and for T, the bands still open (reaching
 * the current from_nm) in heaps by their lowest and highest allowed value. Two overlapping bands
 * of one quantity contradict when one's lowest allowed value exceeds the other's highest; an R and
 * a T band when their lowest allowed values add to more than 100 %.
 */
function checkAllConsistent(bands: LimitBand[]): void {
  const groups = new Map<string, SweepItem[]>();
  bands.forEach((band, index) => {
    const [lo, hi] = allowed(boundOf(band));
    for (const angle of band.angles_deg ?? [0]) {
      const key = `${band.polarisation}|${angle}`;
      let group = groups.get(key);
      if (!group) groups.set(key, (group = []));
      group.push({ band, index, lo, hi });
    }
  });
  for (const [key, items] of groups) {
    const angle = Number(key.slice(key.indexOf('|') + 1));
    items.sort((a, b) => a.band.from_nm - b.band.from_nm || a.index - b.index);
    const heaps = {
      R: { maxLo: new ItemHeap((a, b) => a.lo > b.lo), minHi: new ItemHeap((a, b) => a.hi < b.hi) },
      T: { maxLo: new ItemHeap((a, b) => a.lo > b.lo), minHi: new ItemHeap((a, b) => a.hi < b.hi) },
    };
    for (const item of items) {
      const from = item.band.from_nm;
      const same = heaps[item.band.quantity];
      const other = heaps[item.band.quantity === 'R' ? 'T' : 'R'];
      const highLo = same.maxLo.top(from);
      if (highLo && highLo.lo > item.hi) contradiction(highLo, item, angle, false);
      const lowHi = same.minHi.top(from);
      if (lowHi && lowHi.hi < item.lo) contradiction(lowHi, item, angle, false);
      const otherLo = other.maxLo.top(from);
      if (otherLo && otherLo.lo + item.lo > 100) contradiction(otherLo, item, angle, true);
      same.maxLo.push(item);
      same.minHi.push(item);
    }
  }
}

function contradiction(x: SweepItem, y: SweepItem, angle: number, sum: boolean): never {
  const [first, second] = x.index < y.index ? [x, y] : [y, x];
  const a = first.band;
  const b = second.band;
  const where = `over ${Math.max(a.from_nm, b.from_nm)}–${Math.min(a.to_nm, b.to_nm)} nm at ${angle}°, ${a.polarisation}`;
  throw new OpticsInputError(
    fieldPath('bands', second.index),
    `${describeBand(b, second.index)} contradicts ${describeBand(a, first.index)} ${where}: ${
      sum ? 'R + T cannot exceed 100 %' : 'no value meets both'
    }`,
  );
}

/** Sample wavelengths of a band: from_nm, from_nm + step, …, and to_nm itself. */
export function bandWavelengthsNm(band: LimitBand): number[] {
  return evenWavelengthsNm(band.from_nm, band.to_nm, band.step_nm ?? 1, ['from_nm', 'to_nm', 'step_nm']);
}

/**
 * The grid that evaluating `mask` needs: every band's sample wavelengths, angles and polarisations
 * (sorted, without repeats). Compute a spectrum on it (in any thread) and pass that to
 * {@link evaluateMaskOnSpectrum}.
 */
export function maskGrid(mask: SpecMask): SpectralGrid {
  const checked = validateSpecMask(mask);
  const wavelengths = new Set<number>();
  const angles = new Set<number>();
  const pols = new Set<Polarisation>();
  for (const band of checked.bands) {
    for (const wl of bandWavelengthsNm(band)) wavelengths.add(wl);
    for (const a of band.angles_deg ?? [0]) angles.add(a);
    pols.add(band.polarisation ?? 'avg');
  }
  return {
    wavelengthsNm: [...wavelengths].sort((x, y) => x - y),
    anglesDeg: [...angles].sort((x, y) => x - y),
    polarisations: POLARISATIONS.filter((p) => pols.has(p)),
  };
}

/**
 * Evaluates a mask against a spectrum already computed on a grid that contains every band's
 * samples (e.g. {@link maskGrid}). Margins are in percentage points: bound − value for a maximum,
 * value − bound for a minimum, tolerance − |value − target| for a target.
 */
export function evaluateMaskOnSpectrum(
  mask: SpecMask,
  plan: SpectrumPlan,
  spectrum: SpectrumOutput,
): MaskResult {
  const checked = validateSpecMask(mask);
  const wlIndex = new Map<number, number>();
  plan.wavelengthsNm.forEach((wl, i) => wlIndex.set(roundWavelengthNm(wl), i));
  const angleIndex = new Map<number, number>();
  plan.anglesDeg.forEach((a, i) => angleIndex.set(a, i));
  const polIndex = new Map<Polarisation, number>();
  plan.polarisations.forEach((p, i) => polIndex.set(p, i));
  const nW = plan.wavelengthsNm.length;
  const nA = plan.anglesDeg.length;

  let weightedSquares = 0;
  let weightSum = 0;
  const bands: BandResult[] = checked.bands.map((band, b) => {
    const bound = boundOf(band);
    const pol = band.polarisation ?? 'avg';
    const ip = polIndex.get(pol);
    if (ip === undefined)
      throw new OpticsInputError(
        fieldPath(fieldPath('bands', b), 'polarisation'),
        `"${pol}" was not computed`,
      );
    const values = band.quantity === 'R' ? spectrum.R : spectrum.T;
    const weight = band.weight ?? 1;
    let worstMargin = Infinity;
    let worstAt: MaskPoint = { wavelengthNm: NaN, angleDeg: NaN, polarisation: pol, valuePercent: NaN };
    let samples = 0;
    for (const angle of band.angles_deg ?? [0]) {
      const ia = angleIndex.get(angle);
      if (ia === undefined) {
        throw new OpticsInputError(
          fieldPath(fieldPath('bands', b), 'angles_deg'),
          `${angle}° was not computed`,
        );
      }
      for (const wl of bandWavelengthsNm(band)) {
        const iw = wlIndex.get(wl);
        if (iw === undefined) {
          throw new OpticsInputError(
            fieldPath('bands', b),
            `${wl} nm was not computed (use maskGrid for the grid)`,
          );
        }
        const value = 100 * elementAt(values, (ip * nA + ia) * nW + iw, 'the computed spectrum');
        const margin = marginOf(bound, value);
        // The merit's deviation: how far outside a one-sided limit, or off a target's centre.
        const deviation = bound.kind === 'target' ? value - bound.value : Math.max(0, -margin);
        weightedSquares += weight * deviation * deviation;
        weightSum += weight;
        samples++;
        if (margin < worstMargin || Number.isNaN(margin)) {
          worstMargin = margin;
          worstAt = { wavelengthNm: wl, angleDeg: angle, polarisation: pol, valuePercent: value };
        }
      }
    }
    const result: BandResult = { band: b, pass: worstMargin >= 0, worstMargin, worstAt, samples };
    if (band.label !== undefined) result.label = band.label;
    return result;
  });

  let worstBand = 0;
  let worst = elementAt(bands, 0, 'the band results');
  bands.forEach((band, b) => {
    if (band.worstMargin < worst.worstMargin) [worst, worstBand] = [band, b];
  });
  return {
    pass: bands.every((b) => b.pass),
    worstMargin: worst.worstMargin,
    worstBand,
    worstAt: worst.worstAt,
    merit: Math.sqrt(weightedSquares / weightSum),
    bands,
  };
}

/** Computes the spectrum a mask needs and evaluates it: pass/fail, worst margin and merit. */
export function evaluateMask(
  mask: SpecMask,
  stack: OpticalStack,
  options: Omit<SpectrumOptions, 'amplitudes'> = {},
): MaskResult {
  const spectrum = calculateSpectrum(stack, maskGrid(mask), options);
  return evaluateMaskOnSpectrum(mask, spectrum.plan, spectrum);
}
