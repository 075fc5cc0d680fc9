/*
 * The fast kernel against the plain complex.js implementation, and physical properties that hold for
 * any stack (energy conservation, reciprocity, s = p at normal incidence), on seeded random stacks.
 */
import { describe, expect, it } from 'vitest';
import { elementAt } from '../checked.js';
import { constantStack, randomLayers, seededRandom, type RandomLayer } from './__tests__/random.js';
import { calculateSpectrum } from './batch.js';
import { referenceResponse } from './reference.js';

const deg = Math.PI / 180;

describe('reference implementation', () => {
  it('gives the Fresnel equations for a bare interface', () => {
    // Hecht, Optics, ch. 4, Fresnel equations (r_p here is the tangential-field ratio, −Hecht's r_p).
    const ti = 30 * deg;
    const tt = Math.asin(Math.sin(ti) / 1.7);
    const rs = (Math.cos(ti) - 1.7 * Math.cos(tt)) / (Math.cos(ti) + 1.7 * Math.cos(tt));
    const rp = (1.7 * Math.cos(ti) - Math.cos(tt)) / (1.7 * Math.cos(ti) + Math.cos(tt));
    const base = {
      incident: { n: 1, k: 0 },
      layers: [],
      exit: { n: 1.7, k: 0 },
      wavelengthNm: 500,
      angleDeg: 30,
    };
    const s = referenceResponse({ ...base, polarisation: 's' });
    const p = referenceResponse({ ...base, polarisation: 'p' });
    expect(s.r.re).toBeCloseTo(rs, 14);
    expect(p.r.re).toBeCloseTo(-rp, 14);
    expect(s.R + s.T).toBeCloseTo(1, 14);
    expect(s.A).toBeCloseTo(0, 14);
  });

  it('gives the quarter-wave formula (Macleod ch. 2)', () => {
    const res = referenceResponse({
      incident: { n: 1, k: 0 },
      layers: [{ n: 1.38, k: 0, thicknessNm: 550 / (4 * 1.38) }],
      exit: { n: 1.52, k: 0 },
      wavelengthNm: 550,
      angleDeg: 0,
      polarisation: 's',
    });
    expect(res.R).toBeCloseTo(0.012601, 6);
  });
});

interface Case {
  n0: number;
  layers: RandomLayer[];
  sub: { n: number; k: number };
  wavelengthNm: number;
  angleDeg: number;
}

function randomCases(seed: number, count: number, absorbing: number): Case[] {
  const rand = seededRandom(seed);
  return Array.from({ length: count }, () => ({
    // Incident media up to 1.8 against substrates from 1.0 reach total internal reflection too.
    n0: 1 + 0.8 * rand(),
    layers: randomLayers(rand, { absorbing, maxK: 1.5, maxLayers: 12, substrateK: 0 }),
    sub: { n: 1 + 2.5 * rand(), k: rand() < absorbing ? 0.5 * rand() : 0 },
    wavelengthNm: 300 + 1000 * rand(),
    angleDeg: 89 * rand(),
  }));
}

function engine(c: Case) {
  return calculateSpectrum(
    constantStack(c.n0, c.layers, c.sub),
    { wavelengthsNm: [c.wavelengthNm], anglesDeg: [c.angleDeg], polarisations: ['s', 'p'] },
    { amplitudes: true },
  );
}

describe('fast kernel against the complex.js reference', () => {
  it('agrees to 1e-12 on random absorbing stacks (R, T, A, r, t; s and p)', () => {
    let worst = 0;
    for (const c of randomCases(20261201, 400, 0.6)) {
      const fast = engine(c);
      (['s', 'p'] as const).forEach((polarisation, i) => {
        const ref = referenceResponse({
          incident: { n: c.n0, k: 0 },
          layers: c.layers,
          exit: c.sub,
          wavelengthNm: c.wavelengthNm,
          angleDeg: c.angleDeg,
          polarisation,
        });
        const r = fast.r as Float64Array;
        const t = fast.t as Float64Array;
        const diffs = [
          elementAt(fast.R, i, 'R') - ref.R,
          elementAt(fast.T, i, 'T') - ref.T,
          // The reference's A comes from the net power flow Re(BC*), the kernel's from 1 − R − T:
          // agreement is energy conservation checked independently.
          elementAt(fast.A, i, 'A') - ref.A,
          elementAt(r, 2 * i, 'r') - ref.r.re,
          elementAt(r, 2 * i + 1, 'r') - ref.r.im,
          elementAt(t, 2 * i, 't') - ref.t.re,
          elementAt(t, 2 * i + 1, 't') - ref.t.im,
        ];
        for (const d of diffs) worst = Math.max(worst, Math.abs(d));
      });
    }
    expect(worst).toBeLessThan(1e-12);
  });
});

describe('physical properties on random stacks', () => {
  it('conserves energy: R + T + A = 1, A ≥ 0 with absorption, A = 0 without', () => {
    for (const c of randomCases(7, 300, 0.7)) {
      const res = engine(c);
      const lossless = c.sub.k === 0 && c.layers.every((l) => l.k === 0);
      for (let i = 0; i < 2; i++) {
        const A = elementAt(res.A, i, 'A');
        expect(elementAt(res.R, i, 'R') + elementAt(res.T, i, 'T') + A).toBeCloseTo(1, 14);
        expect(res.R[i]).toBeGreaterThanOrEqual(0);
        expect(res.T[i]).toBeGreaterThanOrEqual(0);
        if (lossless) expect(Math.abs(A)).toBeLessThan(1e-12);
        else expect(res.A[i]).toBeGreaterThan(-1e-14);
      }
    }
  });

  it('is reciprocal: T is the same from both sides, even with absorbing layers', () => {
    // Reciprocity (Lorentz; Macleod ch. 2): between lossless media the transmittance of any stack,
    // absorbing or not, is the same in both directions; reflectance in general is not.
    const rand = seededRandom(99);
    let reflectanceDiffers = false;
    for (let trial = 0; trial < 200; trial++) {
      const layers = randomLayers(rand, { absorbing: 0.5, maxK: 1, maxLayers: 10, substrateK: 0 });
      const n0 = 1 + 0.5 * rand();
      const ns = 1.3 + 1.2 * rand();
      const angle = 80 * rand();
      const sinInside = (n0 * Math.sin(angle * deg)) / ns;
      const wl = 400 + 600 * rand();
      const forward = calculateSpectrum(constantStack(n0, layers, { n: ns, k: 0 }), {
        wavelengthsNm: [wl],
        anglesDeg: [angle],
        polarisations: ['s', 'p'],
      });
      const backward = calculateSpectrum(constantStack(ns, [...layers].reverse(), { n: n0, k: 0 }), {
        wavelengthsNm: [wl],
        anglesDeg: [Math.asin(sinInside) / deg],
        polarisations: ['s', 'p'],
      });
      for (let i = 0; i < 2; i++) {
        expect(backward.T[i]).toBeCloseTo(elementAt(forward.T, i, 'forward T'), 12);
        const rDifference = elementAt(backward.R, i, 'backward R') - elementAt(forward.R, i, 'forward R');
        if (Math.abs(rDifference) > 1e-3) reflectanceDiffers = true;
      }
    }
    expect(reflectanceDiffers).toBe(true);
  });

  it('gives s = p at normal incidence', () => {
    for (const c of randomCases(3, 200, 0.5)) {
      const res = engine({ ...c, angleDeg: 0 });
      const r = res.r as Float64Array;
      const t = res.t as Float64Array;
      expect(res.R[1]).toBeCloseTo(elementAt(res.R, 0, 'R'), 14);
      expect(res.T[1]).toBeCloseTo(elementAt(res.T, 0, 'T'), 14);
      expect(r[2]).toBeCloseTo(elementAt(r, 0, 'r'), 13);
      expect(r[3]).toBeCloseTo(elementAt(r, 1, 'r'), 13);
      expect(t[2]).toBeCloseTo(elementAt(t, 0, 't'), 13);
      expect(t[3]).toBeCloseTo(elementAt(t, 1, 't'), 13);
    }
  });
});
