import { describe, expect, it } from 'vitest';
import { JOB_WORK_LIMITS, jobWork, maskSamples, overBudget, tooManyActiveJobs } from './budgets.js';

describe('work budgets of the compute queue', () => {
  it('counts mask samples per band with both ends included (common practice (no source))', () => {
    // 420–680 nm at 1 nm is 261 wavelengths; three angles make 783 samples.
    expect(maskSamples([{ from_nm: 420, to_nm: 680, step_nm: 1, angles_deg: [0, 15, 30] }])).toBe(783);
    // A single wavelength is one sample; 400–405 at 2 nm samples 400, 402, 404 and 405.
    expect(maskSamples([{ from_nm: 550, to_nm: 550 }])).toBe(1);
    expect(maskSamples([{ from_nm: 400, to_nm: 405, step_nm: 2 }])).toBe(4);
  });

  it('estimates layer-evaluations as the product of the job dimensions', () => {
    expect(jobWork('analysis', { layers: 20, samples: 1000 * 91 }).work).toBe(20 * 91_000 * 2);
    expect(jobWork('fit', { layers: 8, samples: 783, iterations: 100 }).work).toBe(100 * 9 * 8 * 783 * 2);
    expect(jobWork('yield', { layers: 4, samples: 783, trials: 10_000, sensitivityTrials: 1000 }).work).toBe(
      4 * 783 * 2 * (10_000 + 1000 * 4),
    );
  });

  it('lets the usual jobs through and refuses oversized ones with the limit in the message', () => {
    expect(
      overBudget('yield', { layers: 12, samples: 301, trials: 10_000, sensitivityTrials: 1000 }),
    ).toBeNull();
    expect(overBudget('fit', { layers: 8, samples: 783, iterations: 100 })).toBeNull();
    // 100 000 trials of a 400-layer stack: 400 × 783 × 2 × (100 000 + 1000 × 400) ≈ 3.1e11.
    const message = overBudget('yield', {
      layers: 400,
      samples: 783,
      trials: 100_000,
      sensitivityTrials: 1000,
    });
    expect(message).toMatch(/^This Yield forecast needs about 3\.1e\+11 layer-evaluations/);
    expect(message).toContain(`at most ${JOB_WORK_LIMITS.yield.toExponential(1)}`);
    expect(overBudget('fit', { layers: 400, samples: 783, iterations: 1000 })).toMatch(/Fit to mask/);
  });

  it('states the per-user limit of active jobs', () => {
    expect(tooManyActiveJobs(4)).toMatch(
      /You already have 4 calculations queued or running; at most 4 per user/,
    );
  });
});
