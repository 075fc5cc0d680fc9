import { describe, expect, it } from 'vitest';
import {
  EMPTY_BAND,
  bandOf,
  mapMaskError,
  maskFormSchema,
  valuesOfBand,
  type BandValues,
} from '../band-form';

// API details as the shared spec-mask schema writes them: the engine's problem at its field path
// (`bands.1.to_nm: …`), with the API's "Invalid input: " prefix on the message.

describe('spec mask form values', () => {
  it('maps API field paths to form fields', () => {
    expect(mapMaskError('bands.1.to_nm: must be greater than 0 (got 0)')).toEqual({
      path: 'bands.1.toNm',
      band: 1,
      message: 'must be greater than 0 (got 0)',
    });
    expect(mapMaskError('Invalid input: bands.0.from_nm: must not exceed to_nm (700 nm > 680 nm)')).toEqual({
      path: 'bands.0.fromNm',
      band: 0,
      message: 'must not exceed to_nm (700 nm > 680 nm)',
    });
    expect(mapMaskError('bands.2.angles_deg.1: angle of incidence must be below 90°').path).toBe(
      'bands.2.angles',
    );
    expect(mapMaskError('bands.0.max_percent: must lie between 0 and 100 percent (got 120)').path).toBe(
      'bands.0.value',
    );
    expect(mapMaskError('bands.3: give only one bound (got max_percent and min_percent)')).toEqual({
      path: null,
      band: 3,
      message: 'give only one bound (got max_percent and min_percent)',
    });
    expect(mapMaskError('bands.1.weight: must be greater than 0 (got 0)')).toEqual({
      path: null,
      band: 1,
      message: 'weight: must be greater than 0 (got 0)',
    });
    expect(mapMaskError('customerId: customer 99 does not exist')).toEqual({
      path: null,
      band: null,
      message: 'customerId: customer 99 does not exist',
    });
  });

  it("checks the typed text, then the bands with the API's schema, each problem at its field", () => {
    const row = { ...EMPTY_BAND, fromNm: '420', toNm: '680', value: '0.5' };
    const body = (bands: BandValues[]) => ({
      name: ' Lens AR ',
      customerId: '3',
      revision: 'A',
      kind: 'customer',
      notes: '',
      bands,
    });
    const problems = (bands: BandValues[]) => {
      const parsed = maskFormSchema.safeParse(body(bands));
      return parsed.success ? [] : parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
    };
    expect(maskFormSchema.parse(body([row]))).toEqual({
      name: 'Lens AR',
      customerId: 3,
      revision: 'A',
      kind: 'customer',
      notes: '',
      bands: [
        { from_nm: 420, to_nm: 680, angles_deg: [0], polarisation: 'avg', quantity: 'R', max_percent: 0.5 },
      ],
    });
    expect(problems([{ ...row, toNm: 'abc', angles: '0, x' }])).toEqual([
      'bands.0.toNm: Enter a number',
      'bands.0.angles: Enter angles as numbers separated by commas, e.g. 0, 15, 30',
    ]);
    expect(problems([{ ...row, fromNm: '700' }, row, { ...row, value: '120' }])).toEqual([
      'bands.0.fromNm: must not exceed to_nm (700 nm > 680 nm)',
      'bands.2.value: must lie between 0 and 100 percent (got 120)',
    ]);
    expect(problems([row, { ...row, boundType: 'min', value: '2' }])).toEqual([
      expect.stringMatching(/^bands\.1\.band: .*contradicts .*no value meets both$/),
    ]);
  });

  it('round-trips a band through the form, keeping step and weight', () => {
    const band = {
      from_nm: 420,
      to_nm: 680,
      angles_deg: [0, 15, 30],
      polarisation: 'avg' as const,
      quantity: 'R' as const,
      max_percent: 0.5,
      step_nm: 2,
      weight: 3,
    };
    expect(bandOf(valuesOfBand(band))).toEqual(band);
  });
});
