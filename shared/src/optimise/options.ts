/*
 * Checks of the optimisers' plain-data options. Each throws an OpticsInputError naming the field.
 */
import { finiteNumber } from '../optics/checks.js';
import { OpticsInputError } from '../optics/errors.js';

/** A whole number in [min, max], or `fallback` when undefined. */
export function wholeNumber(
  value: unknown,
  field: string,
  min: number,
  max: number,
  fallback: number,
): number {
  if (value === undefined) return fallback;
  const x = finiteNumber(value, field);
  if (!Number.isInteger(x) || x < min || x > max) {
    throw new OpticsInputError(field, `must be a whole number from ${min} to ${max} (got ${x})`);
  }
  return x;
}

/** A finite number > 0, or `fallback` when undefined. */
export function positiveOption(value: unknown, field: string, fallback: number): number {
  if (value === undefined) return fallback;
  const x = finiteNumber(value, field);
  if (!(x > 0)) throw new OpticsInputError(field, `must be greater than 0 (got ${x})`);
  return x;
}

/** A finite number ≥ 0, or `fallback` when undefined. */
export function nonNegativeOption(value: unknown, field: string, fallback: number): number {
  if (value === undefined) return fallback;
  const x = finiteNumber(value, field);
  if (!(x >= 0)) throw new OpticsInputError(field, `must be 0 or more (got ${x})`);
  return x;
}

/**
 * The merit Grow layers grows on unless told: the one-sided mask merit, as before the smooth
 * growth merit existed, so earlier jobs grow the same designs.
 */
export const DEFAULT_GROWTH_MERIT = 'mask' as const;
/**
 * Needles Grow layers inserts together at the deepest minima of the needle function, one step
 * (common practice, no source: a few at once lets a broadband design grow period by period).
 */
export const DEFAULT_NEEDLES_PER_STEP = 3;
/**
 * A minimum of the needle function joins a step's needles only when at least this fraction as
 * deep as the deepest (common practice, no source: shallower ones mostly refine away again).
 */
export const NEEDLE_DEPTH_FRACTION = 0.25;
