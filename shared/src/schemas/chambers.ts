/*
 * What a chamber form sends and the API accepts: one schema for both, so a limit or a message is
 * changed in one place.
 */
import { z } from 'zod';
import {
  eachMaterialOnce,
  finiteNumber,
  optionalText,
  recordId,
  requiredText,
  versionToken,
} from './common.js';

/** Limits of a chamber's settings; they catch typing slips — common practice (no source). */
export const CHAMBER_LIMITS = {
  nameLength: 120,
  notesLength: 4000,
  wavelengths: { min: 200, max: 3000, count: 8 },
  toolingFactorMax: 10,
  rateMax: 100,
} as const;

const { min: WL_MIN, max: WL_MAX, count: WL_COUNT } = CHAMBER_LIMITS.wavelengths;

export const chamberMaterialSchema = z.strictObject({
  materialId: recordId('Choose a material'),
  toolingFactor: finiteNumber('Enter the tooling factor as a number, e.g. 1.04')
    .gt(0, { error: 'Tooling factor must be greater than 0' })
    .max(CHAMBER_LIMITS.toolingFactorMax, {
      error: `Tooling factor must be at most ${CHAMBER_LIMITS.toolingFactorMax}`,
    }),
  rateNmPerS: finiteNumber('Enter the rate in nm/s as a number, e.g. 0.8')
    .gt(0, { error: 'Rate must be greater than 0 nm/s' })
    .max(CHAMBER_LIMITS.rateMax, { error: `Rate must be at most ${CHAMBER_LIMITS.rateMax} nm/s` }),
});

/** Each material once: a second row of the same material is refused at that row. */
const chamberMaterialsSchema = z
  .array(chamberMaterialSchema, { error: 'materials must be a list' })
  .superRefine(eachMaterialOnce);

export const chamberInputSchema = z.strictObject({
  name: requiredText('Enter a chamber name', CHAMBER_LIMITS.nameLength),
  monitorWavelengthsNm: z
    .array(
      finiteNumber('Monitor wavelengths must be numbers in nm')
        .min(WL_MIN, { error: `Monitor wavelengths must be between ${WL_MIN} and ${WL_MAX} nm` })
        .max(WL_MAX, { error: `Monitor wavelengths must be between ${WL_MIN} and ${WL_MAX} nm` }),
      { error: 'monitorWavelengthsNm must be a list of wavelengths in nm' },
    )
    .min(1, { error: 'Enter at least one monitor wavelength' })
    .max(WL_COUNT, { error: `At most ${WL_COUNT} monitor wavelengths` }),
  monitorChipMaterialId: recordId('Choose the material of the monitor chip'),
  materials: chamberMaterialsSchema,
  notes: optionalText(CHAMBER_LIMITS.notesLength),
});

/** A new chamber as the API receives it (after trimming and defaults). */
export type ChamberInput = z.output<typeof chamberInputSchema>;

/** An edit carries the version it was based on. */
export const chamberUpdateSchema = chamberInputSchema.extend({ version: versionToken });
export type ChamberUpdate = z.output<typeof chamberUpdateSchema>;
