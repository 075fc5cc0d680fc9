/*
 * Small helpers the benchmarks share: order statistics of timing samples, and a checked lookup for
 * values a benchmark needs to exist (a demo customer, a material, a command-line word).
 */

import { required } from '@quietglass/shared';

/** The value, or an error naming what was missing (the shared package's checked lookup). */
export { required };

/** The p-th percentile (nearest rank) of samples sorted ascending. */
export function percentile(sorted: readonly number[], p: number): number {
  return required(sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))], 'a sample');
}

/** The median (upper middle) of samples in any order. */
export function median(samples: readonly number[]): number {
  return percentile(
    [...samples].sort((a, b) => a - b),
    50,
  );
}

/** The smallest and the median of samples in any order. */
export function bestAndMedian(samples: readonly number[]): { best: number; median: number } {
  const sorted = [...samples].sort((a, b) => a - b);
  return { best: required(sorted[0], 'a sample'), median: percentile(sorted, 50) };
}
