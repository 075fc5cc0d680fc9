/*
 * Run diagnosis: the layer thicknesses that reproduce a run's measured spectrum, each within a
 * factor range of its design value (a Levenberg–Marquardt fit, fit.ts), with the uncertainty of
 * each layer's thickness factor and whether the spectrum identifies it.
 *
 * A layer's σ is first the linearised one at the solution, s²·(JᵀJ)⁻¹ (fit-uncertainty.ts). That
 * linearisation holds only near the solution (W. H. Press et al., Numerical Recipes, 3rd ed.,
 * §15.6: the ellipsoid is a confidence region only while the model is close to linear over it).
 * Where the spectrum hardly constrains a layer (SiO2 next to the glass, a very thin layer), the
 * fit slides along a valley of near-equal merit, often far from the true thickness, and a
 * neighbour that trades thickness with it moves along, while the local curvature there makes both
 * σ look small. So a layer correlated with an unidentified layer k gets the part of k's error
 * that k's σ does not cover: in the linearised (joint normal) model, layer j moves by
 * β_jk = C_jk / C_kk = ρ_jk·σ_j/σ_k per unit of k (the regression slope of j on k), and k is known
 * only to lie between its design value and where the fit put it, so its spread is taken as
 * u_k = max(σ_k, |f_k − 1|) (f = fitted ÷ design):
 *
 *   σ_j² ← σ_j² + Σ_k β_jk² · (u_k² − σ_k²),   k over the unidentified layers, k ≠ j.
 *
 * The widening uses the unidentified layers of the first pass only (one pass, no iteration) and
 * neglects the covariance between two unidentified layers; it is an upper-side estimate, which is
 * the safe side for a calibration that must not act on a trade-off between layers.
 */
import { IDENTIFIABLE_MAX_FACTOR_SIGMA } from '../calibration.js';
import { elementAt } from '../checked.js';
import type { DiagnosisResult, LayerDeviation } from '../calculations.js';
import { OpticsInputError } from '../optics/errors.js';
import type { BackSurface } from '../optics/batch.js';
import type { SpecMask } from '../optics/mask.js';
import type { OpticalStack } from '../optics/stack.js';
import { fitToMask, type FitIteration } from './fit.js';
import { fitUncertainty } from './fit-uncertainty.js';
import type { TargetCurve } from './merit.js';

/**
 * Thickness factor range a diagnosis searches when none is asked for: ±30 % covers a rate or
 * tooling slip of a run without letting a layer wander into another order (common practice, no
 * source).
 */
export const DEFAULT_FACTOR_RANGE: readonly [number, number] = [0.7, 1.3];

export interface DiagnosisOptions {
  back?: BackSurface;
  /** How far a layer may have deviated: thickness factor bounds [low, high]. */
  factorRange: [number, number];
  maxIterations: number;
  onIteration?: (info: FitIteration) => boolean | void;
}

/** A layer's factor σ widened by its unidentified neighbours, and the one that widened it most. */
export interface WidenedFactorSigma {
  sigma: number | null;
  /** The unidentified layer (index, 0 = outermost) that adds most to σ, or null: none adds. */
  correlatedWith: { index: number; correlation: number } | null;
}

/**
 * Each layer's factor σ with the unresolved spread of the unidentified layers it correlates with
 * (file comment): `factors` fitted ÷ design, `sigmas` their linearised σ (null: not estimated),
 * `correlation` the fit's correlation matrix, `identifiable[k]` whether layer k passed the first
 * test (off its bound, σ within {@link IDENTIFIABLE_MAX_FACTOR_SIGMA}).
 */
export function widenedFactorSigmas(
  factors: readonly number[],
  sigmas: readonly (number | null)[],
  correlation: readonly (readonly (number | null)[])[],
  identifiable: readonly boolean[],
): WidenedFactorSigma[] {
  const p = factors.length;
  const out: WidenedFactorSigma[] = [];
  for (let j = 0; j < p; j++) {
    const sj = sigmas[j] ?? null;
    if (sj === null) {
      out.push({ sigma: null, correlatedWith: null });
      continue;
    }
    let variance = sj * sj;
    let most: { index: number; correlation: number } | null = null;
    let mostAdded = 0;
    for (let k = 0; k < p; k++) {
      const sk = sigmas[k] ?? null;
      const rho = correlation[j]?.[k] ?? null;
      if (k === j || identifiable[k] || sk === null || !(sk > 0) || rho === null) continue;
      const spread = Math.max(sk, Math.abs(elementAt(factors, k, 'the factors') - 1));
      const beta = (rho * sj) / sk;
      const added = beta * beta * (spread * spread - sk * sk);
      variance += added;
      if (added > mostAdded) {
        most = { index: k, correlation: rho };
        mostAdded = added;
      }
    }
    out.push({ sigma: Math.sqrt(variance), correlatedWith: most });
  }
  return out;
}

/**
 * Run diagnosis of `stack` (the design as built) against the `measured` curve; `mask` gives the
 * merit its wavelength frame (the fit follows the measured points). Layers are returned ranked
 * by |deviation|, largest first, with `layer` 1 = outermost and the material id from
 * `layerMaterialIds` (incident side first). Throws {@link OpticsInputError} on a bad factor range.
 */
export function diagnoseRun(
  stack: OpticalStack,
  mask: SpecMask,
  measured: TargetCurve,
  layerMaterialIds: readonly number[],
  options: DiagnosisOptions,
): DiagnosisResult {
  const [lo, hi] = options.factorRange;
  if (!(lo > 0 && hi > lo && Number.isFinite(hi))) {
    throw new OpticsInputError('factorRange', 'needs 0 < low < high');
  }
  if (layerMaterialIds.length !== stack.layers.length) {
    throw new OpticsInputError('layerMaterialIds', 'needs one material id per layer');
  }
  const design = stack.layers.map((l) => l.thicknessNm);
  const minNm = design.map((d) => Math.max(0.5, d * lo));
  const maxNm = design.map((d) => d * hi);
  const targets = [{ polarisation: 'avg' as const, ...measured }];
  const fit = fitToMask(stack, mask, {
    back: options.back,
    minThicknessNm: minNm,
    maxThicknessNm: maxNm,
    maxIterations: options.maxIterations,
    targets,
    onIteration: options.onIteration,
  });
  const samples = measured.wavelengthsNm.length;
  const u =
    samples > design.length
      ? fitUncertainty(stack, mask, { back: options.back, targets }, fit.thicknessesNm, samples)
      : null;
  const fittedNm = design.map((_, i) => elementAt(fit.thicknessesNm, i, 'the fitted thicknesses'));
  const factors = design.map((d, i) => elementAt(fittedNm, i, 'the fitted thicknesses') / d);
  const fitSigmas = design.map((d, i) => {
    const s = u?.sigmaNm[i] ?? null;
    return s === null ? null : s / d;
  });
  const firstPass = design.map((_, i) => {
    const fitted = elementAt(fittedNm, i, 'the fitted thicknesses');
    const onBound =
      fitted <= elementAt(minNm, i, 'the lower bounds') * (1 + 1e-9) ||
      fitted >= elementAt(maxNm, i, 'the upper bounds') * (1 - 1e-9);
    const s = fitSigmas[i] ?? null;
    return !onBound && s !== null && s <= IDENTIFIABLE_MAX_FACTOR_SIGMA;
  });
  const widened = u
    ? widenedFactorSigmas(factors, fitSigmas, u.correlation, firstPass)
    : fitSigmas.map(() => ({ sigma: null, correlatedWith: null }));
  const layers: LayerDeviation[] = design
    .map((d, i) => {
      const { sigma, correlatedWith: by } = elementAt(widened, i, 'the widened sigmas');
      const identified =
        elementAt(firstPass, i, 'the first pass') && sigma !== null && sigma <= IDENTIFIABLE_MAX_FACTOR_SIGMA;
      const factor = elementAt(factors, i, 'the factors');
      return {
        layer: i + 1,
        materialId: elementAt(layerMaterialIds, i, 'the layer material ids'),
        designNm: d,
        fittedNm: elementAt(fittedNm, i, 'the fitted thicknesses'),
        factor,
        deviationPercent: (factor - 1) * 100,
        factorSigma: sigma,
        fitFactorSigma: fitSigmas[i] ?? null,
        correlatedWith: by ? { layer: by.index + 1, correlation: by.correlation } : null,
        identified,
      };
    })
    .sort((a, b) => Math.abs(b.deviationPercent) - Math.abs(a.deviationPercent));
  return { fit, layers, residualRmsPercent: fit.merit.after };
}
