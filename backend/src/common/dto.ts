/** Shared pieces of the DTOs' validation rules. */

/** class-transformer: trims strings (other values pass through to fail validation themselves). */
export const trim = ({ value }: { value: unknown }): unknown =>
  typeof value === 'string' ? value.trim() : value;

/** class-transformer: trims and lower-cases strings (e-mail addresses). */
export const trimLower = ({ value }: { value: unknown }): unknown =>
  typeof value === 'string' ? value.trim().toLowerCase() : value;

/** class-validator IsNumber options: NaN and ±Infinity are not numbers here. */
export const finite = { allowNaN: false, allowInfinity: false } as const;
