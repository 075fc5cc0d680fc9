/*
 * Checked lookups for values the code has already made sure exist: one thickness per layer, one
 * value per wavelength, a demo record a script needs. A missing one is a bug, not bad input, so
 * these throw with a message naming what was missing instead of letting `undefined` flow on.
 * (Hot numeric loops index typed arrays directly and do not use them.)
 */

/** The element at `index`, or an error naming the array `what`. */
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
