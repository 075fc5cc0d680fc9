/*
 * What the API accepts for chamber calibration: a decision on a suggestion, and the shop's
 * calibration settings. The decision dialog checks the same schema.
 */
import { z } from 'zod';
import { CALIBRATION_COMMENT_MAX_LENGTH } from '../calibration.js';
import { finiteNumber, requiredText, versionToken } from './common.js';

/** Accept or reject a suggestion exactly as it was shown (its key), saying why. */
export const calibrationDecisionSchema = z.strictObject({
  key: z
    .string({ error: 'key must name the suggestion shown' })
    .min(1, { error: 'key must name the suggestion shown' })
    .max(200, { error: 'key must name the suggestion shown' }),
  decision: z.enum(['accepted', 'rejected'], { error: 'decision must be accepted or rejected' }),
  comment: requiredText('Say why', CALIBRATION_COMMENT_MAX_LENGTH),
});
export type CalibrationDecisionInput = z.output<typeof calibrationDecisionSchema>;

/** Limits of the calibration settings — common practice (no source). */
export const CALIBRATION_SETTING_LIMITS = {
  thresholdPercent: { min: 0.05, max: 50 },
  minRuns: { min: 2, max: 100 },
} as const;

const { thresholdPercent: T, minRuns: N } = CALIBRATION_SETTING_LIMITS;

/** When a drift becomes a suggestion: its size in percent and the runs it needs at least. */
export const calibrationSettingsSchema = z.strictObject({
  thresholdPercent: finiteNumber('Enter the threshold in percent as a number')
    .min(T.min, { error: `The threshold must be at least ${T.min} %` })
    .max(T.max, { error: `The threshold must be at most ${T.max} %` }),
  minRuns: z
    .number({ error: 'Enter the minimum number of runs as a whole number' })
    .int({ error: 'Enter the minimum number of runs as a whole number' })
    .min(N.min, { error: `At least ${N.min} runs` })
    .max(N.max, { error: `At most ${N.max} runs` }),
  version: versionToken,
});
export type CalibrationSettingsInput = z.output<typeof calibrationSettingsSchema>;
