/**
 * The one error type the optics engine throws for bad input. `field` is the path of the offending
 * value inside the input the caller gave (`layers[2].thickness_nm`, `bands[0].from_nm`, …), so a UI
 * can highlight it and a CLI can print it.
 */
export class OpticsInputError extends Error {
  override readonly name = 'OpticsInputError';

  constructor(
    /** Path of the offending value, e.g. `layers[1].k`; empty for the input as a whole. */
    readonly field: string,
    /** What is wrong, in words a user can act on (without the field path). */
    readonly problem: string,
  ) {
    super(field ? `${field}: ${problem}` : problem);
  }
}

/** Joins a parent path and a key: `fieldPath('layers[0]', 'n')` → `layers[0].n`. */
export function fieldPath(parent: string, key: string | number): string {
  if (typeof key === 'number') return `${parent}[${key}]`;
  return parent ? `${parent}.${key}` : key;
}
