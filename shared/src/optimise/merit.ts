/*
 * The merit the optimisers minimise: a residual vector over every sample of a spec mask (and of
 * optional target curves), whose RMS is the mask's `merit` (see evaluateMaskOnSpectrum). Limits
 * count only their violation, targets their deviation, each sample weighted by its band's weight:
 *
 *   r_s = √(w_s·N / Σw) · d_s,   RMS(r) = √(Σ w_s d_s² / Σ w_s) = merit   (percentage points),
 *
 * with d_s = max(0, v − max) for a maximum, min(0, v − min) for a minimum and v − target for a
 * target. The squared violation is continuously differentiable, which is what least squares needs.
 *
 * A MaskMerit holds one SpectrumPlan on the mask's grid and all buffers, so evaluating it for new
 * thicknesses (setLayerThicknesses + computeSpectrum) allocates nothing.
 */
import {
  POLARISATIONS,
  computeSpectrum,
  createSpectrumOutput,
  createSpectrumPlan,
  createSpectrumPlanFor,
  roundWavelengthNm,
  setLayerThicknesses,
  type BackSurface,
  type Polarisation,
  type SpectrumOutput,
  type SpectrumPlan,
} from '../optics/batch.js';
import {
  computeThicknessDerivatives,
  createThicknessDerivatives,
  type ThicknessDerivatives,
} from '../optics/derivatives.js';
import {
  arrayValue,
  finiteNumber,
  incidenceAngle,
  numberList,
  oneOf,
  onlyKeys,
  plainObject,
  positiveNumber,
} from '../optics/checks.js';
import { OpticsInputError, fieldPath } from '../optics/errors.js';
import {
  bandWavelengthsNm,
  maskGrid,
  validateSpecMask,
  type MaskQuantity,
  type SpecMask,
} from '../optics/mask.js';
import type { OpticalStack } from '../optics/stack.js';

/** A curve the design should follow, e.g. a measured or wanted reflectance, in percent. */
export interface TargetCurve {
  quantity: MaskQuantity;
  /** Angle of incidence in degrees (default 0). */
  angleDeg?: number;
  /** Polarisation (default `avg`). */
  polarisation?: Polarisation;
  /** Wavelengths in nm, one per value. */
  wavelengthsNm: number[];
  /** Wanted values in percent, 0–100. */
  valuesPercent: number[];
  /** Weight of each sample in the merit, relative to a limit band's weight (default 1). */
  weight?: number;
}

export interface MaskMeritOptions {
  /** Substrate treatment (default `none`). */
  back?: BackSurface;
  /** Target curves added to the mask's samples (weighted RMS over all samples together). */
  targets?: TargetCurve[];
  /**
   * Percentage points by which maximum and minimum limits are tightened in the residuals (not in
   * the margins), so a design refined to zero residual passes with that much to spare. Default 0.
   */
  marginPercent?: number;
  /**
   * Every limit sample counts on both sides of its limit: a maximum aims at 0 %, a minimum at
   * 100 % (targets unchanged), so the residuals are smooth in the thicknesses and the whole band
   * pulls, not only the samples that are over their limit. A synthesis merit: Grow layers grows on
   * it and fits the one-sided merit last. The mask's own merit and margins are unchanged. Default
   * false.
   */
  smooth?: boolean;
}

const KIND_MAX = 0;
const KIND_MIN = 1;
const KIND_TARGET = 2;

/** The samples of a mask (and targets) laid out for allocation-free evaluation. */
interface SampleTable {
  count: number;
  /** Position in the spectrum arrays ({@link spectrumIndex} of the merit's plan). */
  index: Int32Array;
  /** 1 for T, 0 for R. */
  isT: Uint8Array;
  /** Whether any sample is of T (else the Jacobian needs ∂R alone). */
  hasT: boolean;
  kind: Uint8Array;
  /** Bound (max, min) or target, percent. */
  bound: Float64Array;
  /** Target tolerance, percent (0 for limits). */
  tolerance: Float64Array;
  /** Bound as used in the residual (limits tightened by the margin), percent. */
  limit: Float64Array;
  /** √(w·N/Σw). */
  scale: Float64Array;
  /** 1 for mask samples, 0 for target-curve samples (which have no margin). */
  inMask: Uint8Array;
}

interface GridLayout {
  wavelengthsNm: number[];
  anglesDeg: number[];
  /** Polarisations the plan computes. */
  computed: Polarisation[];
  /** For each polarisation a sample may name, the index in `computed` that gives it. */
  polIndex: Map<Polarisation, number>;
}

/**
 * Evaluates a spec mask's residuals, merit and worst margin for a stack whose front-layer
 * thicknesses change. Create with {@link createMaskMerit}; {@link MaskMerit.withStack} gives one
 * for another stack (other layers) on the same samples.
 */
export class MaskMerit {
  /** The plan the spectrum is computed with (its grid covers every sample). */
  readonly plan: SpectrumPlan;
  /** The spectrum of the last evaluation. */
  readonly spectrum: SpectrumOutput;
  /** Number of samples (the length of a residual vector). */
  readonly sampleCount: number;
  /** The validated mask. */
  readonly mask: SpecMask;
  private derivatives: ThicknessDerivatives | null = null;
  /** Spectrum points the last Jacobian needed (scratch of {@link jacobian}). */
  private points: Uint8Array | null = null;
  /** Per sample, whether its residual depended on the spectrum in the last Jacobian (scratch). */
  private active: Uint8Array | null = null;

  private constructor(
    stack: OpticalStack,
    mask: SpecMask,
    private readonly layout: GridLayout,
    private readonly samples: SampleTable,
    private readonly back: BackSurface,
    previous: SpectrumPlan | null,
  ) {
    this.mask = mask;
    // Another stack on the same grid reuses the materials the previous plan checked and evaluated.
    this.plan = previous
      ? createSpectrumPlanFor(stack, previous)
      : createSpectrumPlan(
          stack,
          {
            wavelengthsNm: layout.wavelengthsNm,
            anglesDeg: layout.anglesDeg,
            polarisations: layout.computed,
          },
          { back },
        );
    this.spectrum = createSpectrumOutput(this.plan);
    this.sampleCount = samples.count;
  }

  /** @internal Use {@link createMaskMerit}. */
  static create(stack: OpticalStack, mask: SpecMask, options: MaskMeritOptions): MaskMerit {
    const checked = validateSpecMask(mask);
    const targets = validateTargets(options.targets);
    const margin =
      options.marginPercent === undefined ? 0 : nonNegative(options.marginPercent, 'marginPercent');
    if (options.smooth !== undefined && typeof options.smooth !== 'boolean') {
      throw new OpticsInputError('smooth', 'must be true or false');
    }
    const layout = gridLayout(checked, targets);
    const samples = sampleTable(checked, targets, layout, margin, options.smooth === true);
    return new MaskMerit(stack, checked, layout, samples, options.back ?? 'none', null);
  }

  /** The same samples and margin for another stack (e.g. with a layer inserted). */
  withStack(stack: OpticalStack): MaskMerit {
    return new MaskMerit(stack, this.mask, this.layout, this.samples, this.back, this.plan);
  }

  /** Number of front layers of the plan's stack. */
  get layerCount(): number {
    return this.plan.work.layerCount;
  }

  /**
   * Sets the front-layer thicknesses (nm, each ≥ 0) and computes the spectrum into
   * {@link spectrum}. Allocates nothing.
   */
  compute(thicknessesNm: ArrayLike<number>): SpectrumOutput {
    setLayerThicknesses(this.plan, thicknessesNm);
    return computeSpectrum(this.spectrum, this.plan);
  }

  /**
   * Residuals of the current {@link spectrum} (or of `spectrum`, computed on this plan) into `out`
   * (length ≥ sampleCount), in the order of the samples; returns Σ r² (sampleCount·RMS²). With
   * `withMargin` false the limits are not tightened (the mask's own merit).
   */
  residualsOf(out: Float64Array, withMargin = true, spectrum: SpectrumOutput = this.spectrum): number {
    const s = this.samples;
    const R = spectrum.R;
    const T = spectrum.T;
    const limits = withMargin ? s.limit : s.bound;
    let sum = 0;
    for (let i = 0; i < s.count; i++) {
      const v = 100 * (s.isT[i] === 1 ? T[s.index[i]] : R[s.index[i]]);
      const d = v - limits[i];
      const kind = s.kind[i];
      const dev = kind === KIND_MAX ? (d > 0 ? d : 0) : kind === KIND_MIN ? (d < 0 ? d : 0) : d;
      const r = s.scale[i] * dev;
      out[i] = r;
      sum += r * r;
    }
    return sum;
  }

  /** {@link compute} then {@link residualsOf} (with margin); returns Σ r². */
  residuals(out: Float64Array, thicknessesNm: ArrayLike<number>): number {
    this.compute(thicknessesNm);
    return this.residualsOf(out, true);
  }

  /**
   * The mask's merit (weighted RMS, percentage points; targets included) of the current spectrum,
   * without the margin: equals evaluateMaskOnSpectrum(...).merit when there are no targets.
   */
  meritOf(spectrum: SpectrumOutput = this.spectrum): number {
    const s = this.samples;
    let sum = 0;
    for (let i = 0; i < s.count; i++) {
      const v = 100 * (s.isT[i] === 1 ? spectrum.T[s.index[i]] : spectrum.R[s.index[i]]);
      const d = v - s.bound[i];
      const kind = s.kind[i];
      const dev = kind === KIND_MAX ? (d > 0 ? d : 0) : kind === KIND_MIN ? (d < 0 ? d : 0) : d;
      const r = s.scale[i] * dev;
      sum += r * r;
    }
    return Math.sqrt(sum / s.count);
  }

  /**
   * Smallest margin (percentage points, ≥ 0 passes) over the mask's samples of the current
   * spectrum, as evaluateMaskOnSpectrum's worstMargin; target curves do not count.
   */
  worstMarginOf(spectrum: SpectrumOutput = this.spectrum): number {
    const s = this.samples;
    let worst = Infinity;
    for (let i = 0; i < s.count; i++) {
      if (s.inMask[i] === 0) continue;
      const v = 100 * (s.isT[i] === 1 ? spectrum.T[s.index[i]] : spectrum.R[s.index[i]]);
      const kind = s.kind[i];
      const m =
        kind === KIND_MAX
          ? s.bound[i] - v
          : kind === KIND_MIN
            ? v - s.bound[i]
            : s.tolerance[i] - Math.abs(v - s.bound[i]);
      if (m < worst || m !== m) worst = m;
    }
    return worst;
  }

  /** Whether {@link jacobian} is available: analytic derivatives need the coherent front surface. */
  get analyticDerivatives(): boolean {
    return this.plan.back === 'none';
  }

  /**
   * Jacobian of the residuals (with margin) at `thicknessesNm`, whose spectrum the last
   * {@link compute} gave: jac[s·free.length + j] = ∂r_s/∂d_free[j] (nm⁻¹), from the analytic
   * derivatives of optics/derivatives.ts. A limit sample counts where it is violated (its
   * residual ≠ 0), as the residual's one-sided derivative on the violated side.
   */
  jacobian(jac: Float64Array, thicknessesNm: ArrayLike<number>, free: ArrayLike<number>): void {
    setLayerThicknesses(this.plan, thicknessesNm);
    const s = this.samples;
    const wantT = s.hasT;
    const d = (this.derivatives ??= createThicknessDerivatives(this.plan, { wantT }));
    // Only the spectrum points of samples whose residual depends on them are swept.
    const points = (this.points ??= new Uint8Array(this.plan.size));
    const active = (this.active ??= new Uint8Array(s.count));
    points.fill(0);
    for (let i = 0; i < s.count; i++) {
      active[i] = this.activity(i);
      if (active[i] === 1) points[s.index[i]] = 1;
    }
    computeThicknessDerivatives(d, this.plan, { wantT, points });
    const size = this.plan.size;
    const p = free.length;
    for (let i = 0; i < s.count; i++) {
      if (active[i] === 0) {
        jac.fill(0, i * p, (i + 1) * p);
        continue;
      }
      const factor = 100 * s.scale[i];
      const src = s.isT[i] === 1 ? d.dT : d.dR;
      const at = s.index[i];
      for (let j = 0; j < p; j++) jac[i * p + j] = factor * src[free[j] * size + at];
    }
  }

  /**
   * Weights of ∂R and ∂T per spectrum point in the gradient of Σr² (with margin) of the current
   * spectrum: ∂Σr²/∂x = Σ_i gR[i]·∂R_i/∂x + gT[i]·∂T_i/∂x. gR, gT have length plan.size.
   */
  gradientWeights(gR: Float64Array, gT: Float64Array): void {
    gR.fill(0);
    gT.fill(0);
    const s = this.samples;
    const R = this.spectrum.R;
    const T = this.spectrum.T;
    for (let i = 0; i < s.count; i++) {
      const isT = s.isT[i] === 1;
      const v = 100 * (isT ? T[s.index[i]] : R[s.index[i]]);
      const d = v - s.limit[i];
      const kind = s.kind[i];
      const dev = kind === KIND_MAX ? (d > 0 ? d : 0) : kind === KIND_MIN ? (d < 0 ? d : 0) : d;
      const w = 2 * s.scale[i] * s.scale[i] * dev * 100;
      if (isT) gT[s.index[i]] += w;
      else gR[s.index[i]] += w;
    }
  }

  /** 1 where sample i's residual (with margin) depends on the spectrum, else 0. */
  private activity(i: number): number {
    const s = this.samples;
    const v = 100 * (s.isT[i] === 1 ? this.spectrum.T[s.index[i]] : this.spectrum.R[s.index[i]]);
    const d = v - s.limit[i];
    const kind = s.kind[i];
    return kind === KIND_MAX ? (d > 0 ? 1 : 0) : kind === KIND_MIN ? (d < 0 ? 1 : 0) : 1;
  }

  /**
   * Index in the plan's polarisations that gives `pol` (at normal incidence alone, s serves for p
   * and avg too, since they coincide there), or −1 when it was not computed.
   */
  polarisationIndex(pol: Polarisation): number {
    return this.layout.polIndex.get(pol) ?? -1;
  }
}

/**
 * Prepares the residuals of `mask` (validated here; an empty mask is an error) for `stack`, on
 * one spectrum plan covering every band's samples and every target curve's points. Throws
 * {@link OpticsInputError} naming the field for a bad mask, target or option.
 */
export function createMaskMerit(
  stack: OpticalStack,
  mask: SpecMask,
  options: MaskMeritOptions = {},
): MaskMerit {
  return MaskMerit.create(stack, mask, options);
}

/** RMS of the first `count` residuals: √(Σ r² / count). */
export function rms(residuals: ArrayLike<number>, count = residuals.length): number {
  let sum = 0;
  for (let i = 0; i < count; i++) sum += residuals[i] * residuals[i];
  return Math.sqrt(sum / count);
}

function nonNegative(value: unknown, field: string): number {
  const x = finiteNumber(value, field);
  if (x < 0) throw new OpticsInputError(field, `must be 0 or more (got ${x})`);
  return x;
}

function validateTargets(input: unknown): TargetCurve[] {
  if (input === undefined) return [];
  return arrayValue(input, 'targets').map((item, t) => {
    const field = fieldPath('targets', t);
    const at = (key: string) => fieldPath(field, key);
    const obj = plainObject(item, field);
    onlyKeys(
      obj,
      ['quantity', 'angleDeg', 'polarisation', 'wavelengthsNm', 'valuesPercent', 'weight'],
      field,
    );
    const wavelengthsNm = numberList(obj.wavelengthsNm, at('wavelengthsNm'), positiveNumber);
    if (wavelengthsNm.length === 0) throw new OpticsInputError(at('wavelengthsNm'), 'must not be empty');
    const valuesPercent = numberList(obj.valuesPercent, at('valuesPercent'), (v, f) => {
      const x = finiteNumber(v, f);
      if (x < 0 || x > 100) throw new OpticsInputError(f, `must lie between 0 and 100 percent (got ${x})`);
      return x;
    });
    if (valuesPercent.length !== wavelengthsNm.length) {
      throw new OpticsInputError(
        at('valuesPercent'),
        `must have one value per wavelength (${wavelengthsNm.length}, got ${valuesPercent.length})`,
      );
    }
    return {
      quantity: oneOf(obj.quantity, ['R', 'T'] as const, at('quantity')),
      angleDeg: obj.angleDeg === undefined ? 0 : incidenceAngle(obj.angleDeg, at('angleDeg')),
      polarisation:
        obj.polarisation === undefined ? 'avg' : oneOf(obj.polarisation, POLARISATIONS, at('polarisation')),
      wavelengthsNm: wavelengthsNm.map(roundWavelengthNm),
      valuesPercent,
      weight: obj.weight === undefined ? 1 : positiveNumber(obj.weight, at('weight')),
    };
  });
}

function gridLayout(mask: SpecMask, targets: readonly TargetCurve[]): GridLayout {
  const grid = maskGrid(mask);
  const wavelengths = new Set<number>(Array.from(grid.wavelengthsNm));
  const angles = new Set<number>(Array.from(grid.anglesDeg));
  const pols = new Set<Polarisation>(grid.polarisations);
  for (const t of targets) {
    for (const wl of t.wavelengthsNm) wavelengths.add(wl);
    angles.add(t.angleDeg ?? 0);
    pols.add(t.polarisation ?? 'avg');
  }
  const anglesDeg = [...angles].sort((x, y) => x - y);
  const wanted = POLARISATIONS.filter((p) => pols.has(p));
  const polIndex = new Map<Polarisation, number>();
  let computed: Polarisation[];
  if (anglesDeg.length === 1 && anglesDeg[0] === 0) {
    // s and p coincide at normal incidence (the tilted admittances are equal): one pass serves all.
    computed = ['s'];
    for (const p of wanted) polIndex.set(p, 0);
  } else {
    computed = wanted;
    computed.forEach((p, i) => polIndex.set(p, i));
  }
  return { wavelengthsNm: [...wavelengths].sort((x, y) => x - y), anglesDeg, computed, polIndex };
}

function sampleTable(
  mask: SpecMask,
  targets: readonly TargetCurve[],
  layout: GridLayout,
  margin: number,
  smooth: boolean,
): SampleTable {
  const wlIndex = new Map<number, number>();
  layout.wavelengthsNm.forEach((wl, i) => wlIndex.set(wl, i));
  const angleIndex = new Map<number, number>();
  layout.anglesDeg.forEach((a, i) => angleIndex.set(a, i));
  const nW = layout.wavelengthsNm.length;
  const nA = layout.anglesDeg.length;
  const rows: {
    index: number;
    isT: number;
    kind: number;
    bound: number;
    tol: number;
    w: number;
    inMask: number;
    margin: number;
  }[] = [];
  const at = (pol: Polarisation, angle: number, wl: number) =>
    ((layout.polIndex.get(pol) ?? 0) * nA + (angleIndex.get(angle) ?? 0)) * nW + (wlIndex.get(wl) ?? 0);

  for (const band of mask.bands) {
    const pol = band.polarisation ?? 'avg';
    const kind =
      band.max_percent !== undefined ? KIND_MAX : band.min_percent !== undefined ? KIND_MIN : KIND_TARGET;
    const bound = band.max_percent ?? band.min_percent ?? band.target_percent ?? 0;
    const tol = kind === KIND_TARGET ? (band.tolerance_percent ?? 0) : 0;
    const wls = bandWavelengthsNm(band);
    for (const angle of band.angles_deg ?? [0]) {
      for (const wl of wls) {
        rows.push({
          index: at(pol, angle, wl),
          isT: band.quantity === 'T' ? 1 : 0,
          kind,
          bound,
          tol,
          w: band.weight ?? 1,
          inMask: 1,
          // The band's own design margin, when larger than the run's: both aim inside the limit.
          margin: Math.max(margin, band.margin_percent ?? 0),
        });
      }
    }
  }
  for (const t of targets) {
    t.wavelengthsNm.forEach((wl, i) => {
      rows.push({
        index: at(t.polarisation ?? 'avg', t.angleDeg ?? 0, wl),
        isT: t.quantity === 'T' ? 1 : 0,
        kind: KIND_TARGET,
        bound: t.valuesPercent[i],
        tol: 0,
        w: t.weight ?? 1,
        inMask: 0,
        margin: 0,
      });
    });
  }

  const count = rows.length;
  let weightSum = 0;
  for (const row of rows) weightSum += row.w;
  const table: SampleTable = {
    count,
    index: new Int32Array(count),
    isT: new Uint8Array(count),
    hasT: rows.some((row) => row.isT === 1),
    kind: new Uint8Array(count),
    bound: new Float64Array(count),
    tolerance: new Float64Array(count),
    limit: new Float64Array(count),
    scale: new Float64Array(count),
    inMask: new Uint8Array(count),
  };
  rows.forEach((row, i) => {
    table.index[i] = row.index;
    table.isT[i] = row.isT;
    table.kind[i] = row.kind;
    table.bound[i] = row.bound;
    table.tolerance[i] = row.tol;
    // A smooth merit aims a maximum at 0 % and a minimum at 100 %: R, T ∈ [0, 1] keep the
    // residual on its active side everywhere.
    table.limit[i] =
      row.kind === KIND_MAX
        ? smooth
          ? 0
          : row.bound - row.margin
        : row.kind === KIND_MIN
          ? smooth
            ? 100
            : row.bound + row.margin
          : row.bound;
    table.scale[i] = Math.sqrt((row.w * count) / weightSum);
    table.inMask[i] = row.inMask;
  });
  return table;
}
