import { describe, expect, it } from 'vitest';
import { issueLines } from './common.js';
import { processSettingsSchema } from './process-settings.js';
import { problems } from './__tests__/problems.js';

const row = {
  materialId: 5,
  substrateTemperatureC: 250,
  basePressureMbar: 2e-5,
  o2FlowSccm: 12,
};

const settingProblems = (patch: object, version = 0) =>
  problems(processSettingsSchema, { settings: [{ ...row, ...patch }], version });

describe('process settings schema', () => {
  it('fills unused quantities with null and trims the note', () => {
    const parsed = processSettingsSchema.parse({
      settings: [{ ...row, ionVoltageV: null, notes: '  hold the rate  ' }],
      version: 3,
    });
    expect(parsed).toEqual({
      version: 3,
      settings: [
        {
          ...row,
          o2PartialPressureMbar: null,
          arFlowSccm: null,
          ionVoltageV: null,
          ionCurrentA: null,
          ionGasFlowSccm: null,
          notes: 'hold the rate',
        },
      ],
    });
  });

  it.each([
    [{ substrateTemperatureC: 'hot' }, 'settings.0.substrateTemperatureC: A number in °C'],
    [{ substrateTemperatureC: 900 }, 'settings.0.substrateTemperatureC: At most 400 °C'],
    [
      { substrateTemperatureC: undefined },
      'settings.0.substrateTemperatureC: Needed once the material has a setting',
    ],
    [{ basePressureMbar: 0 }, 'settings.0.basePressureMbar: At least 1e-9 mbar'],
    [{ basePressureMbar: 2 }, 'settings.0.basePressureMbar: At most 0.001 mbar'],
    [{ o2FlowSccm: -3 }, 'settings.0.o2FlowSccm: At least 0 sccm'],
    [{ ionCurrentA: 'high' }, 'settings.0.ionCurrentA: A number in A'],
    [{ ionCurrentA: Number.NaN }, 'settings.0.ionCurrentA: A number in A'],
    [{ notes: 'n'.repeat(301) }, 'settings.0.notes: At most 300 characters'],
    [{ materialId: 0 }, 'settings.0.materialId: Choose a material'],
    [{ colour: 'red' }, 'settings.0: Unrecognized key: "colour"'],
  ])('refuses %j with one message at the field', (patch, expected) => {
    expect(settingProblems(patch)).toEqual([expected]);
  });

  it('refuses a material listed twice and a version that was never read', () => {
    const parsed = processSettingsSchema.safeParse({
      settings: [row, { ...row, o2FlowSccm: 3 }],
      version: -1,
    });
    expect(parsed.success ? [] : issueLines(parsed.error)).toEqual([
      'settings.1.materialId: This material is already listed in row 1',
      'version: version must be the version you read',
    ]);
  });
});
