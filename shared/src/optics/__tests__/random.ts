/*
 * Seeded random numbers and random stacks for the property tests, so a failure reproduces exactly.
 */
import type { OpticalStack } from '../stack.js';

/** mulberry32: a small, well-mixed 32-bit generator; returns floats in [0, 1). */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export interface RandomLayer {
  n: number;
  k: number;
  thicknessNm: number;
}

export interface RandomStackOptions {
  /** Probability that a layer absorbs (k > 0). */
  absorbing: number;
  maxK: number;
  maxLayers: number;
  substrateK: number;
}

/** A random layer list with indices 1.2–3.2, thicknesses 0–400 nm. */
export function randomLayers(rand: () => number, opts: RandomStackOptions): RandomLayer[] {
  const count = 1 + Math.floor(rand() * opts.maxLayers);
  return Array.from({ length: count }, () => ({
    n: 1.2 + 2 * rand(),
    k: rand() < opts.absorbing ? opts.maxK * rand() : 0,
    thicknessNm: 400 * rand(),
  }));
}

/** An OpticalStack of constant-index materials. */
export function constantStack(
  incidentN: number,
  layers: readonly RandomLayer[],
  substrate: { n: number; k: number },
): OpticalStack {
  const constant = (n: number, k = 0) => ({ model: 'constant' as const, n, k });
  return {
    incident: constant(incidentN),
    layers: layers.map((l) => ({ material: constant(l.n, l.k), thicknessNm: l.thicknessNm })),
    substrate: constant(substrate.n, substrate.k),
    backLayers: [],
    exit: constant(incidentN),
  };
}
