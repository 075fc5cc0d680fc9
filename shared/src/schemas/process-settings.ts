/*
 * What the process settings dialog sends and the API accepts for a chamber: how each of its
 * materials is deposited, within the shared process limits.
 */
import { z } from 'zod';
import { PROCESS_LIMITS, PROCESS_NOTES_MAX, type ProcessQuantity } from '../chambers.js';
import { eachMaterialOnce, recordId, settingsVersion } from './common.js';

/** Most process settings of one chamber (one per material of its list). */
export const PROCESS_SETTINGS_MAX = 50;

/** A required quantity left out of a material's setting. */
export const PROCESS_QUANTITY_NEEDED = 'Needed once the material has a setting';

/** A quantity within its limits, with messages that give the limit and unit. */
function quantity(q: ProcessQuantity) {
  const { min, max, unit } = PROCESS_LIMITS[q];
  return z
    .number({
      error: (issue) => (issue.input === undefined ? PROCESS_QUANTITY_NEEDED : `A number in ${unit}`),
    })
    .min(min, { error: `At least ${min} ${unit}` })
    .max(max, { error: `At most ${max} ${unit}` });
}

/** A quantity a material may go without: null (or left out) means not used. */
function unusedOrQuantity(q: ProcessQuantity) {
  return quantity(q).nullable().default(null);
}

export const processSettingSchema = z.strictObject({
  materialId: recordId('Choose a material'),
  substrateTemperatureC: quantity('substrateTemperatureC'),
  basePressureMbar: quantity('basePressureMbar'),
  o2FlowSccm: unusedOrQuantity('o2FlowSccm'),
  o2PartialPressureMbar: unusedOrQuantity('o2PartialPressureMbar'),
  arFlowSccm: unusedOrQuantity('arFlowSccm'),
  ionVoltageV: unusedOrQuantity('ionVoltageV'),
  ionCurrentA: unusedOrQuantity('ionCurrentA'),
  ionGasFlowSccm: unusedOrQuantity('ionGasFlowSccm'),
  notes: z
    .string({ error: 'Must be text' })
    .trim()
    .max(PROCESS_NOTES_MAX, { error: `At most ${PROCESS_NOTES_MAX} characters` })
    .default(''),
});
/** One material's setting as the API stores it (unused quantities null, notes trimmed). */
export type ProcessSettingInput = z.output<typeof processSettingSchema>;

/** The whole set of a chamber's process settings, replaced at once from the version read. */
export const processSettingsSchema = z.strictObject({
  settings: z
    .array(processSettingSchema, { error: 'settings must be a list' })
    .max(PROCESS_SETTINGS_MAX, { error: `At most ${PROCESS_SETTINGS_MAX} process settings` })
    .superRefine(eachMaterialOnce),
  version: settingsVersion,
});
export type ProcessSettingsInput = z.output<typeof processSettingsSchema>;
