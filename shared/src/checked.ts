/**
 * Checked lookups for code that type-checks with `noUncheckedIndexedAccess`: where an index or a
 * key is known to hold a value (arrays built to match, one value per wavelength or per layer), a
 * missing one is a bug, not bad input, so these throw with `what` naming what fell short.
 */

/** The element at `index` of an array whose length the caller has already checked or built to match. */
export function elementAt<T>(items: ArrayLike<T>, index: number, what: string): T {
  const item = items[index];
  if (item === undefined) throw new Error(`${what} has no element ${index} (it holds ${items.length})`);
  return item;
}

/** The value, or an error naming what was missing. */
export function required<T>(value: T | undefined, what: string): T {
  if (value === undefined) throw new Error(`${what} is missing`);
  return value;
}
