import { describe, expect, it } from 'vitest';
import { elementAt } from '../checked.js';
import { calculateSpectrum, responseAt } from './batch.js';
import { constantIndex as c } from './dispersion.js';
import type { OpticalStack } from './stack.js';
import { combineIncoherent, substratePassTransmittance } from './substrate.js';

const plate = (n: number, k: number, mm?: number): OpticalStack => ({
  incident: c(1),
  layers: [],
  substrate: c(n, k),
  substrateThicknessMm: mm,
  backLayers: [],
  exit: c(1),
});

describe('thick substrate, incoherent (Macleod ch. 2; standard result)', () => {
  it('uncoated lossless plate: R = 2R₁/(1 + R₁), T = (1 − R₁)/(1 + R₁)', () => {
    const R1 = ((1.52 - 1) / (1.52 + 1)) ** 2;
    const res = responseAt(plate(1.52, 0), 550, 0, 'avg', { back: 'incoherent' });
    expect(res.R).toBeCloseTo((2 * R1) / (1 + R1), 14);
    expect(res.T).toBeCloseTo((1 - R1) / (1 + R1), 14);
    expect(res.R).toBeCloseTo(0.081682, 6); // Macleod ch. 2: uncoated plate 2R/(1 + R)
    expect(res.T).toBeCloseTo(0.918318, 6);
    expect(res.A).toBeCloseTo(0, 14);
  });

  it('front surface alone (back "none") is the single Fresnel reflection', () => {
    expect(responseAt(plate(1.52, 0), 550, 0, 's').R).toBeCloseTo(0.04258, 6);
  });

  it('absorbing plate: internal transmittance τ = exp(−4πkd/λ) between two Fresnel surfaces', () => {
    // Born & Wolf (α = 4πk/λ); each surface R₁ = |(1 − N)/(1 + N)|²; for k ≪ n the textbook result
    // T = (1 − R₁)² τ / (1 − R₁² τ²), R = R₁ + (1 − R₁)² R₁ τ² / (1 − R₁² τ²).
    const n = 1.5;
    const k = 2e-6;
    const mm = 3;
    const wl = 500;
    const tau = Math.exp((-4 * Math.PI * k * mm * 1e6) / wl);
    expect(tau).toBeLessThan(0.9);
    const R1 = ((1 - n) ** 2 + k ** 2) / ((1 + n) ** 2 + k ** 2);
    const res = responseAt(plate(n, k, mm), wl, 0, 's', { back: 'incoherent' });
    expect(res.T).toBeCloseTo(((1 - R1) ** 2 * tau) / (1 - R1 ** 2 * tau ** 2), 10);
    expect(res.R).toBeCloseTo(R1 + ((1 - R1) ** 2 * R1 * tau ** 2) / (1 - R1 ** 2 * tau ** 2), 10);
    expect(res.A).toBeGreaterThan(0.1);
  });

  it('single pass through a tilted substrate follows the longer path inside it', () => {
    // exp(−2 k0 Im(N cos θ) d); for small k, Im(N cos θ) ≈ k·n/√(n² − sin²θ₀) (path d / cos θ).
    const n = 1.5;
    const k = 1e-6;
    const beta = Math.sin((40 * Math.PI) / 180);
    const k0 = (2 * Math.PI) / 600;
    const tau = substratePassTransmittance(k0, beta, n * n - k * k, 2 * n * k, 2e6);
    const cosInside = Math.sqrt(1 - (beta / n) ** 2);
    expect(tau).toBeCloseTo(Math.exp((-4 * Math.PI * k * 2e6) / (600 * cosInside)), 8);
  });

  it('needs the substrate thickness when the substrate absorbs', () => {
    expect(() => responseAt(plate(1.5, 1e-6), 500, 0, 's', { back: 'incoherent' })).toThrow(
      /substrate\.thickness_mm: is required for the thick-substrate \(incoherent\) model/,
    );
    // Lossless: thickness does not matter and is not needed.
    const a = responseAt(plate(1.5, 0), 500, 0, 's', { back: 'incoherent' });
    const b = responseAt(plate(1.5, 0, 5), 500, 0, 's', { back: 'incoherent' });
    expect(a.R).toBe(b.R);
  });

  it('a coated back surface: AR on the back removes its reflection', () => {
    // Quarter-wave n = √1.52 on the back (from the substrate outwards) makes the back surface
    // reflect nothing at the reference wavelength, leaving the front surface alone.
    const nAR = Math.sqrt(1.52);
    const stack: OpticalStack = {
      ...plate(1.52, 0),
      backLayers: [{ material: c(nAR), thicknessNm: 550 / (4 * nAR) }],
    };
    const res = responseAt(stack, 550, 0, 's', { back: 'incoherent' });
    expect(res.R).toBeCloseTo(0.04258, 6);
    expect(res.T).toBeCloseTo(1 - 0.04258, 6);
  });

  it('treats s and p separately before averaging', () => {
    // At Brewster's angle Rp = 0 on both surfaces: the plate's p-transmittance is 1.
    const brewster = (Math.atan(1.52) * 180) / Math.PI;
    const res = calculateSpectrum(
      plate(1.52, 0),
      { wavelengthsNm: [550], anglesDeg: [brewster], polarisations: ['s', 'p', 'avg'] },
      { back: 'incoherent' },
    );
    expect(res.T[1]).toBeCloseTo(1, 12);
    expect(res.T[2]).toBeCloseTo((elementAt(res.T, 0, 'T') + elementAt(res.T, 1, 'T')) / 2, 15);
  });

  it('no light into the substrate: reflection at the front only', () => {
    const out = combineIncoherent(new Float64Array(3), 0, 1, 0, Number.NaN, Number.NaN, 0.5, 0.5, 1);
    expect(Array.from(out)).toEqual([1, 0, 0]);
  });
});
