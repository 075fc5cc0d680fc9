/*
 * Input checks shared by the engine's entry points. Each throws an OpticsInputError naming the field;
 * kernels never call these (they run once where a call enters the package).
 */
import { OpticsInputError, fieldPath } from './errors.js';

/** Short, readable rendering of a rejected value for error messages. */
export function describeValue(value: unknown): string {
  if (value === undefined) return 'nothing';
  if (typeof value === 'number' || typeof value === 'boolean' || value === null) return String(value);
  if (typeof value === 'string') return JSON.stringify(value.length > 40 ? `${value.slice(0, 40)}…` : value);
  if (Array.isArray(value)) return 'a list';
  return 'an object';
}

/** A finite number, or an error naming `field`. */
export function finiteNumber(value: unknown, field: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new OpticsInputError(field, `must be a finite number (got ${describeValue(value)})`);
  }
  return value;
}

/** A finite number > 0. */
export function positiveNumber(value: unknown, field: string): number {
  const x = finiteNumber(value, field);
  if (!(x > 0)) throw new OpticsInputError(field, `must be greater than 0 (got ${x})`);
  return x;
}

/** A finite number ≥ 0. */
export function nonNegativeNumber(value: unknown, field: string): number {
  const x = finiteNumber(value, field);
  if (!(x >= 0)) throw new OpticsInputError(field, `must be 0 or more (got ${x})`);
  return x;
}

/** A plain object (not null, not an array). */
export function plainObject(value: unknown, field: string): Record<string, unknown> {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    throw new OpticsInputError(field, `must be an object (got ${describeValue(value)})`);
  }
  return value as Record<string, unknown>;
}

/** An array (of anything; check the items separately). */
export function arrayValue(value: unknown, field: string): readonly unknown[] {
  if (!Array.isArray(value))
    throw new OpticsInputError(field, `must be a list (got ${describeValue(value)})`);
  return value;
}

/** A list of finite numbers, with an optional check per item. */
export function numberList(
  value: unknown,
  field: string,
  item: (x: unknown, field: string) => number = finiteNumber,
): number[] {
  return arrayValue(value, field).map((x, i) => item(x, fieldPath(field, i)));
}

/** One of the allowed strings. */
export function oneOf<T extends string>(value: unknown, allowed: readonly T[], field: string): T {
  if (typeof value !== 'string' || !(allowed as readonly string[]).includes(value)) {
    throw new OpticsInputError(
      field,
      `must be one of ${allowed.map((a) => JSON.stringify(a)).join(', ')} (got ${describeValue(value)})`,
    );
  }
  return value as T;
}

/** Rejects keys that the format does not know, so a misspelt field is not silently ignored. */
export function onlyKeys(obj: Record<string, unknown>, allowed: readonly string[], field: string): void {
  for (const key of Object.keys(obj)) {
    if (!allowed.includes(key)) {
      throw new OpticsInputError(
        fieldPath(field, key),
        `is not a known field here (known: ${allowed.join(', ')})`,
      );
    }
  }
}

/** Angle of incidence in degrees, 0 ≤ θ < 90. */
export function incidenceAngle(value: unknown, field: string): number {
  const x = finiteNumber(value, field);
  if (!(x >= 0 && x < 90)) {
    throw new OpticsInputError(field, `angle of incidence must be at least 0° and below 90° (got ${x})`);
  }
  return x;
}
