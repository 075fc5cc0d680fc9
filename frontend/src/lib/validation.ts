import { displayNameField, emailField, newPasswordField } from '@quietglass/shared';
import type { RegisterOptions } from 'react-hook-form';
import { z, type ZodType } from 'zod';
import { parseNumberInput } from './format';

export {
  MAX_DISPLAY_NAME_LENGTH,
  MAX_EMAIL_LENGTH,
  MAX_PASSWORD_LENGTH,
  MIN_PASSWORD_LENGTH,
} from '@quietglass/shared';

/** A field rule that checks the value with one of the API's field schemas: its first message, or true. */
export function schemaRule(schema: ZodType) {
  return {
    validate: (value: unknown) => {
      const parsed = schema.safeParse(value ?? '');
      return parsed.success || (parsed.error.issues[0]?.message ?? 'Not valid');
    },
  } satisfies RegisterOptions<Record<string, string>, string>;
}

/**
 * Text typed in a number field as a number, or NaN, which the API's number schemas refuse with
 * their own message: pipe it into one (`typedNumber.pipe(schema.shape.x)`).
 */
export const typedNumber = z.string().transform((text) => parseNumberInput(text) ?? Number.NaN);

/** A record chosen in a select: its id, or NaN (refused by the API's id schemas) when none is. */
export const chosenId = z.string().transform((text) => (text === '' ? Number.NaN : Number(text)));

/**
 * A form's resolver schema: `typed` reads the form's fields (typed numbers, chosen ids) into the
 * shape of an API request and the API's own `request` schema checks that, so the form shows the
 * API's messages at the same field paths and its submit handler receives the request body.
 */
export function requestFormSchema<TValues, TRequestInput, TRequest>(
  typed: ZodType<TRequestInput, TValues>,
  request: ZodType<TRequest, TRequestInput>,
) {
  return typed.pipe(request);
}

/** A number field that may be left empty: empty is left out (undefined), other text as `typedNumber`. */
export const typedOptionalNumber = z
  .string()
  .transform((text) => (text.trim() === '' ? undefined : (parseNumberInput(text) ?? Number.NaN)));

/** A free-text field that may be left empty: trimmed, and left out when empty. */
export const typedOptionalText = z.string().transform((text) => text.trim() || undefined);

/** An e-mail address as the API checks it. */
export const emailRules = schemaRule(emailField);

/** A password being set (new, initial or reset), with the API's length rules. */
export const newPasswordRules = schemaRule(newPasswordField);

export const displayNameRules = schemaRule(displayNameField);
