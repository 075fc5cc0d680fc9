import { describe, expect, it } from 'vitest';
import { elementAt } from '../checked.js';
import { createMaskMerit } from '../optimise/merit.js';
import { constantIndex as c } from './dispersion.js';
import { OpticsInputError } from './errors.js';
import {
  bandDesignMargin,
  bandDesignRange,
  bandMargin,
  evaluateMask,
  expandAngleRange,
  maskGrid,
  validateSpecMask,
} from './mask.js';
import type { OpticalStack } from './stack.js';

// Bare glass of constant index: R = ((1 − 1.52)/(1 + 1.52))² = 4.2580 % at normal incidence (Hecht ch. 4).
const glass: OpticalStack = { incident: c(1), layers: [], substrate: c(1.52), backLayers: [], exit: c(1) };
const R_GLASS = 100 * (0.52 / 2.52) ** 2;
const band = { from_nm: 500, to_nm: 500, quantity: 'R' as const, max_percent: 5 };

function problem(input: unknown): OpticsInputError {
  try {
    validateSpecMask(input);
  } catch (err) {
    if (err instanceof OpticsInputError) return err;
    throw err;
  }
  throw new Error('expected the mask to be rejected');
}

describe('angle ranges', () => {
  // An arithmetic progression from..to with both ends included (the band's own definition).
  it('expands 0–20° every 5° to 0, 5, 10, 15, 20 and keeps the end off the step', () => {
    expect(expandAngleRange({ from: 0, to: 20, step: 5 })).toEqual([0, 5, 10, 15, 20]);
    expect(expandAngleRange({ from: 0, to: 20, step: 6 })).toEqual([0, 6, 12, 18, 20]);
    expect(expandAngleRange({ from: 10, to: 10, step: 5 })).toEqual([10]);
    // 0.1° steps: 0.30000000000000004 must not appear (IEEE 754 sum of 0.1 + 0.2).
    expect(expandAngleRange({ from: 0, to: 0.3, step: 0.1 })).toEqual([0, 0.1, 0.2, 0.3]);
  });

  it('a range band is checked at every angle of the range and keeps its range form', () => {
    const mask = validateSpecMask({
      bands: [{ ...band, angle_from_deg: 0, angle_to_deg: 20, angle_step_deg: 5 }],
    });
    expect(mask.bands[0]).toMatchObject({
      angles_deg: [0, 5, 10, 15, 20],
      angle_from_deg: 0,
      angle_to_deg: 20,
      angle_step_deg: 5,
    });
    expect(maskGrid(mask).anglesDeg).toEqual([0, 5, 10, 15, 20]);
    expect(elementAt(evaluateMask(mask, glass).bands, 0, 'band results').samples).toBe(5);
    // The normalised band validates again unchanged (stored masks are re-checked on read).
    expect(validateSpecMask({ bands: mask.bands }).bands).toEqual(mask.bands);
  });

  it('angle lists stay lists', () => {
    const mask = validateSpecMask({ bands: [{ ...band, angles_deg: [0, 10, 20] }] });
    expect(elementAt(mask.bands, 0, 'mask bands').angles_deg).toEqual([0, 10, 20]);
    expect(mask.bands[0]).not.toHaveProperty('angle_from_deg');
  });

  it.each([
    [
      { angle_from_deg: 0, angle_to_deg: 20 },
      'bands[0].angle_step_deg',
      /needs angle_from_deg, angle_to_deg and angle_step_deg/,
    ],
    [
      { angle_from_deg: 30, angle_to_deg: 20, angle_step_deg: 5 },
      'bands[0].angle_from_deg',
      /must not exceed angle_to_deg/,
    ],
    [{ angle_from_deg: 0, angle_to_deg: 20, angle_step_deg: 0 }, 'bands[0].angle_step_deg', /greater than 0/],
    [{ angle_from_deg: 0, angle_to_deg: 95, angle_step_deg: 5 }, 'bands[0].angle_to_deg', /below 90/],
    [{ angle_from_deg: 0, angle_to_deg: 89, angle_step_deg: 0.5 }, 'bands[0].angle_step_deg', /at most 91/],
    [
      { angle_from_deg: 0, angle_to_deg: 20, angle_step_deg: 5, angles_deg: [0, 10, 20] },
      'bands[0].angles_deg',
      /either an angle list or an angle range, not both \(the range gives 0, 5, 10, 15, 20°\)/,
    ],
  ])('rejects %j naming %s', (extra, field, message) => {
    const err = problem({ bands: [{ ...band, ...extra }] });
    expect(err.field).toBe(field);
    expect(err.message).toMatch(message);
  });
});

describe('band margins', () => {
  it('the design target lies the margin inside the customer limit, for every kind of bound', () => {
    expect(bandDesignRange({ ...band, margin_percent: 0.5 })).toEqual([0, 4.5]);
    expect(
      bandDesignRange({ from_nm: 500, to_nm: 500, quantity: 'T', min_percent: 95, margin_percent: 1 }),
    ).toEqual([96, 100]);
    expect(
      bandDesignRange({
        from_nm: 500,
        to_nm: 500,
        quantity: 'R',
        target_percent: 50,
        tolerance_percent: 2,
        margin_percent: 0.5,
      }),
    ).toEqual([48.5, 51.5]);
  });

  it('compliance is judged on the customer limit; the design margin is that less the band margin', () => {
    const mask = validateSpecMask({ bands: [{ ...band, max_percent: 4.5, margin_percent: 0.5 }] });
    const result = evaluateMask(mask, glass);
    // Glass at 4.258 % passes the customer's 4.5 % …
    expect(result.pass).toBe(true);
    expect(result.worstMargin).toBeCloseTo(4.5 - R_GLASS, 10);
    const limited = elementAt(mask.bands, 0, 'mask bands');
    expect(bandMargin(limited, R_GLASS)).toBeCloseTo(4.5 - R_GLASS, 10);
    // … but not the design target of 4.0 %.
    expect(bandDesignMargin(limited, R_GLASS)).toBeCloseTo(4.0 - R_GLASS, 10);
  });

  it('optimisers aim at the design target: the residual counts what exceeds limit − margin', () => {
    const mask = { bands: [{ ...band, max_percent: 4.5, margin_percent: 0.5 }] };
    const merit = createMaskMerit(glass, mask);
    merit.compute([]);
    const out = new Float64Array(merit.sampleCount);
    // One sample: residual R − 4.0 with margin, none against the customer's 4.5 % alone.
    expect(merit.residualsOf(out, true)).toBeCloseTo((R_GLASS - 4.0) ** 2, 10);
    expect(merit.residualsOf(out, false)).toBe(0);
    expect(merit.worstMarginOf()).toBeCloseTo(4.5 - R_GLASS, 10);
    // The run's own margin applies where it is the larger one.
    const wider = createMaskMerit(glass, mask, { marginPercent: 0.8 });
    wider.compute([]);
    expect(wider.residualsOf(out, true)).toBeCloseTo((R_GLASS - 3.7) ** 2, 10);
  });

  it.each([
    [{ margin_percent: -0.1 }, /0 or more/],
    [{ max_percent: 0.2, margin_percent: 0.5 }, /puts the design target outside 0–100 % \(R ≤ -0\.3 %\)$/],
    [{ max_percent: 0.5, margin_percent: 0.6 }, /\(R ≤ -0\.1 %\)$/],
    [
      { max_percent: undefined, target_percent: 50, tolerance_percent: 1, margin_percent: 1 },
      /less than tolerance_percent/,
    ],
    [{ margin_percent: 'a lot' }, /finite number/],
  ])('rejects the margin in %j', (extra, message) => {
    const err = problem({ bands: [{ ...band, ...extra }] });
    expect(err.field).toBe('bands[0].margin_percent');
    expect(err.message).toMatch(message);
  });
});
