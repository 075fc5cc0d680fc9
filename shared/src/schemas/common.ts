/*
 * Building blocks of the request schemas the API validates with and the client's forms check
 * before sending. A schema's messages are written for the person filling the form; the API puts
 * the field's path in front of them.
 */
import { z } from 'zod';
import { OpticsInputError } from '../optics/errors.js';

/** A finite number (zod rejects NaN and ±Infinity); `typeMessage` when it is not one. */
export function finiteNumber(typeMessage: string) {
  return z.number({ error: typeMessage });
}

/**
 * The id or number of a record (one chosen from a list, a version number, a deposition step): a
 * whole number from 1; `message` when it is missing or not one.
 */
export function recordId(message: string) {
  return z.number({ error: message }).int({ error: message }).positive({ error: message });
}

/** A trimmed, required line of text of at most `max` characters. */
export function requiredText(emptyMessage: string, max: number) {
  return z
    .string({ error: emptyMessage })
    .trim()
    .min(1, { error: emptyMessage })
    .max(max, { error: `At most ${max} characters` });
}

/** Text of at most `max` characters, as typed (not trimmed). */
export function limitedText(max: number) {
  return z.string({ error: 'Must be text' }).max(max, { error: `At most ${max} characters` });
}
/** The name of an uploaded file, kept with its text. */
export const fileNameField = requiredText('The file needs a name', 255);

/** Free text of at most `max` characters; missing means empty. */
export function optionalText(max: number) {
  return limitedText(max).default('');
}

/** A calendar date written YYYY-MM-DD (a real day: no 31 April, 29 February only in leap years). */
export function calendarDate(message: string) {
  return z.iso.date({ error: message });
}

/**
 * A number in a query string, where every value arrives as text: '632.8' becomes 632.8; text that
 * is not a number (or a value given twice) gets `message`.
 */
export function queryNumber(message: string) {
  return z.coerce.number({ error: message });
}

/** The id of a record in a query string: a whole number from 1. */
export function queryRecordId(message: string) {
  return queryNumber(message).int({ error: message }).min(1, { error: message });
}

/** The optimistic-locking counter an edit sends back. */
export const versionToken = z
  .number({ error: 'version must be the version number last read' })
  .int({ error: 'version must be a whole number' })
  .min(1, { error: 'version must be at least 1' });

/** An engine field path (`bands[2].angles_deg[0]`) as path segments: ['bands', 2, 'angles_deg', 0]. */
export function enginePath(field: string): (string | number)[] {
  if (field === '') return [];
  return field
    .split(/\.|(?=\[)/)
    .map((segment) => (segment.startsWith('[') ? Number(segment.slice(1, -1)) : segment));
}

/**
 * What the engine's validator says of an input: the OpticsInputError it throws (its `field` and
 * `problem`), or null when the input passes. Other errors are not input problems and propagate.
 */
export function engineProblem(check: () => unknown): OpticsInputError | null {
  try {
    check();
    return null;
  } catch (err) {
    if (err instanceof OpticsInputError) return err;
    throw err;
  }
}

/** The version of a settings record the editor read: 0 before the first save. */
export const settingsVersion = z
  .number({ error: 'version must be the version you read' })
  .int({ error: 'version must be the version you read' })
  .min(0, { error: 'version must be the version you read' });

/** Each material once in a list of per-material rows: a repeat is refused at its materialId. */
export function eachMaterialOnce(rows: readonly { materialId: number }[], ctx: z.RefinementCtx): void {
  rows.forEach((row, index) => {
    const first = rows.findIndex((r) => r.materialId === row.materialId);
    if (first !== index)
      ctx.addIssue({
        code: 'custom',
        path: [index, 'materialId'],
        message: `This material is already listed in row ${first + 1}`,
      });
  });
}

/** One line per problem, as the API answers them: "materials.0.toolingFactor: …". */
export function issueLines(error: z.ZodError): string[] {
  return error.issues.map((issue) => {
    const where = issue.path.map(String).join('.');
    return where === '' ? issue.message : `${where}: ${issue.message}`;
  });
}
