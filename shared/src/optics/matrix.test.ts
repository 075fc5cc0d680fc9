import { describe, expect, it } from 'vitest';
import { elementAt } from '../checked.js';
import { calculateSpectrum, responseAt } from './batch.js';
import { constantIndex } from './dispersion.js';
import type { Layer, OpticalStack } from './stack.js';

const c = constantIndex;
const deg = Math.PI / 180;

function stack(n0: number, layers: [n: number, k: number, d: number][], ns: number, ks = 0): OpticalStack {
  return {
    incident: c(n0),
    layers: layers.map(([n, k, d]): Layer => ({ material: c(n, k), thicknessNm: d })),
    substrate: c(ns, ks),
    backLayers: [],
    exit: c(n0),
  };
}

describe('single interface', () => {
  it('gives the Fresnel reflectance at normal incidence', () => {
    // Hecht, Optics, ch. 4: R = ((n1 − n2)/(n1 + n2))²; air → 1.52 is 0.042580.
    const res = responseAt(stack(1, [], 1.52), 550, 0, 's');
    expect(res.R).toBeCloseTo(((1 - 1.52) / (1 + 1.52)) ** 2, 14);
    expect(res.R).toBeCloseTo(0.04258, 6);
    expect(res.T).toBeCloseTo(1 - 0.04258, 6);
    // r = (n1 − n2)/(n1 + n2), real and negative for a denser second medium.
    expect(res.r?.[0]).toBeCloseTo(-0.52 / 2.52, 14);
    expect(res.r?.[1]).toBeCloseTo(0, 14);
  });

  it('follows the oblique Fresnel equations with the Snell angle', () => {
    // Hecht, Optics, ch. 4 (Fresnel equations) with n1 sin θi = n2 sin θt (Snell).
    const n1 = 1;
    const n2 = 1.52;
    for (const angle of [20, 45, 70, 85]) {
      const ti = angle * deg;
      const tt = Math.asin((n1 * Math.sin(ti)) / n2);
      const rs = (n1 * Math.cos(ti) - n2 * Math.cos(tt)) / (n1 * Math.cos(ti) + n2 * Math.cos(tt));
      const rp = (n2 * Math.cos(ti) - n1 * Math.cos(tt)) / (n2 * Math.cos(ti) + n1 * Math.cos(tt));
      const s = responseAt(stack(n1, [], n2), 600, angle, 's');
      const p = responseAt(stack(n1, [], n2), 600, angle, 'p');
      expect(s.R).toBeCloseTo(rs * rs, 14);
      expect(p.R).toBeCloseTo(rp * rp, 14);
      expect(s.r?.[0]).toBeCloseTo(rs, 14);
      // The engine's r_p is the ratio of tangential E (r_p = r_s at normal incidence): −Hecht's r_p.
      expect(p.r?.[0]).toBeCloseTo(-rp, 14);
      expect(s.T).toBeCloseTo(1 - rs * rs, 14);
      expect(p.T).toBeCloseTo(1 - rp * rp, 14);
    }
  });

  it('has Rp = 0 at Brewster’s angle', () => {
    // Hecht ch. 4: tan θB = n2/n1; air → 1.52 gives 56.659°.
    const brewster = Math.atan(1.52) / deg;
    expect(brewster).toBeCloseTo(56.659, 3);
    expect(responseAt(stack(1, [], 1.52), 550, brewster, 'p').R).toBeLessThan(1e-28);
    expect(responseAt(stack(1, [], 1.52), 550, brewster - 2, 'p').R).toBeGreaterThan(1e-4);
    // Rs there from the Fresnel equations (Hecht ch. 4): with θi + θt = 90°, r_s = −sin(θi − θt).
    const ti = brewster * deg;
    expect(responseAt(stack(1, [], 1.52), 550, brewster, 's').R).toBeCloseTo(
      Math.sin(ti - (90 * deg - ti)) ** 2,
      13,
    );
  });

  it('reflects totally beyond the critical angle', () => {
    // Born & Wolf, total reflection: 1.52 → air, critical angle arcsin(1/1.52) = 41.140°.
    const critical = Math.asin(1 / 1.52) / deg;
    expect(critical).toBeCloseTo(41.14, 3);
    for (const pol of ['s', 'p'] as const) {
      for (const angle of [41.2, 50, 70, 89]) {
        const res = responseAt(stack(1.52, [], 1), 633, angle, pol);
        expect(res.R).toBeCloseTo(1, 14);
        expect(res.T).toBe(0);
      }
      expect(responseAt(stack(1.52, [], 1), 633, 41.0, pol).R).toBeLessThan(0.9);
    }
    // Phase of r_s under TIR (Fresnel with cos θt = i√(n1² sin²θ − n2²)/n2, exp(−iωt)):
    // r_s = (q1 − iκ)/(q1 + iκ), arg r_s = −2 atan(κ/q1).
    const theta = 60 * deg;
    const q1 = 1.52 * Math.cos(theta);
    const kappa = Math.sqrt((1.52 * Math.sin(theta)) ** 2 - 1);
    const r = responseAt(stack(1.52, [], 1), 633, 60, 's').r ?? [NaN, NaN];
    expect(Math.atan2(r[1], r[0])).toBeCloseTo(-2 * Math.atan(kappa / q1), 13);
  });

  it('keeps 0 ≤ R, T, A ≤ 1 and R + T + A = 1 under total internal reflection despite rounding', () => {
    // Energy conservation (Born & Wolf §1.5): a lossless stack beyond the critical angle reflects
    // everything, R = 1, T = 0, A = 0; rounding alone used to give R = 1 + 6.7e-16 or A = −2e-13.
    const angles = Array.from({ length: 200 }, (_, i) => 41.2 + (48.7 * i) / 199);
    const wavelengths = Array.from({ length: 50 }, (_, i) => 400 + 12 * i);
    const lossless = stack(
      1.52,
      [
        [2.35, 0, 97],
        [1.46, 0, 143],
        [2.05, 0, 61],
      ],
      1,
    );
    const res = calculateSpectrum(lossless, {
      wavelengthsNm: wavelengths,
      anglesDeg: angles,
      polarisations: ['s', 'p'],
    });
    for (let i = 0; i < res.R.length; i++) {
      expect(res.R[i]).toBeLessThanOrEqual(1);
      expect(res.R[i]).toBeGreaterThan(1 - 1e-12);
      expect(res.T[i]).toBe(0);
      expect(res.A[i]).toBeGreaterThanOrEqual(0);
      expect(elementAt(res.R, i, 'R') + elementAt(res.T, i, 'T') + elementAt(res.A, i, 'A')).toBe(1);
    }
  });

  it('transmits evanescently through a thin gap (frustrated total reflection)', () => {
    // Glass–air gap–glass above the critical angle: T decays with gap thickness but is not zero,
    // and R + T = 1 (no loss). A thicker gap transmits less.
    const thin = responseAt(stack(1.52, [[1, 0, 50]], 1.52), 633, 60, 's');
    const thick = responseAt(stack(1.52, [[1, 0, 400]], 1.52), 633, 60, 's');
    expect(thin.T).toBeGreaterThan(0.1);
    expect(thick.T).toBeLessThan(thin.T / 10);
    expect(thin.R + thin.T).toBeCloseTo(1, 13);
    // Very thick gap: no overflow, T → 0, R → 1.
    const huge = responseAt(stack(1.52, [[1, 0, 1e6]], 1.52), 633, 60, 's');
    expect(huge.T).toBe(0);
    expect(huge.R).toBeCloseTo(1, 13);
  });
});

describe('single and double layers (Macleod, Thin-Film Optical Filters, 5th ed., ch. 2 and 4)', () => {
  const ref = 550;
  it('quarter-wave layer: R = ((n0·ns − n1²)/(n0·ns + n1²))²', () => {
    const res = responseAt(stack(1, [[1.38, 0, ref / (4 * 1.38)]], 1.52), ref, 0, 's');
    expect(res.R).toBeCloseTo(((1.52 - 1.38 ** 2) / (1.52 + 1.38 ** 2)) ** 2, 14);
    expect(res.R).toBeCloseTo(0.012601, 6); // Macleod ch. 2: MgF2-like 1.38 on 1.52
  });

  it('quarter-wave layer of n1 = √(n0·ns) reflects nothing', () => {
    const n1 = Math.sqrt(1.52);
    expect(n1).toBeCloseTo(1.2329, 4);
    expect(responseAt(stack(1, [[n1, 0, ref / (4 * n1)]], 1.52), ref, 0, 's').R).toBeLessThan(1e-30);
  });

  it('half-wave layer is absentee at the reference wavelength', () => {
    const bare = responseAt(stack(1, [], 1.52), ref, 0, 's').R;
    expect(responseAt(stack(1, [[2.35, 0, ref / (2 * 2.35)]], 1.52), ref, 0, 's').R).toBeCloseTo(bare, 15);
    // Off the reference wavelength it is not absentee.
    expect(
      Math.abs(responseAt(stack(1, [[2.35, 0, ref / (2 * 2.35)]], 1.52), 450, 0, 's').R - bare),
    ).toBeGreaterThan(0.01);
  });

  it('half-wave at oblique incidence is absentee when its thickness uses the Snell angle inside it', () => {
    // δ = 2π n d cos θ_layer / λ = π with n sin θ_layer = n0 sin θ0 (Snell; Macleod ch. 2).
    const n = 2.0;
    const angle = 45;
    const cosInside = Math.sqrt(1 - (Math.sin(angle * deg) / n) ** 2);
    const d = ref / (2 * n * cosInside);
    for (const pol of ['s', 'p'] as const) {
      const bare = responseAt(stack(1, [], 1.52), ref, angle, pol).R;
      expect(responseAt(stack(1, [[n, 0, d]], 1.52), ref, angle, pol).R).toBeCloseTo(bare, 14);
    }
  });

  it('two quarter-wave layers: R = ((n0·n2² − ns·n1²)/(n0·n2² + ns·n1²))², zero at the V-coat condition', () => {
    const n1 = 1.46;
    const n2 = 2.35;
    const res = responseAt(
      stack(
        1,
        [
          [n1, 0, ref / (4 * n1)],
          [n2, 0, ref / (4 * n2)],
        ],
        1.52,
      ),
      ref,
      0,
      's',
    );
    expect(res.R).toBeCloseTo(((n2 ** 2 - 1.52 * n1 ** 2) / (n2 ** 2 + 1.52 * n1 ** 2)) ** 2, 14);
    // V-coat: n2/n1 = √(ns/n0).
    const v1 = 1.38;
    const v2 = v1 * Math.sqrt(1.52);
    const vcoat = responseAt(
      stack(
        1,
        [
          [v1, 0, ref / (4 * v1)],
          [v2, 0, ref / (4 * v2)],
        ],
        1.52,
      ),
      ref,
      0,
      's',
    );
    expect(vcoat.R).toBeLessThan(1e-30);
    // The V-shaped minimum: reflectance rises either side.
    expect(
      responseAt(
        stack(
          1,
          [
            [v1, 0, ref / (4 * v1)],
            [v2, 0, ref / (4 * v2)],
          ],
          1.52,
        ),
        500,
        0,
        's',
      ).R,
    ).toBeGreaterThan(1e-4);
  });
});

describe('quarter-wave mirror (Macleod ch. 6)', () => {
  const nH = 2.35;
  const nL = 1.46;
  const ref = 1000;
  const mirror = (periods: number) => {
    const layers: [number, number, number][] = [];
    for (let i = 0; i < periods; i++) layers.push([nH, 0, ref / (4 * nH)], [nL, 0, ref / (4 * nL)]);
    layers.push([nH, 0, ref / (4 * nH)]);
    return stack(1, layers, 1.52);
  };

  it('(HL)^N H reflects R = ((1 − Y)/(1 + Y))² with Y = (nH/nL)^(2N)·nH²/ns', () => {
    const Y = (nH / nL) ** 8 * (nH ** 2 / 1.52);
    const res = responseAt(mirror(4), ref, 0, 's');
    expect(res.R).toBeCloseTo(((1 - Y) / (1 + Y)) ** 2, 14);
    expect(res.R).toBeCloseTo(0.975859, 6); // Macleod ch. 6, with nH 2.35, nL 1.46, N = 4
  });

  it('has the stop band of half-width (2/π)·arcsin((nH − nL)/(nH + nL)) in g = λ0/λ', () => {
    // Macleod ch. 6 gives the half-width Δg = (2/π) arcsin((nH − nL)/(nH + nL)) = 0.15010; the full
    // width is (4/π)·arcsin(…) = 0.30020.
    const half = (2 / Math.PI) * Math.asin((nH - nL) / (nH + nL));
    expect(2 * half).toBeCloseTo(0.3002, 4);
    const gs = [1 - 1.05 * half, 1 - 0.95 * half, 1 + 0.95 * half, 1 + 1.05 * half];
    const res = calculateSpectrum(mirror(40), {
      wavelengthsNm: gs.map((g) => ref / g),
      anglesDeg: [0],
      polarisations: ['s'],
    });
    expect(res.R[1]).toBeGreaterThan(0.9999);
    expect(res.R[2]).toBeGreaterThan(0.9999);
    expect(res.R[0]).toBeLessThan(0.5);
    expect(res.R[3]).toBeLessThan(0.5);
  });

  it('stays finite for a very long stack', () => {
    // 2000 layers of high contrast grow the running matrix product by ~10^400 without rescaling.
    const res = responseAt(mirror(1000), ref, 0, 's');
    expect(res.R).toBeCloseTo(1, 14);
    expect(Number.isFinite(res.T)).toBe(true);
    expect(res.T).toBeGreaterThanOrEqual(0);
    expect(responseAt(mirror(1000), ref * 0.6, 30, 'p').R).toBeGreaterThanOrEqual(0);
  });
});

describe('absorbing media', () => {
  it('k > 0 is loss: a metal-like layer absorbs, never amplifies', () => {
    // Born & Wolf: with N = n + ik, k > 0 attenuates. A 20 nm layer of N = 0.2 + 3i absorbs.
    const res = responseAt(stack(1, [[0.2, 3, 20]], 1.52), 550, 0, 's');
    expect(res.A).toBeGreaterThan(0.01);
    expect(res.R + res.T).toBeLessThan(1);
  });

  it('a weakly absorbing thick layer transmits about exp(−4πkd/λ)', () => {
    // Index-matched absorber (same n as both media) removes interface reflections, so T is the
    // internal transmittance exp(−4πkd/λ) (Born & Wolf, Principles of Optics) up to terms in k².
    const k = 1e-3;
    const d = 10000;
    const res = responseAt(stack(1.5, [[1.5, k, d]], 1.5), 500, 0, 's');
    expect(res.T).toBeCloseTo(Math.exp((-4 * Math.PI * k * d) / 500), 6);
  });

  it('an absorbing substrate takes the transmitted power into it', () => {
    // Bare absorbing substrate: R = |(1 − N)/(1 + N)|² (Born & Wolf), A = 0 at the interface itself,
    // T = 1 − R is what enters the substrate.
    const N = { re: 3.5, im: 0.5 };
    const R = ((1 - N.re) ** 2 + N.im ** 2) / ((1 + N.re) ** 2 + N.im ** 2);
    const res = responseAt(stack(1, [], N.re, N.im), 800, 0, 's');
    expect(res.R).toBeCloseTo(R, 14);
    expect(res.T).toBeCloseTo(1 - R, 14);
  });
});
