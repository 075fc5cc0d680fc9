/*
 * What the API accepts for chamber runs (start, readings and durability results, remarks, measured
 * spectra); the run page's forms check the same schemas.
 */
import { z } from 'zod';
import {
  DURABILITY_OUTCOMES,
  DURABILITY_TESTS,
  RUN_REMARK_MAX_LENGTH,
  SPECTRUM_QUANTITIES,
  SPECTRUM_SAMPLES,
} from '../runs.js';
import {
  calendarDate,
  fileNameField,
  finiteNumber,
  optionalText,
  recordId,
  requiredText,
  versionToken,
} from './common.js';

/** Limits of a run's record; they catch typing slips — common practice (no source). */
export const RUN_LIMITS = {
  lotNumberLength: 60,
  notesLength: 4000,
  layerNotesLength: 500,
  /** Readings of one run: far more than any recipe's layers. */
  readingsCount: 400,
  durabilityCount: 50,
  methodLength: 200,
  durabilityNotesLength: 500,
  /** Largest angle of incidence of a measured spectrum, degrees. */
  spectrumAngleMaxDeg: 89,
} as const;

/** Text of at most `max` characters that may be left out (an edit then keeps what was there). */
function omissibleText(max: number) {
  return optionalText(max).unwrap().optional();
}

/** A number > 0 that may be left out; `message` for anything else. */
function omissiblePositive(message: string) {
  return finiteNumber(message).gt(0, { error: message }).optional();
}

export const startRunSchema = z.strictObject({
  designId: recordId('Choose a released recipe'),
  versionNumber: recordId('Choose a released recipe'),
  chamberId: recordId('Choose the chamber'),
  lotNumber: requiredText('Enter the lot number', RUN_LIMITS.lotNumberLength),
  runDate: calendarDate('Enter the date as YYYY-MM-DD'),
  notes: optionalText(RUN_LIMITS.notesLength),
});
export type StartRunInput = z.output<typeof startRunSchema>;

/** What the monitor showed for one deposition step (the API checks the step against the recipe). */
export const layerReadingSchema = z.strictObject({
  step: recordId('step must be a deposition step number (1 = next to the substrate)'),
  monitorThicknessNm: omissiblePositive('Monitor thickness must be a number > 0'),
  rateNmPerS: omissiblePositive('Rate must be a number > 0'),
  notes: omissibleText(RUN_LIMITS.layerNotesLength),
});

export const durabilityResultSchema = z.strictObject({
  test: z.enum(DURABILITY_TESTS, { error: 'test must be adhesion, abrasion, humidity or other' }),
  method: requiredText(
    'Name the test procedure followed (e.g. ISO 9211-4, tape adhesion)',
    RUN_LIMITS.methodLength,
  ),
  result: z.enum(DURABILITY_OUTCOMES, { error: 'Choose pass or fail' }),
  notes: omissibleText(RUN_LIMITS.durabilityNotesLength),
});

/** Each field given replaces what the run had; `version` is the run's version the change is based on. */
export const updateRunSchema = z.strictObject({
  version: versionToken,
  layerReadings: z
    .array(layerReadingSchema, { error: 'layerReadings must be a list' })
    .max(RUN_LIMITS.readingsCount, { error: `At most ${RUN_LIMITS.readingsCount} layer readings` })
    .optional(),
  durability: z
    .array(durabilityResultSchema, { error: 'durability must be a list' })
    .max(RUN_LIMITS.durabilityCount, { error: `At most ${RUN_LIMITS.durabilityCount} durability results` })
    .optional(),
  notes: omissibleText(RUN_LIMITS.notesLength),
});
export type UpdateRunInput = z.output<typeof updateRunSchema>;

/** A remark by anyone who reads the run. */
export const runRemarkSchema = z.strictObject({
  text: requiredText('Enter the remark', RUN_REMARK_MAX_LENGTH),
});
export type RunRemarkInput = z.output<typeof runRemarkSchema>;

const ANGLE_MESSAGE = `Enter an angle from 0 to ${RUN_LIMITS.spectrumAngleMaxDeg}°`;

/** A measured spectrum file's text and how it was measured; the API then parses the file. */
export const uploadSpectrumSchema = z.strictObject({
  filename: fileNameField,
  csv: z.string({ error: 'csv must be the text of the file' }),
  angleDeg: finiteNumber(ANGLE_MESSAGE)
    .min(0, { error: ANGLE_MESSAGE })
    .max(RUN_LIMITS.spectrumAngleMaxDeg, { error: ANGLE_MESSAGE }),
  sample: z.enum(SPECTRUM_SAMPLES, { error: 'Choose witness sample or part' }),
  /** Which quantity to read from a file that holds both R and T (e.g. the calculation CLI's output). */
  quantity: z.enum(SPECTRUM_QUANTITIES, { error: 'quantity must be R or T' }).optional(),
});
export type UploadSpectrumInput = z.output<typeof uploadSpectrumSchema>;
