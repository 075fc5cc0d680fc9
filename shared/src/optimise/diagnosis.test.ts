import { describe, expect, it } from 'vitest';
import { elementAt } from '../checked.js';
import {
  DEFAULT_CALIBRATION_SETTINGS,
  IDENTIFIABLE_MAX_FACTOR_SIGMA,
  MIN_RUN_SIGMA,
  calibrationFindings,
  trackCalibration,
  weightedMean,
  type MaterialEstimate,
  type Measured,
} from '../calibration.js';
import type { LayerDeviation } from '../calculations.js';
import { responseAt } from '../optics/batch.js';
import { constantIndex as c } from '../optics/dispersion.js';
import { OpticsInputError } from '../optics/errors.js';
import type { OpticalStack } from '../optics/stack.js';
import { diagnoseRun, widenedFactorSigmas } from './diagnosis.js';
import { Mulberry32, fillDeviates } from './random.js';

describe('widenedFactorSigmas', () => {
  it('adds β²·(u² − σ²) of an unidentified correlated layer (linear error propagation)', () => {
    // Layer 0: σ 0.5 %, identified; layer 1: σ 3 %, not identified, fitted 10 % off design; ρ 0.9.
    // β = 0.9·0.005/0.03 = 0.15; u = max(0.03, 0.10) = 0.10;
    // σ² = 0.005² + 0.15²·(0.10² − 0.03²) = 0.000025 + 0.00020475 = 0.00022975 → σ = 0.0151575.
    const w = widenedFactorSigmas(
      [0.98, 1.1],
      [0.005, 0.03],
      [
        [1, 0.9],
        [0.9, 1],
      ],
      [true, false],
    );
    const identified = elementAt(w, 0, 'widened σ');
    const unidentified = elementAt(w, 1, 'widened σ');
    expect(identified.sigma).toBeCloseTo(0.0151575, 6);
    expect(identified.correlatedWith).toEqual({ index: 1, correlation: 0.9 });
    // The unidentified layer is not widened by an identified one.
    expect(unidentified.sigma).toBeCloseTo(0.03, 12);
    expect(unidentified.correlatedWith).toBeNull();
  });

  it('leaves σ as it is when the unidentified layer sits at its design value or is uncorrelated', () => {
    const atDesign = widenedFactorSigmas(
      [1.0, 1.01],
      [0.004, 0.05],
      [
        [1, -0.95],
        [-0.95, 1],
      ],
      [true, false],
    );
    // u = max(0.05, 0.01) = σ: nothing beyond the fit's own σ.
    expect(elementAt(atDesign, 0, 'widened σ').sigma).toBeCloseTo(0.004, 12);
    const uncorrelated = widenedFactorSigmas(
      [1.0, 1.2],
      [0.004, 0.05],
      [
        [1, 0],
        [0, 1],
      ],
      [true, false],
    );
    const first = elementAt(uncorrelated, 0, 'widened σ');
    expect(first.sigma).toBeCloseTo(0.004, 12);
    expect(first.correlatedWith).toBeNull();
  });
});

/*
 * An engine-simulated history (invented scenario): a four-layer visible AR, MgF2 / ZrO2 / Al2O3 /
 * SiO2 on glass, with typical indices near 550 nm taken as constant (MgF2 1.38, ZrO2 2.05, Al2O3
 * 1.63, SiO2 1.46 on 1.52; common practice, from memory). SiO2 next to the glass has little index
 * contrast to it, and Al2O3 trades thickness with it. Twelve runs: ZrO2 drifts 0 → +2 %, the
 * others are built true; every layer has 0.3 % run-to-run scatter and the spectra 0.03 % noise.
 */
const N = { MgF2: 1.38, ZrO2: 2.05, Al2O3: 1.63, SiO2: 1.46 } as const;
const DESIGN: [keyof typeof N, number][] = [
  ['MgF2', 94.2],
  ['ZrO2', 119.1],
  ['Al2O3', 79.6],
  ['SiO2', 89.3],
];
const IDS = [1, 2, 3, 4];
const RUNS = 12;
const WAVELENGTHS = Array.from({ length: 101 }, (_, i) => 400 + 4 * i);
const ANGLE_DEG = 8;
const MASK = {
  bands: [{ from_nm: 400, to_nm: 800, quantity: 'R' as const, max_percent: 100, step_nm: 400 }],
};

function stack(factors: readonly number[]): OpticalStack {
  return {
    incident: c(1),
    layers: DESIGN.map(([m, d], i) => ({
      material: c(N[m]),
      thicknessNm: d * elementAt(factors, i, 'factors'),
    })),
    substrate: c(1.52),
    backLayers: [],
    exit: c(1),
  };
}

function normal(count: number, seed: number): Float64Array {
  return fillDeviates(new Float64Array(count), count, new Mulberry32(seed), 'normal');
}

interface SimulatedRun {
  truth: number[];
  layers: LayerDeviation[];
}

function simulateHistory(scatterSeed: number, noiseSeed: number): SimulatedRun[] {
  const scatter = normal(RUNS * DESIGN.length, scatterSeed);
  const noise = normal(RUNS * WAVELENGTHS.length, noiseSeed);
  const design = stack([1, 1, 1, 1]);
  return Array.from({ length: RUNS }, (_, k) => {
    const truth = DESIGN.map(
      ([m], i) =>
        (1 + (m === 'ZrO2' ? (0.02 * k) / (RUNS - 1) : 0)) *
        (1 + 0.003 * elementAt(scatter, k * DESIGN.length + i, 'scatter')),
    );
    const built = stack(truth);
    const valuesPercent = WAVELENGTHS.map((w, i) =>
      Math.max(
        0,
        100 * responseAt(built, w, ANGLE_DEG, 'avg').R +
          0.03 * elementAt(noise, k * WAVELENGTHS.length + i, 'noise'),
      ),
    );
    const result = diagnoseRun(
      design,
      MASK,
      { quantity: 'R', angleDeg: ANGLE_DEG, wavelengthsNm: WAVELENGTHS, valuesPercent },
      IDS,
      { factorRange: [0.7, 1.3], maxIterations: 200 },
    );
    return { truth, layers: [...result.layers].sort((a, b) => a.layer - b.layer) };
  });
}

/**
 * The estimates as the calibration history forms them when the operator hits the sheet's monitor
 * targets (correction = fitted ÷ design): per run the inverse-variance mean of the layers `use`
 * accepts, filtered run to run.
 */
function estimates(
  history: SimulatedRun[],
  use: (l: LayerDeviation) => boolean,
  sigmaOf: (l: LayerDeviation) => number,
): MaterialEstimate[] {
  return IDS.flatMap((id) => {
    const series: Measured[] = [];
    for (const run of history) {
      const used = run.layers.filter((l) => l.materialId === id && use(l));
      if (used.length > 0)
        series.push(
          weightedMean(used.map((l) => ({ value: l.factor, sigma: Math.max(sigmaOf(l), MIN_RUN_SIGMA) }))),
        );
    }
    if (series.length === 0) return [];
    const last = trackCalibration(series).at(-1)!;
    return [
      {
        materialId: id,
        runs: series.length,
        correction: { value: last.estimate, sigma: last.estimateSigma },
      },
    ];
  });
}

describe('diagnoseRun on an engine-simulated history with two correlated layers', () => {
  const history = simulateHistory(2210, 2211);
  const zr = IDS[1];
  const sio2Layer = 4;

  it('finds Al2O3 and the SiO2 next to the glass strongly correlated', () => {
    const al2o3 = (r: SimulatedRun) => elementAt(r.layers, 2, 'layers');
    const correlated = history.filter((r) => al2o3(r).correlatedWith?.layer === sio2Layer);
    expect(correlated.length).toBeGreaterThan(RUNS / 2);
    for (const r of correlated) expect(Math.abs(al2o3(r).correlatedWith!.correlation)).toBeGreaterThan(0.8);
    // SiO2 itself is never identified (σ well above 1 %).
    for (const r of history) expect(elementAt(r.layers, 3, 'layers').identified).toBe(false);
  });

  it('states widened σ that cover each used layer’s true error', () => {
    for (const r of history) {
      for (const l of r.layers.filter((x) => x.identified)) {
        expect(Math.abs(l.factor - elementAt(r.truth, l.layer - 1, 'truth'))).toBeLessThan(
          3 * l.factorSigma!,
        );
      }
    }
  });

  it('suggests the true ZrO2 drift and no Al2O3 correction, which the fit’s own σ alone would misjudge', () => {
    const settings = DEFAULT_CALIBRATION_SETTINGS;
    const found = calibrationFindings(
      estimates(
        history,
        (l) => l.identified === true,
        (l) => l.factorSigma!,
      ),
      settings,
    );
    expect(found.map((f) => (f.kind === 'material' ? f.materialId : -1))).toEqual([zr]);
    const zrFinding = elementAt(found, 0, 'findings');
    // The drift ends at +2 % times the last run's own scatter: recovered within 3σ of its stated σ.
    const lastTruth = elementAt(elementAt(history, RUNS - 1, 'history').truth, 1, 'truth');
    expect(Math.abs(zrFinding.correction.value - lastTruth)).toBeLessThan(3 * zrFinding.correction.sigma);
    expect(Math.abs(zrFinding.correction.value - 1.02)).toBeLessThan(0.006);

    // The fit's linearised σ alone (the first pass) understates Al2O3's error: built true, it
    // lands more than 3 of those σ from its true thickness in a run where the fit would have used
    // it (σ ≤ 1 %), while the widened σ covers every run.
    const alLayers = history.map((r) => ({
      truth: elementAt(r.truth, 2, 'truth'),
      layer: elementAt(r.layers, 2, 'layers'),
    }));
    const naiveMisses = alLayers.filter(
      ({ truth, layer }) =>
        layer.fitFactorSigma! <= IDENTIFIABLE_MAX_FACTOR_SIGMA &&
        Math.abs(layer.factor - truth) > 3 * layer.fitFactorSigma!,
    );
    expect(naiveMisses.length).toBeGreaterThan(0);
    for (const { truth, layer } of alLayers) {
      expect(Math.abs(layer.factor - truth)).toBeLessThan(3 * layer.factorSigma!);
    }
  });

  it('refuses a bad factor range or a material list of the wrong length', () => {
    const measured = {
      quantity: 'R' as const,
      wavelengthsNm: WAVELENGTHS,
      valuesPercent: WAVELENGTHS.map(() => 1),
    };
    expect(() =>
      diagnoseRun(stack([1, 1, 1, 1]), MASK, measured, IDS, { factorRange: [1.3, 0.7], maxIterations: 5 }),
    ).toThrow(OpticsInputError);
    expect(() =>
      diagnoseRun(stack([1, 1, 1, 1]), MASK, measured, [1, 2], { factorRange: [0.7, 1.3], maxIterations: 5 }),
    ).toThrow(OpticsInputError);
  });
});
