import { describe, expect, it } from 'vitest';
import {
  DEFAULT_CALIBRATION_SETTINGS,
  calibrationCause,
  calibrationFindings,
  scatterBetweenRuns,
  suggestedToolingFactor,
  trackCalibration,
  weightedMean,
  type Measured,
} from './calibration.js';
import { elementAt } from './checked.js';
import { Mulberry32, fillDeviates } from './optimise/random.js';

/** Normal deviates from a fixed seed (the product's own Mulberry32 + Box–Muller). */
function deviates(count: number, seed: number): Float64Array {
  return fillDeviates(new Float64Array(count), count, new Mulberry32(seed), 'normal');
}

function series(truth: (k: number) => number, sigma: number, runs: number, seed: number): Measured[] {
  const noise = deviates(runs, seed);
  return Array.from({ length: runs }, (_, k) => ({
    value: truth(k) + sigma * elementAt(noise, k, 'noise'),
    sigma,
  }));
}

describe('weightedMean', () => {
  it('is the inverse-variance mean with σ = 1/√Σw (Press et al., Numerical Recipes, 3rd ed., §14.1)', () => {
    const m = weightedMean([
      { value: 1.0, sigma: 0.01 },
      { value: 1.03, sigma: 0.02 },
    ]);
    // w = 10000 and 2500: (10000·1 + 2500·1.03)/12500 = 1.006; σ = 1/√12500 = 0.0089443.
    expect(m.value).toBeCloseTo(1.006, 12);
    expect(m.sigma).toBeCloseTo(0.0089443, 6);
  });

  it('rejects an empty list and a zero σ', () => {
    expect(() => weightedMean([])).toThrow(/no values/);
    expect(() => weightedMean([{ value: 1, sigma: 0 }])).toThrow(/σ > 0/);
  });
});

describe('scatterBetweenRuns', () => {
  it('recovers an unstated run-to-run scatter from the median moving range (Montgomery, SQC 7th ed., §6.4)', () => {
    // 400 runs of pure scatter 0.5 % with a stated σ of 0.1 %: total σ = √(0.5² + 0.1²) %.
    const noise = deviates(400, 7);
    const s = Array.from({ length: 400 }, (_, k) => ({
      value: 1 + 0.005 * elementAt(noise, k, 'noise'),
      sigma: 0.001,
    }));
    const tau = scatterBetweenRuns(s);
    // Expected √(0.005² − 0.001²) = 0.0049; 10 % allowed for 400 runs.
    expect(tau).toBeGreaterThan(0.0049 * 0.9);
    expect(tau).toBeLessThan(0.0049 * 1.1);
  });

  it('is 0 when the stated uncertainties already cover the scatter', () => {
    const s = series(() => 1, 0.002, 50, 3).map((p) => ({ ...p, sigma: 0.004 }));
    expect(scatterBetweenRuns(s)).toBe(0);
  });
});

describe('trackCalibration', () => {
  it('recovers a constant 2 % offset within 2σ of its stated uncertainty', () => {
    for (const seed of [1, 2, 3, 4, 5]) {
      const tracked = trackCalibration(series(() => 1.02, 0.003, 12, seed));
      const last = elementAt(tracked, tracked.length - 1, 'tracked');
      expect(Math.abs(last.estimate - 1.02)).toBeLessThan(2 * last.estimateSigma);
      expect(last.estimateSigma).toBeLessThan(0.003);
    }
  });

  it('follows a slow drift of 2 % over 12 runs without lag: level and drift within 2σ', () => {
    const slope = 0.02 / 11;
    for (const seed of [11, 12, 13, 14, 15]) {
      const tracked = trackCalibration(series((k) => 1 + slope * k, 0.003, 12, seed));
      const last = elementAt(tracked, 11, 'tracked');
      expect(Math.abs(last.estimate - 1.02)).toBeLessThan(2 * last.estimateSigma);
      expect(Math.abs(last.driftPerRun - slope)).toBeLessThan(2 * last.driftSigma);
    }
  });

  it('marks a single wild run out of control and moves the estimate by a bounded amount (Huber ψ)', () => {
    const s = series(() => 1, 0.003, 12, 21);
    s[7] = { value: 1.08, sigma: 0.003 };
    const tracked = trackCalibration(s);
    const p = elementAt(tracked, 7, 'tracked');
    expect(p.outOfControl).toBe(true);
    expect(tracked.filter((q) => q.outOfControl)).toHaveLength(1);
    // Unclipped, the Kalman gain would pull the level most of the way to 1.08.
    expect(Math.abs(p.estimate - 1)).toBeLessThan(0.01);
    expect(Math.abs(elementAt(tracked, 11, 'tracked').estimate - 1)).toBeLessThan(0.01);
    // The limits bracket the prediction symmetrically at 3σ.
    expect(p.predicted).not.toBeNull();
    expect((p.limitHigh! - p.predicted!) / (p.predicted! - p.limitLow!)).toBeCloseTo(1, 12);
  });

  it('weighs a run by its uncertainty: an uncertain run moves the estimate less', () => {
    const base = series(() => 1, 0.002, 6, 5);
    const sure = trackCalibration([...base, { value: 1.006, sigma: 0.002 }]);
    const unsure = trackCalibration([...base, { value: 1.006, sigma: 0.02 }]);
    const shift = (t: ReturnType<typeof trackCalibration>) =>
      elementAt(t, 6, 'tracked').estimate - elementAt(t, 5, 'tracked').estimate;
    expect(shift(sure)).toBeGreaterThan(3 * shift(unsure));
  });
});

describe('calibrationCause and calibrationFindings', () => {
  const settings = DEFAULT_CALIBRATION_SETTINGS;
  it('calls all materials off by the same factor a common (monitor or geometry) cause', () => {
    expect(
      calibrationCause(
        [
          { value: 1.021, sigma: 0.003 },
          { value: 1.018, sigma: 0.004 },
        ],
        1,
      ),
    ).toBe('common');
  });

  it('calls one material off on its own a material cause, and none when within the threshold', () => {
    const f = [
      { value: 1.021, sigma: 0.003 },
      { value: 1.001, sigma: 0.003 },
    ];
    expect(calibrationCause(f, 1)).toBe('material');
    expect(calibrationCause([{ value: 1.004, sigma: 0.001 }], 1)).toBe('none');
  });

  it('suggests per-material factors only for the material that moved', () => {
    const findings = calibrationFindings(
      [
        { materialId: 1, runs: 12, correction: { value: 1.019, sigma: 0.002 } },
        { materialId: 2, runs: 12, correction: { value: 1.002, sigma: 0.002 } },
      ],
      settings,
    );
    expect(findings).toEqual([
      { kind: 'material', materialId: 1, correction: { value: 1.019, sigma: 0.002 } },
    ]);
  });

  it('suggests one common cause when every material moved together', () => {
    const findings = calibrationFindings(
      [
        { materialId: 1, runs: 12, correction: { value: 1.019, sigma: 0.002 } },
        { materialId: 2, runs: 12, correction: { value: 1.021, sigma: 0.002 } },
      ],
      settings,
    );
    expect(findings).toHaveLength(1);
    const finding = elementAt(findings, 0, 'findings');
    expect(finding.kind).toBe('common');
    expect(finding.correction.value).toBeCloseTo(1.02, 12);
  });

  it('suggests one common cause when most recent runs showed the same factor for all materials', () => {
    const estimates = [
      { materialId: 1, runs: 8, correction: { value: 1.0197, sigma: 0.0011 } },
      { materialId: 2, runs: 8, correction: { value: 1.0276, sigma: 0.0025 } },
    ];
    // The estimates alone differ by more than 2σ and half the threshold: per material.
    expect(calibrationFindings(estimates, settings).map((f) => f.kind)).toEqual(['material', 'material']);
    const runs = ['common', 'common', 'material', 'common'] as const;
    expect(calibrationFindings(estimates, settings, runs).map((f) => f.kind)).toEqual(['common']);
    // Not when one material did not move at all.
    const one = [
      elementAt(estimates, 0, 'estimates'),
      { materialId: 2, runs: 8, correction: { value: 1.001, sigma: 0.001 } },
    ];
    expect(calibrationFindings(one, settings, runs).map((f) => f.kind)).toEqual(['material']);
  });

  it('suggests nothing below the threshold, inside 2σ, or before minRuns runs', () => {
    const one = (value: number, sigma: number, runs: number) =>
      calibrationFindings([{ materialId: 1, runs, correction: { value, sigma } }], settings);
    expect(one(1.009, 0.001, 12)).toEqual([]);
    expect(one(1.02, 0.011, 12)).toEqual([]);
    expect(one(1.02, 0.001, 3)).toEqual([]);
    expect(one(1.02, 0.001, 4)).toHaveLength(1);
  });

  it('rounds a suggested tooling factor to 4 decimals', () => {
    expect(suggestedToolingFactor(0.95, 1.0213)).toBe(0.9702);
  });
});
