import { describe, expect, it } from 'vitest';
import { calibrationDecisionSchema, calibrationSettingsSchema } from './calibration.js';
import { issueLines } from './common.js';

const lines = (parsed: { success: true } | { success: false; error: Parameters<typeof issueLines>[0] }) =>
  parsed.success ? [] : issueLines(parsed.error);

describe('calibration decision schema', () => {
  const good = {
    key: 'material:5:run:12',
    decision: 'accepted',
    comment: '  drift confirmed on two witness chips ',
  };

  it('trims the comment and keeps the key exactly', () => {
    expect(calibrationDecisionSchema.parse(good)).toEqual({
      key: 'material:5:run:12',
      decision: 'accepted',
      comment: 'drift confirmed on two witness chips',
    });
  });

  it.each([
    [{ comment: '   ' }, 'comment: Say why'],
    [{ comment: 'x'.repeat(2001) }, 'comment: At most 2000 characters'],
    [{ decision: 'maybe' }, 'decision: decision must be accepted or rejected'],
    [{ key: '' }, 'key: key must name the suggestion shown'],
  ])('refuses %j', (patch, expected) => {
    expect(lines(calibrationDecisionSchema.safeParse({ ...good, ...patch }))).toEqual([expected]);
  });
});

describe('calibration settings schema', () => {
  it.each([
    [{ thresholdPercent: Number.NaN }, 'thresholdPercent: Enter the threshold in percent as a number'],
    [{ thresholdPercent: 0.01 }, 'thresholdPercent: The threshold must be at least 0.05 %'],
    [{ thresholdPercent: 51 }, 'thresholdPercent: The threshold must be at most 50 %'],
    [{ minRuns: 1 }, 'minRuns: At least 2 runs'],
    [{ minRuns: 2.5 }, 'minRuns: Enter the minimum number of runs as a whole number'],
    [{ version: undefined }, 'version: version must be the version number last read'],
  ])('refuses %j', (patch, expected) => {
    const body = { thresholdPercent: 1, minRuns: 4, version: 3, ...patch };
    expect(lines(calibrationSettingsSchema.safeParse(body))).toEqual([expected]);
  });

  it('accepts the shipped defaults', () => {
    expect(calibrationSettingsSchema.parse({ thresholdPercent: 1, minRuns: 4, version: 1 })).toEqual({
      thresholdPercent: 1,
      minRuns: 4,
      version: 1,
    });
  });
});
