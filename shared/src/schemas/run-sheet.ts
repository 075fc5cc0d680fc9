/*
 * What a run sheet is printed for, as the API reads it from the query string (values arrive as
 * text) and the run sheet page checks the operator's typing: chamber, monitor wavelength, part,
 * quantity, sides and substrate thickness.
 */
import { z } from 'zod';
import { RUN_SHEET_JOB_LIMITS, RUN_SHEET_SIDES } from '../runsheet.js';
import { queryNumber, queryRecordId } from './common.js';

const { partMaxLength, quantityMax, substrateThicknessMaxMm } = RUN_SHEET_JOB_LIMITS;

export const runSheetQuerySchema = z.strictObject({
  chamberId: queryRecordId('Choose a chamber'),
  /** Missing: the chamber's first monitor wavelength. */
  monitorWavelengthNm: queryNumber('The monitor wavelength must be a number in nm')
    .gt(0, { error: 'The monitor wavelength must be above 0 nm' })
    .optional(),
  part: z
    .string({ error: 'part must be text' })
    .trim()
    .max(partMaxLength, { error: `At most ${partMaxLength} characters` })
    .optional(),
  quantity: queryNumber('A whole number of parts')
    .int({ error: 'A whole number of parts' })
    .min(1, { error: 'At least 1' })
    .max(quantityMax, { error: `At most ${quantityMax}` })
    .optional(),
  /** Missing: the sides the design coats. */
  sides: z.enum(RUN_SHEET_SIDES, { error: `sides must be one of ${RUN_SHEET_SIDES.join(', ')}` }).optional(),
  /** Missing: the design's substrate thickness. */
  substrateThicknessMm: queryNumber('A number in mm')
    .gt(0, { error: 'Must be more than 0 mm' })
    .max(substrateThicknessMaxMm, { error: `At most ${substrateThicknessMaxMm} mm` })
    .optional(),
});
export type RunSheetQuery = z.output<typeof runSheetQuerySchema>;
