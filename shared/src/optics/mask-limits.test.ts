import { describe, expect, it } from 'vitest';
import { elementAt } from '../checked.js';
import { Mulberry32 } from '../optimise/random.js';
import { OpticsInputError } from './errors.js';
import {
  MAX_BAND_ANGLES,
  MAX_MASK_BANDS,
  MAX_MASK_SAMPLES,
  validateSpecMask,
  type LimitBand,
} from './mask.js';

/** Readable reference: every pair of bands, as the rule reads (quadratic). */
function referenceHasContradiction(bands: LimitBand[]): boolean {
  const allowedOf = (b: LimitBand): [number, number] =>
    b.max_percent !== undefined
      ? [0, b.max_percent]
      : b.min_percent !== undefined
        ? [b.min_percent, 100]
        : [
            (b.target_percent ?? 0) - (b.tolerance_percent ?? 0),
            (b.target_percent ?? 0) + (b.tolerance_percent ?? 0),
          ];
  for (let j = 0; j < bands.length; j++)
    for (let i = 0; i < j; i++) {
      const a = elementAt(bands, i, 'bands');
      const b = elementAt(bands, j, 'bands');
      if ((a.polarisation ?? 'avg') !== (b.polarisation ?? 'avg')) continue;
      if (Math.max(a.from_nm, b.from_nm) > Math.min(a.to_nm, b.to_nm)) continue;
      if (!(a.angles_deg ?? [0]).some((x) => (b.angles_deg ?? [0]).includes(x))) continue;
      const [aLo, aHi] = allowedOf(a);
      const [bLo, bHi] = allowedOf(b);
      if (a.quantity === b.quantity && Math.max(aLo, bLo) > Math.min(aHi, bHi)) return true;
      if (a.quantity !== b.quantity && aLo + bLo > 100) return true;
    }
  return false;
}

function randomBand(next: () => number): LimitBand {
  const from = 400 + Math.floor(next() * 300);
  const to = from + Math.floor(next() * 80);
  const kind = next();
  const band: LimitBand = {
    from_nm: from,
    to_nm: to,
    quantity: next() < 0.5 ? 'R' : 'T',
    angles_deg: next() < 0.5 ? [0] : [0, 30],
    polarisation: next() < 0.8 ? 'avg' : 's',
    step_nm: 5,
  };
  if (kind < 0.4) band.max_percent = Math.round(next() * 100);
  else if (kind < 0.8) band.min_percent = Math.round(next() * 100);
  else {
    band.target_percent = Math.round(next() * 100);
    band.tolerance_percent = 1 + Math.round(next() * 10);
  }
  return band;
}

describe('spec mask consistency check (sweep) and limits', () => {
  it('finds a contradiction exactly when the pairwise reference does, on 400 random masks', () => {
    const rng = new Mulberry32(20261202);
    const next = () => rng.nextOpenUnit();
    let contradictory = 0;
    for (let trial = 0; trial < 400; trial++) {
      const bands = Array.from({ length: 2 + Math.floor(next() * 12) }, () => randomBand(next));
      const expected = referenceHasContradiction(bands);
      let found = false;
      try {
        validateSpecMask({ bands });
      } catch (err) {
        expect(err).toBeInstanceOf(OpticsInputError);
        expect((err as Error).message).toMatch(/contradicts bands\[\d+\]/);
        found = true;
      }
      expect(found, JSON.stringify(bands)).toBe(expected);
      if (expected) contradictory++;
    }
    // Both outcomes occur often enough for the comparison to mean something.
    expect(contradictory).toBeGreaterThan(40);
    expect(contradictory).toBeLessThan(360);
  });

  it(`accepts ${MAX_MASK_BANDS} consistent bands and refuses one more, naming the limit`, () => {
    const bands = Array.from({ length: MAX_MASK_BANDS }, (_, i) => ({
      from_nm: 400 + i * 0.02,
      to_nm: 400 + i * 0.02 + 1,
      quantity: 'R',
      max_percent: 1,
      step_nm: 1,
    }));
    expect(validateSpecMask({ bands }).bands).toHaveLength(MAX_MASK_BANDS);
    expect(() => validateSpecMask({ bands: [...bands, bands[0]] })).toThrow(
      `holds ${MAX_MASK_BANDS + 1} bands; a mask has at most ${MAX_MASK_BANDS}`,
    );
  });

  it('refuses too many angles in a band and too many samples in a mask', () => {
    const angles = Array.from({ length: MAX_BAND_ANGLES + 1 }, (_, i) => i * 0.5);
    expect(() =>
      validateSpecMask({
        bands: [{ from_nm: 500, to_nm: 600, quantity: 'R', max_percent: 1, angles_deg: angles }],
      }),
    ).toThrow(`a band has at most ${MAX_BAND_ANGLES}`);
    // 400–1300 nm at 0.01 nm is 90 001 wavelengths; at 30 angles that is 2 700 030 samples.
    const dense = { from_nm: 400, to_nm: 1300, step_nm: 0.01, quantity: 'R', max_percent: 1 };
    const thirty = Array.from({ length: 30 }, (_, i) => i);
    expect(() => validateSpecMask({ bands: [{ ...dense, angles_deg: thirty }] })).toThrow(
      `sample 2700030 wavelength-angle points; a mask has at most ${MAX_MASK_SAMPLES}`,
    );
  });
});
