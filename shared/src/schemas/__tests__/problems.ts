import type { z } from 'zod';
import { issueLines } from '../common.js';

/** The lines the API would answer for `value` under `schema` (`path: message`); none when it passes. */
export function problems(schema: z.ZodType, value: unknown): string[] {
  const parsed = schema.safeParse(value);
  return parsed.success ? [] : issueLines(parsed.error);
}
