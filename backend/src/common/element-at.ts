/**
 * The element at `index`, for arrays whose length the code has already checked or built to match
 * (one thickness per layer, one value per wavelength). A missing element is a bug, not bad input,
 * so it throws with `what` naming the array.
 */
export function elementAt<T>(items: ArrayLike<T>, index: number, what: string): T {
  const item = items[index];
  if (item === undefined) throw new Error(`${what} has no element ${index} (it holds ${items.length})`);
  return item;
}
