import {
  ANALYSIS_POLARISATIONS,
  evenlySpaced,
  type AnalysisColour,
  type AnalysisField,
  type AnalysisInput,
  type AnalysisSummary,
} from '@quietglass/shared/analysis';
import { reflectedColour } from '@quietglass/shared/optics/colour';
import { OpticsInputError } from '@quietglass/shared/optics/errors';
import { evenDepthsNm, fieldProfile } from '@quietglass/shared/optics/field';
import { parseStack, type OpticalStack } from '@quietglass/shared/optics/stack';
import type {
  SpectralGrid,
  SpectrumOptions,
  SpectrumOutput,
  SpectrumPlan,
} from '@quietglass/shared/optics/batch';

/** What computes one slice of the grid: the worker-thread pool in production, anything alike in tests. */
export interface SpectrumComputer {
  compute(
    stack: OpticalStack,
    grid: SpectralGrid,
    options: SpectrumOptions,
  ): Promise<SpectrumOutput & { plan: SpectrumPlan }>;
}

export interface RunHooks {
  /** Called after each slice with the fraction done (0–1). */
  onProgress(fraction: number): Promise<void>;
  /** Asked between slices; true stops the run with AnalysisCancelled. */
  isCancelled(): Promise<boolean>;
}

export class AnalysisCancelled extends Error {
  constructor() {
    super('cancelled');
  }
}

/** Slices per run: enough for a smooth progress bar and a prompt cancel, few enough to stay fast. */
const SLICES = 10;
const FIELD_POINTS = 400;

/**
 * Runs a full analysis: R, T, A for s, p and avg over the grid (in slices of wavelengths, so
 * progress and cancellation happen between slices), colour and Rv at each angle, and the field
 * profile when asked for. Returns the summary and the values in analysisIndex order.
 */
export async function runAnalysis(
  input: AnalysisInput,
  computer: SpectrumComputer,
  hooks: RunHooks,
): Promise<{ summary: AnalysisSummary; values: Float64Array }> {
  const stack = parseStack(input.stack);
  const req = input.request;
  const wavelengths = evenlySpaced(req.fromNm, req.toNm, req.wavelengthCount);
  const angles = evenlySpaced(req.angleFromDeg, req.angleToDeg, req.angleCount);
  const nW = wavelengths.length;
  const nA = angles.length;
  const nP = ANALYSIS_POLARISATIONS.length;
  const size = nP * nA * nW;
  const values = new Float64Array(3 * size);
  const warnings = new Set<string>();
  const sliceLength = Math.max(1, Math.ceil(nW / SLICES));

  for (let start = 0; start < nW; start += sliceLength) {
    if (await hooks.isCancelled()) throw new AnalysisCancelled();
    const slice = wavelengths.subarray(start, Math.min(nW, start + sliceLength));
    const part = await computer.compute(
      stack,
      { wavelengthsNm: slice, anglesDeg: angles, polarisations: ANALYSIS_POLARISATIONS },
      { back: input.back },
    );
    for (const w of part.plan.warnings) warnings.add(w);
    const nS = slice.length;
    for (let ip = 0; ip < nP; ip++) {
      for (let ia = 0; ia < nA; ia++) {
        const from = (ip * nA + ia) * nS;
        const to = (ip * nA + ia) * nW + start;
        values.set(part.R.subarray(from, from + nS), to);
        values.set(part.T.subarray(from, from + nS), size + to);
        values.set(part.A.subarray(from, from + nS), 2 * size + to);
      }
    }
    await hooks.onProgress(Math.min(1, (start + nS) / nW) * 0.95);
  }

  const colour = colourByAngle(stack, angles, input.back, warnings);
  const field =
    req.fieldWavelengthNm === undefined
      ? null
      : fieldAt(stack, req.fieldWavelengthNm, req.fieldAngleDeg ?? 0);
  await hooks.onProgress(1);
  return {
    summary: {
      wavelengthsNm: Array.from(wavelengths),
      anglesDeg: Array.from(angles),
      polarisations: ANALYSIS_POLARISATIONS,
      colour,
      field,
      warnings: [...warnings],
    },
    values,
  };
}

function colourByAngle(
  stack: OpticalStack,
  angles: Float64Array,
  back: AnalysisInput['back'],
  warnings: Set<string>,
): AnalysisColour[] | null {
  try {
    return Array.from(angles, (angleDeg) => {
      const c = reflectedColour(stack, { angleDeg, back });
      return { angleDeg, L: c.L, a: c.a, b: c.b, x: c.x, y: c.y, Rv: c.Rv };
    });
  } catch (err) {
    if (!(err instanceof OpticsInputError)) throw err;
    warnings.add(`no colour: ${err.message} (colour needs the materials over 380–780 nm)`);
    return null;
  }
}

function fieldAt(stack: OpticalStack, wavelengthNm: number, angleDeg: number): AnalysisField {
  const depths = evenDepthsNm(stack, FIELD_POINTS, 50);
  const s = fieldProfile(new Float64Array(depths.length), stack, wavelengthNm, angleDeg, 's', depths);
  const p = fieldProfile(new Float64Array(depths.length), stack, wavelengthNm, angleDeg, 'p', depths);
  let depthNm = 0;
  const interfacesNm = [depthNm];
  for (const layer of stack.layers) {
    depthNm += layer.thicknessNm;
    interfacesNm.push(depthNm);
  }
  return {
    wavelengthNm,
    angleDeg,
    depthsNm: Array.from(depths),
    s: Array.from(s),
    p: Array.from(p),
    interfacesNm,
    layerLabels: stack.layers.map((layer, i) => layer.label ?? `${i + 1}`),
  };
}
