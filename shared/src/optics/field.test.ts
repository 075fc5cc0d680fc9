import { Complex } from 'complex.js';
import { describe, expect, it } from 'vitest';
import { elementAt, required } from '../checked.js';
import { constantStack, randomLayers, seededRandom } from './__tests__/random.js';
import { responseAt } from './batch.js';
import { constantIndex as c } from './dispersion.js';
import { evenDepthsNm, fieldProfile } from './field.js';
import type { OpticalStack } from './stack.js';

const deg = Math.PI / 180;
const bare = (n0: number, n1: number): OpticalStack => ({
  incident: c(n0),
  layers: [],
  substrate: c(n1),
  backLayers: [],
  exit: c(n0),
});
const profile = (stack: OpticalStack, wl: number, angle: number, pol: 's' | 'p', depths: number[]) =>
  Array.from(fieldProfile(new Float64Array(depths.length), stack, wl, angle, pol, depths));

describe('field profile |E|² relative to the incident wave', () => {
  it('at a bare surface equals |1 + r|² = (2n0/(n0 + n1))² (Hecht ch. 4)', () => {
    const [e2] = profile(bare(1, 1.52), 550, 0, 's', [0]);
    expect(e2).toBeCloseTo((2 / 2.52) ** 2, 14);
  });

  it('forms the standing wave 1 + |r|² + 2|r|cos(…) in the incident medium', () => {
    // Born & Wolf, standing waves: extremes (1 ± |r|)² over half a wavelength.
    const r = 0.52 / 2.52;
    const depths = Array.from({ length: 2001 }, (_, i) => -275 * (i / 2000));
    const values = profile(bare(1, 1.52), 550, 0, 's', depths);
    expect(Math.max(...values)).toBeCloseTo((1 + r) ** 2, 6);
    expect(Math.min(...values)).toBeCloseTo((1 - r) ** 2, 12);
  });

  it('in the substrate gives the Fresnel field transmission coefficients, s and p (Hecht ch. 4)', () => {
    const n0 = 1;
    const n1 = 1.52;
    const ti = 50 * deg;
    const tt = Math.asin((n0 * Math.sin(ti)) / n1);
    const ts = (2 * n0 * Math.cos(ti)) / (n0 * Math.cos(ti) + n1 * Math.cos(tt));
    const tp = (2 * n0 * Math.cos(ti)) / (n1 * Math.cos(ti) + n0 * Math.cos(tt));
    expect(profile(bare(n0, n1), 600, 50, 's', [10])[0]).toBeCloseTo(ts * ts, 13);
    expect(profile(bare(n0, n1), 600, 50, 'p', [10])[0]).toBeCloseTo(tp * tp, 13);
  });

  it('has the small field 1 + r at the front of a quarter-wave mirror (H outermost)', () => {
    // Macleod ch. 2 and 6: Y = (nH/nL)^(2N) nH²/ns is real, r = (1 − Y)/(1 + Y), E(0) = 1 + r = 2/(1 + Y).
    const nH = 2.35;
    const nL = 1.46;
    const layers: { material: ReturnType<typeof c>; thicknessNm: number }[] = [];
    for (let i = 0; i < 6; i++) {
      layers.push(
        { material: c(nH), thicknessNm: 1064 / (4 * nH) },
        { material: c(nL), thicknessNm: 1064 / (4 * nL) },
      );
    }
    layers.push({ material: c(nH), thicknessNm: 1064 / (4 * nH) });
    const mirror: OpticalStack = { ...bare(1, 1.52), layers };
    const Y = (nH / nL) ** 12 * (nH ** 2 / 1.52);
    expect(profile(mirror, 1064, 0, 's', [0])[0]).toBeCloseTo((2 / (1 + Y)) ** 2, 14);
    // Across the outer quarter-wave H layer E₁ = i·E(0)·Y/nH: the antinode at the first H/L interface
    // carries |E|² = (2Y/((1 + Y)·nH))² → (2/nH)² for a high reflector (Macleod ch. 2, QW matrix).
    expect(profile(mirror, 1064, 0, 's', [1064 / (4 * nH)])[0]).toBeCloseTo(
      ((2 * Y) / ((1 + Y) * nH)) ** 2,
      12,
    );
  });

  it('integrates to the absorptance: A = (2π/λ) ∫ 2nk |E|² dz / (n0 cos θ0), s and p', () => {
    // Absorbed power density ½ωε₀ Im(ε)|E|² over the incident flux ½ n0 cos θ0 Y₀ |E₀|² (Born & Wolf).
    const rand = seededRandom(11);
    for (let trial = 0; trial < 12; trial++) {
      const layers = randomLayers(rand, { absorbing: 0.7, maxK: 0.3, maxLayers: 5, substrateK: 0 });
      const stack = constantStack(1, layers, { n: 1.52, k: 0 });
      const wl = 450 + 300 * rand();
      const angle = 70 * rand();
      for (const pol of ['s', 'p'] as const) {
        let absorbed = 0;
        let z0 = 0;
        for (const layer of layers) {
          const steps = 2000; // Simpson's rule, even count
          const h = layer.thicknessNm / steps;
          // Sample just inside the layer so the normal component of p uses this layer's ε.
          const depths = Array.from(
            { length: steps + 1 },
            (_, i) => z0 + Math.min(Math.max(i * h, 1e-9), layer.thicknessNm - 1e-9),
          );
          const e2 = profile(stack, wl, angle, pol, depths);
          let sum = 0;
          for (let i = 0; i <= steps; i++) {
            sum += elementAt(e2, i, '|E|² samples') * (i === 0 || i === steps ? 1 : i % 2 === 1 ? 4 : 2);
          }
          absorbed += ((2 * layer.n * layer.k * sum * h) / 3) * ((2 * Math.PI) / wl);
          z0 += layer.thicknessNm;
        }
        absorbed /= Math.cos(angle * deg);
        const A = responseAt(stack, wl, angle, pol).A;
        expect(absorbed).toBeCloseTo(A, 7);
      }
    }
  });

  it('stays finite and correct for very opaque stacks (a 6 µm absorber, a 40 µm tunnelling gap)', () => {
    // The field is computed from the substrate backwards; without rescaling it overflowed to NaN.
    // Checks: the front of the stack sees the same field as a thinner stack whose back no longer
    // matters (the wave dies out within ~λ/(4πk) = 8 nm of the front), and the absorbed power
    // (Born & Wolf, as above) integrated over the first 200 nm (the rest is below e^-25) equals A.
    const metal = (d: number): OpticalStack =>
      constantStack(1, [{ n: 0.2, k: 5, thicknessNm: d }], { n: 1.52, k: 0 });
    const depths = Array.from({ length: 2001 }, (_, i) => 200 * (i / 2000));
    for (const pol of ['s', 'p'] as const) {
      const thick = profile(metal(6000), 500, 30, pol, depths);
      const thin = profile(metal(400), 500, 30, pol, depths);
      for (let i = 0; i < depths.length; i++) {
        expect(Number.isFinite(thick[i])).toBe(true);
        expect(thick[i]).toBeCloseTo(elementAt(thin, i, 'thin profile'), 12);
      }
      expect(thick[0]).toBeGreaterThan(1e-3);
      let sum = 0;
      for (let i = 0; i <= 2000; i++) {
        sum += elementAt(thick, i, 'thick profile') * (i === 0 || i === 2000 ? 1 : i % 2 === 1 ? 4 : 2);
      }
      const absorbed =
        (((2 * 0.2 * 5 * sum * (200 / 2000)) / 3) * ((2 * Math.PI) / 500)) / Math.cos(30 * deg);
      expect(absorbed).toBeCloseTo(responseAt(metal(6000), 500, 30, pol).A, 7);
      // Deep inside, only the forward wave is left: |E|² falls by exp(−2 k0 Im q Δz) over Δz, with
      // q = √(N² − sin²θ0) (Born & Wolf, waves in absorbing media); finite there, not NaN.
      const q = new Complex(0.2, 5)
        .pow(2)
        .sub(Math.sin(30 * deg) ** 2)
        .sqrt();
      const [deep, deeper] = profile(metal(6000), 500, 30, pol, [3000, 3010]);
      expect(deep).toBeGreaterThan(0);
      expect(Math.log(required(deeper, '|E|² at 3010 nm') / required(deep, '|E|² at 3000 nm'))).toBeCloseTo(
        -2 * ((2 * Math.PI) / 500) * Math.abs(q.im) * 10,
        9,
      );
    }
    // 40 µm air gap at 60° between two n = 1.52 prisms: the gap's front matches a 4 µm gap's
    // (the evanescent wave decays within ~100 nm), the far prism sees no field.
    const gap = (d: number): OpticalStack => ({
      incident: c(1.52),
      layers: [{ material: c(1), thicknessNm: d }],
      substrate: c(1.52),
      backLayers: [],
      exit: c(1.52),
    });
    const front = Array.from({ length: 101 }, (_, i) => -200 + 5 * i);
    for (const pol of ['s', 'p'] as const) {
      const far = profile(gap(40000), 633, 60, pol, front);
      const near = profile(gap(4000), 633, 60, pol, front);
      for (let i = 0; i < front.length; i++) {
        expect(Number.isFinite(far[i])).toBe(true);
        expect(far[i]).toBeCloseTo(elementAt(near, i, 'near profile'), 10);
      }
      const [beyond] = profile(gap(40000), 633, 60, pol, [40100]);
      expect(Number.isFinite(beyond)).toBe(true);
      expect(beyond).toBeLessThan(1e-200);
    }
  });

  it('keeps tangential E continuous across interfaces (s)', () => {
    const stack = constantStack(
      1,
      [
        { n: 2.1, k: 0.05, thicknessNm: 80 },
        { n: 1.45, k: 0, thicknessNm: 120 },
      ],
      { n: 1.52, k: 0 },
    );
    const [before, after] = profile(stack, 500, 30, 's', [80 - 1e-7, 80 + 1e-7]);
    expect(after).toBeCloseTo(required(before, '|E|² before the interface'), 7);
  });

  it('samples depths evenly and validates its inputs', () => {
    const stack = constantStack(1, [{ n: 2, k: 0, thicknessNm: 100 }], { n: 1.5, k: 0 });
    expect(Array.from(evenDepthsNm(stack, 5, 10))).toEqual([-10, 20, 50, 80, 110]);
    expect(() => fieldProfile(new Float64Array(1), stack, 500, 90, 's', [0])).toThrow(/^angleDeg/);
    expect(() => fieldProfile(new Float64Array(1), stack, 500, 0, 'avg' as never, [0])).toThrow(
      /^polarisation/,
    );
    expect(() => fieldProfile(new Float64Array(1), stack, 500, 0, 's', [Number.NaN])).toThrow(
      /^depthsNm\[0\]/,
    );
    expect(() => fieldProfile(new Float64Array(0), stack, 500, 0, 's', [0])).toThrow(/^out/);
  });
});
