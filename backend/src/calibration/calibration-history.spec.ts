/*
 * Simulated chamber histories with a known drift, generated with the engine: each run's layers are
 * deposited off by a known factor per material plus run-to-run noise, its reflectance computed and
 * given measurement noise, and the real Run diagnosis (runOptimiseJob, as the worker runs it) fits
 * it. The calibration history must then recover the factor within its stated uncertainty.
 * Invented materials and chamber; constant indices near those of SiO2 (1.46) and ZrO2 (2.05),
 * typical values from memory.
 */
import { describe, expect, it } from 'vitest';
import {
  DEFAULT_CALIBRATION_SETTINGS,
  calibrationFindings,
  type CalibrationSeriesView,
} from '@quietglass/shared/calibration';
import type { DiagnosisSummary } from '@quietglass/shared/calculations';
import { calculateSpectrum } from '@quietglass/shared/optics/batch';
import { parseStack, type StackDescription } from '@quietglass/shared/optics/stack';
import { Mulberry32, fillDeviates } from '@quietglass/shared/optimise/random';
import { runOptimiseJob, type DiagnosisInput } from '../calculations/optimise-jobs.js';
import {
  materialSeries,
  recentCauses,
  runCauses,
  type DiagnosedRun,
  type PastDecision,
} from './calibration-history.js';

const L = 1;
const H = 2;
const INDEX: Record<number, number> = { [L]: 1.46, [H]: 2.05 };
/** Incident side first; the last H layer is thin (2 nm, an adhesion-type layer) on purpose. */
const DESIGN: [number, number][] = [
  [L, 95],
  [H, 120],
  [L, 35],
  [H, 2],
];
const WAVELENGTHS = Array.from({ length: 101 }, (_, i) => 400 + 4 * i);
const SPECTRAL_NOISE_PERCENT = 0.05;
const RUN_NOISE = 0.003;

function description(factors: number[]): StackDescription {
  return {
    substrate: { n: 1.52 },
    layers: DESIGN.map(([m, d], i) => ({ n: INDEX[m], thickness_nm: d * factors[i]! })),
  };
}

/** A history of `runs` diagnosed runs; truth(material, run) is the factor the run really had. */
function history(
  runs: number,
  truth: (material: number, run: number) => number,
  seed: number,
): DiagnosedRun[] {
  const noise = fillDeviates(new Float64Array(runs * 8), runs * 8, new Mulberry32(seed), 'normal');
  const spectral = fillDeviates(
    new Float64Array(runs * WAVELENGTHS.length),
    runs * WAVELENGTHS.length,
    new Mulberry32(seed + 1000),
    'normal',
  );
  const out: DiagnosedRun[] = [];
  for (let k = 0; k < runs; k++) {
    // One run-to-run factor per material (the source and its shutter), shared by its layers.
    const perMaterial: Record<number, number> = {
      [L]: truth(L, k) * (1 + RUN_NOISE * noise[k * 8]!),
      [H]: truth(H, k) * (1 + RUN_NOISE * noise[k * 8 + 1]!),
    };
    const built = parseStack(description(DESIGN.map(([m]) => perMaterial[m]!)));
    const R = calculateSpectrum(built, {
      wavelengthsNm: WAVELENGTHS,
      anglesDeg: [0],
      polarisations: ['avg'],
    }).R;
    // A spectrophotometer reports no negative reflectance.
    const measured = WAVELENGTHS.map((_, i) =>
      Math.max(0, 100 * R[i]! + SPECTRAL_NOISE_PERCENT * spectral[k * WAVELENGTHS.length + i]!),
    );
    const input: DiagnosisInput = {
      kind: 'diagnosis',
      stack: description(DESIGN.map(() => 1)),
      back: 'none',
      bands: [{ from_nm: 400, to_nm: 800, quantity: 'R', max_percent: 100, weight: 1, step_nm: 400 }],
      layerMaterialIds: DESIGN.map(([m]) => m),
      measured: { quantity: 'R', angleDeg: 0, wavelengthsNm: WAVELENGTHS, valuesPercent: measured },
      factorRange: [0.7, 1.3],
    };
    const summary = runOptimiseJob(input, () => true) as DiagnosisSummary;
    out.push({
      run: {
        id: k + 1,
        lotNumber: `SIM-${k + 1}`,
        runDate: `2026-11-${String(k + 1).padStart(2, '0')}`,
        createdAt: new Date(Date.UTC(2026, 10, k + 1)),
        layerReadings: [],
      },
      calculationId: 100 + k,
      summary,
    });
  }
  return out;
}

function seriesOf(diagnosed: DiagnosedRun[], decided: PastDecision[] = []): CalibrationSeriesView[] {
  const causes = runCauses(diagnosed, DEFAULT_CALIBRATION_SETTINGS.thresholdPercent);
  return [L, H].map((materialId) =>
    materialSeries(
      { materialId, toolingFactor: 1, rateNmPerS: 0.4 },
      `M${materialId}`,
      diagnosed,
      decided,
      causes,
    ),
  );
}

/** The H material's series on a chamber whose H tooling factor is now 1.02. */
function highAt102(diagnosed: DiagnosedRun[], decided: PastDecision[], causes: ReturnType<typeof runCauses>) {
  return materialSeries(
    { materialId: H, toolingFactor: 1.02, rateNmPerS: 0.4 },
    'H',
    diagnosed,
    decided,
    causes,
  );
}

function findings(series: CalibrationSeriesView[]) {
  return calibrationFindings(
    series.map((s) => ({
      materialId: s.materialId,
      runs: s.estimate!.runs,
      correction: s.estimate!.correction,
    })),
    DEFAULT_CALIBRATION_SETTINGS,
    recentCauses(series[0]!.runs, DEFAULT_CALIBRATION_SETTINGS.minRuns),
  );
}

describe('calibration history from simulated, diagnosed runs', () => {
  it('recovers a slow 2 % drift of one material over 12 runs within 2σ and suggests only that material', () => {
    const drift = (material: number, k: number) => (material === H ? 1 + (0.02 * k) / 11 : 1);
    const [low, high] = seriesOf(history(12, drift, 1));
    if (!low || !high) throw new Error('expected one series per material');
    const h = high.estimate!;
    expect(h.runs).toBe(12);
    expect(Math.abs(h.correction.value - 1.02)).toBeLessThan(2 * h.correction.sigma);
    expect(h.correction.sigma).toBeLessThan(0.004);
    expect(Math.abs(h.driftPercentPerRun.value - 2 / 11)).toBeLessThan(2 * h.driftPercentPerRun.sigma);
    const l = low.estimate!;
    expect(Math.abs(l.correction.value - 1)).toBeLessThan(2 * l.correction.sigma);
    const f = findings([low, high]);
    expect(f).toHaveLength(1);
    expect(f[0]).toMatchObject({ kind: 'material', materialId: H });
    expect(h.suggestedToolingFactor).toBeCloseTo(h.correction.value, 4);
  });

  it('leaves the 2 nm layer out as not identified and keeps the thick layers', () => {
    const [, high] = seriesOf(history(3, () => 1, 2));
    if (!high) throw new Error('expected one series per material');
    for (const run of high.runs) {
      const thin = run.layers.find((x) => x.designNm === 2)!;
      const thick = run.layers.find((x) => x.designNm === 120)!;
      expect(thin.identified).toBe(false);
      expect(thin.impliedToolingFactor).toBeNull();
      expect(thick.identified).toBe(true);
      expect(thick.factorSigma).toBeGreaterThan(0);
      expect(thick.factorSigma).toBeLessThan(0.01);
    }
  });

  it('does not suggest anything for a single outlier run, and marks it out of control', () => {
    const truth = (material: number, k: number) => (material === H && k === 7 ? 1.06 : 1);
    const series = seriesOf(history(12, truth, 3));
    expect(findings(series)).toEqual([]);
    const high = series[1];
    if (!high) throw new Error('expected one series per material');
    expect(high.runs[7]!.tracked!.outOfControl).toBe(true);
    expect(high.runs.filter((r) => r.tracked!.outOfControl).map((r) => r.runId)).toEqual([8]);
    expect(high.runs[7]!.cause).toBe('material');
  });

  it('points to a monitor or geometry cause when every material is off by the same 2.5 %', () => {
    const series = seriesOf(history(8, () => 1.025, 4));
    const f = findings(series);
    expect(f).toHaveLength(1);
    expect(f[0]!.kind).toBe('common');
    // The classification is the point here (recovery is the drift test's): the common factor lies
    // within half the threshold of the truth.
    expect(Math.abs(f[0]!.correction.value - 1.025)).toBeLessThan(0.005);
    expect(series[0]!.runs.filter((r) => r.cause === 'common').length).toBeGreaterThanOrEqual(6);
  });

  it('measures runs made before an accepted calibration against the factor they were made with', () => {
    // Runs 1–6 with tooling factor 1, then the factor set to 1.02 (accepted after run 6), runs 7–12
    // come out right: the whole history then reads as correction ≈ 1 against the new factor.
    const truth = (material: number, k: number) => (material === H && k < 6 ? 1.02 : 1);
    const diagnosed = history(12, truth, 5);
    const decided: PastDecision[] = [
      {
        kind: 'material',
        materialIds: [H],
        decision: 'accepted',
        previousToolingFactor: 1,
        decidedAt: new Date(Date.UTC(2026, 10, 6, 12)),
      },
    ];
    const causes = runCauses(diagnosed, 1);
    const high = highAt102(diagnosed, decided, causes);
    expect(high.runs[0]!.toolingFactorInEffect).toBe(1);
    expect(high.runs[11]!.toolingFactorInEffect).toBe(1.02);
    const e = high.estimate!;
    expect(Math.abs(e.correction.value - 1)).toBeLessThan(2 * e.correction.sigma);
  });

  it('reads each run against the tooling factor kept with it, also after a manual edit of the chamber', () => {
    // Same history, but the factor was raised to 1.02 by hand (no calibration decision): only the
    // factor each run kept when it was logged tells the runs apart.
    const truth = (material: number, k: number) => (material === H && k < 6 ? 1.02 : 1);
    const diagnosed = history(12, truth, 5).map((d, k) => ({
      ...d,
      run: { ...d.run, toolingFactors: { [String(L)]: 1, [String(H)]: k < 6 ? 1 : 1.02 } },
    }));
    const causes = runCauses(diagnosed, 1);
    const high = highAt102(diagnosed, [], causes);
    expect(high.runs.map((r) => r.toolingFactorInEffect)).toEqual([
      ...Array<number>(6).fill(1),
      ...Array<number>(6).fill(1.02),
    ]);
    const e = high.estimate!;
    expect(Math.abs(e.correction.value - 1)).toBeLessThan(2 * e.correction.sigma);
    // Without the kept factors the same history reads the early runs against 1.02: a false drift.
    const unkept = highAt102(history(12, truth, 5), [], causes);
    expect(unkept.runs[0]!.toolingFactorInEffect).toBe(1.02);
    expect(unkept.runs[0]!.correction!.value).toBeGreaterThan(1.015);
  });
});
