import { describe, expect, it } from 'vitest';
import {
  acceptRequestSchema,
  diagnosisRequestSchema,
  fitRequestSchema,
  growRequestSchema,
  yieldRequestSchema,
} from './optimise.js';
import { shopTargetMarginSchema } from './shop.js';
import { problems } from './__tests__/problems.js';

describe('Fit to mask request', () => {
  it("fills the engine's defaults and leaves the target margin to the shop", () => {
    expect(fitRequestSchema.parse({})).toEqual({
      minThicknessNm: 10,
      maxThicknessNm: 1000,
      maxIterations: 100,
    });
  });

  it.each([
    [{ minThicknessNm: -1 }, 'minThicknessNm: Min thickness must be a number from 0 to 100000 nm'],
    [
      { minThicknessNm: 0, maxThicknessNm: 0 },
      'maxThicknessNm: Max thickness must be a number above 0 and at most 100000 nm',
    ],
    [
      { minThicknessNm: 50, maxThicknessNm: 20 },
      'maxThicknessNm: Max thickness must not be below min thickness (50 nm)',
    ],
    [{ minThicknessNm: 2000 }, 'maxThicknessNm: Max thickness must not be below min thickness (2000 nm)'],
    [{ maxIterations: 1001 }, 'maxIterations: Max iterations must be a whole number from 1 to 1000'],
    [{ maxIterations: 2.5 }, 'maxIterations: Max iterations must be a whole number from 1 to 1000'],
    [{ maxIterations: '60' }, 'maxIterations: Max iterations must be a whole number from 1 to 1000'],
    [{ targetMarginPercent: 9 }, 'targetMarginPercent: A number from 0 to 5 percentage points'],
    [{ specMaskId: 0 }, 'specMaskId: Choose a spec mask'],
    [{ colour: 'red' }, 'Unrecognized key: "colour"'],
  ])('refuses %j', (body, expected) => {
    expect(problems(fitRequestSchema, body)).toEqual([expected]);
  });

  it("refuses a target margin with the shop setting's own message", () => {
    const shop = problems(shopTargetMarginSchema, { targetMarginPercent: -1, version: 0 });
    expect(problems(fitRequestSchema, { targetMarginPercent: -1 })).toEqual(shop);
  });
});

describe('Grow layers request', () => {
  it('needs one to eight allowed materials and fills the limits', () => {
    expect(problems(growRequestSchema, {})).toEqual([
      'allowedMaterialIds: Choose the allowed materials from the library',
    ]);
    expect(problems(growRequestSchema, { allowedMaterialIds: [] })).toEqual([
      'allowedMaterialIds: Choose at least one material',
    ]);
    expect(problems(growRequestSchema, { allowedMaterialIds: [1, 2, 3, 4, 5, 6, 7, 8, 9] })).toEqual([
      'allowedMaterialIds: Choose at most 8 materials',
    ]);
    expect(growRequestSchema.parse({ allowedMaterialIds: [3] })).toMatchObject({
      maxLayers: 30,
      maxTotalThicknessNm: 5000,
      maxSteps: 30,
      minThicknessNm: 10,
      maxThicknessNm: 1000,
      growthMerit: 'smooth',
      needlesPerStep: 3,
    });
    expect(
      growRequestSchema.parse({ allowedMaterialIds: [3], growthMerit: 'mask', needlesPerStep: 10 }),
    ).toMatchObject({ growthMerit: 'mask', needlesPerStep: 10 });
  });

  it('places rules only on allowed materials', () => {
    expect(
      problems(growRequestSchema, {
        allowedMaterialIds: [3, 4],
        outermostOnlyMaterialIds: [4, 7],
        nextToSubstrateMaterialIds: [9],
      }),
    ).toEqual([
      'outermostOnlyMaterialIds.1: This material is not among the allowed materials',
      'nextToSubstrateMaterialIds.0: This material is not among the allowed materials',
    ]);
  });

  it.each([
    [{ maxLayers: 201 }, 'maxLayers: Max layers must be a whole number from 1 to 200'],
    [{ maxSteps: 0 }, 'maxSteps: Max steps must be a whole number from 1 to 200'],
    [{ growthMerit: 'flat' }, 'growthMerit: Grow on must be smooth or mask'],
    [{ needlesPerStep: 11 }, 'needlesPerStep: Needles per step must be a whole number from 1 to 10'],
    [{ needlesPerStep: 1.5 }, 'needlesPerStep: Needles per step must be a whole number from 1 to 10'],
    [
      { maxTotalThicknessNm: 0 },
      'maxTotalThicknessNm: Max total thickness must be a number above 0 and at most 1000000 nm',
    ],
    [
      { minThicknessNm: 30, maxThicknessNm: 20 },
      'maxThicknessNm: Max thickness must not be below min thickness (30 nm)',
    ],
  ])('refuses %j', (patch, expected) => {
    expect(problems(growRequestSchema, { allowedMaterialIds: [3], ...patch })).toEqual([expected]);
  });
});

describe('Yield forecast request', () => {
  it('needs the thickness error and fills trials and seed, not the error fields', () => {
    expect(problems(yieldRequestSchema, {})).toEqual([
      'thickness: thickness must be an object with the thickness error',
    ]);
    expect(yieldRequestSchema.parse({ thickness: { relativePercent: 1 } })).toEqual({
      trials: 2000,
      seed: 1,
      thickness: { relativePercent: 1 },
    });
  });

  it.each([
    [{ trials: 0 }, 'trials: Trials must be a whole number from 1 to 100000'],
    [{ trials: 100_001 }, 'trials: Trials must be a whole number from 1 to 100000'],
    [{ seed: 2 ** 32 }, 'seed: The seed must be a whole number from 0 to 4294967295'],
    [
      { thickness: { relativePercent: -1 } },
      'thickness.relativePercent: The thickness error must be a number from 0 to 50 %',
    ],
    [
      { thickness: { absoluteNm: 101 } },
      'thickness.absoluteNm: The thickness error must be a number from 0 to 100 nm',
    ],
    [
      { thickness: { distribution: 'flat' } },
      'thickness.distribution: The error distribution must be normal or uniform',
    ],
    [{ thickness: { sigma: 1 } }, 'thickness: Unrecognized key: "sigma"'],
    [{ systematicPercent: 51 }, 'systematicPercent: The rate error must be a number from 0 to 50 %'],
    [{ indexPercent: 21 }, 'indexPercent: The index error must be a number from 0 to 20 %'],
  ])('refuses %j', (patch, expected) => {
    expect(problems(yieldRequestSchema, { thickness: {}, ...patch })).toEqual([expected]);
  });
});

describe('Run diagnosis request', () => {
  it('defaults to factors 0.7 to 1.3 and refuses a range that is not 0 < low < high', () => {
    expect(diagnosisRequestSchema.parse({})).toEqual({ factorRange: [0.7, 1.3] });
    expect(problems(diagnosisRequestSchema, { factorRange: [0, 1.2] })).toEqual([
      'factorRange.0: The lowest factor must be a number above 0',
    ]);
    expect(problems(diagnosisRequestSchema, { factorRange: [1.2, 1.1] })).toEqual([
      'factorRange.1: The highest factor must exceed the lowest factor',
    ]);
    expect(problems(diagnosisRequestSchema, { factorRange: [0.7] })).toEqual([
      'factorRange: factorRange must be [lowest, highest] thickness factor',
    ]);
  });
});

describe('accepting a result', () => {
  it('takes an optional step of 0 or more', () => {
    expect(acceptRequestSchema.parse({})).toEqual({});
    expect(acceptRequestSchema.parse({ step: 2 })).toEqual({ step: 2 });
    expect(problems(acceptRequestSchema, { step: -1 })).toEqual([
      "step: step must be the number of one of the result's steps",
    ]);
  });
});
