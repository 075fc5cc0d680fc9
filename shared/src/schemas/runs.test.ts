import { describe, expect, it } from 'vitest';
import { RUN_REMARK_MAX_LENGTH } from '../runs.js';
import { runRemarkSchema, startRunSchema, updateRunSchema, uploadSpectrumSchema } from './runs.js';
import { problems } from './__tests__/problems.js';

// An invented lot of an invented recipe.
const start = {
  designId: 4,
  versionNumber: 2,
  chamberId: 1,
  lotNumber: ' L-2026-118 ',
  runDate: '2026-12-01',
};

describe('start run schema', () => {
  it('trims the lot number and fills missing notes with empty text', () => {
    expect(startRunSchema.parse(start)).toEqual({ ...start, lotNumber: 'L-2026-118', notes: '' });
  });

  it.each([
    [{ designId: undefined }, 'designId: Choose a released recipe'],
    [{ versionNumber: 0 }, 'versionNumber: Choose a released recipe'],
    [{ chamberId: Number.NaN }, 'chamberId: Choose the chamber'],
    [{ lotNumber: '  ' }, 'lotNumber: Enter the lot number'],
    [{ lotNumber: 'x'.repeat(61) }, 'lotNumber: At most 60 characters'],
    [{ runDate: '2026-02-29' }, 'runDate: Enter the date as YYYY-MM-DD'],
    [{ runDate: '2026-12-01T08:00:00Z' }, 'runDate: Enter the date as YYYY-MM-DD'],
    [{ notes: 'x'.repeat(4001) }, 'notes: At most 4000 characters'],
    [{ operatorId: 3 }, 'Unrecognized key: "operatorId"'],
  ])('refuses %j: %s', (patch, line) => {
    expect(problems(startRunSchema, { ...start, ...patch })).toEqual([line]);
  });

  it('takes a leap day of a leap year', () => {
    expect(problems(startRunSchema, { ...start, runDate: '2028-02-29' })).toEqual([]);
  });
});

describe('update run schema', () => {
  it('keeps what is left out unset, so the run keeps it', () => {
    expect(updateRunSchema.parse({ version: 3, notes: 'Pump-down 42 min' })).toEqual({
      version: 3,
      notes: 'Pump-down 42 min',
    });
  });

  it.each([
    [{ version: undefined, notes: 'x' }, 'version: version must be the version number last read'],
    [
      { layerReadings: [{ step: 0 }] },
      'layerReadings.0.step: step must be a deposition step number (1 = next to the substrate)',
    ],
    [
      { layerReadings: [{ step: 1, monitorThicknessNm: 0 }] },
      'layerReadings.0.monitorThicknessNm: Monitor thickness must be a number > 0',
    ],
    [
      { layerReadings: [{ step: 2, rateNmPerS: 'fast' }] },
      'layerReadings.0.rateNmPerS: Rate must be a number > 0',
    ],
    [
      { layerReadings: [{ step: 2, notes: 'x'.repeat(501) }] },
      'layerReadings.0.notes: At most 500 characters',
    ],
    [
      { layerReadings: Array.from({ length: 401 }, (_, i) => ({ step: i + 1 })) },
      'layerReadings: At most 400 layer readings',
    ],
    [
      { durability: [{ test: 'humidity', method: ' ', result: 'pass' }] },
      'durability.0.method: Name the test procedure followed (e.g. ISO 9211-4, tape adhesion)',
    ],
    [
      { durability: [{ test: 'salt fog', method: 'ISO 9022-4', result: 'pass' }] },
      'durability.0.test: test must be adhesion, abrasion, humidity or other',
    ],
    [
      { durability: [{ test: 'adhesion', method: 'tape', result: 'ok' }] },
      'durability.0.result: Choose pass or fail',
    ],
  ])('refuses %j: %s', (patch, line) => {
    expect(problems(updateRunSchema, { version: 2, ...patch })).toEqual([line]);
  });

  it('trims the procedure of a durability result', () => {
    const parsed = updateRunSchema.parse({
      version: 1,
      durability: [{ test: 'adhesion', method: ' ISO 9211-4, tape adhesion ', result: 'fail' }],
    });
    expect(parsed.durability).toEqual([
      { test: 'adhesion', method: 'ISO 9211-4, tape adhesion', result: 'fail' },
    ]);
  });
});

describe('remark schema', () => {
  it('trims the remark and refuses an empty or too long one', () => {
    expect(runRemarkSchema.parse({ text: '  Witness hazy at the rim ' })).toEqual({
      text: 'Witness hazy at the rim',
    });
    expect(problems(runRemarkSchema, { text: '   ' })).toEqual(['text: Enter the remark']);
    expect(problems(runRemarkSchema, { text: 'x'.repeat(RUN_REMARK_MAX_LENGTH + 1) })).toEqual([
      `text: At most ${RUN_REMARK_MAX_LENGTH} characters`,
    ]);
  });
});

describe('spectrum upload schema', () => {
  const upload = {
    filename: 'witness-R.csv',
    csv: 'wavelength_nm,R_percent\n400,0.3\n',
    angleDeg: 8,
    sample: 'witness',
  };

  it.each([
    [{ angleDeg: 90 }, 'angleDeg: Enter an angle from 0 to 89°'],
    [{ angleDeg: -1 }, 'angleDeg: Enter an angle from 0 to 89°'],
    [{ angleDeg: Number.NaN }, 'angleDeg: Enter an angle from 0 to 89°'],
    [{ sample: 'lens' }, 'sample: Choose witness sample or part'],
    [{ quantity: 'A' }, 'quantity: quantity must be R or T'],
    [{ filename: ' ' }, 'filename: The file needs a name'],
    [{ csv: undefined }, 'csv: csv must be the text of the file'],
  ])('refuses %j: %s', (patch, line) => {
    expect(problems(uploadSpectrumSchema, { ...upload, ...patch })).toEqual([line]);
  });

  it('takes 0 and 89° and an R or T choice', () => {
    expect(problems(uploadSpectrumSchema, { ...upload, angleDeg: 0, quantity: 'T' })).toEqual([]);
    expect(problems(uploadSpectrumSchema, { ...upload, angleDeg: 89 })).toEqual([]);
  });
});
