import { describe, expect, it } from 'vitest';
import { bandOf, mapMaskError, valuesOfBand } from '../band-form';

// Field paths as the engine's validateSpecMask writes them (shared/src/optics/mask.ts), with the
// API's "Invalid input: " prefix on the message and the bare text in `details`.

describe('spec mask form values', () => {
  it('maps engine field paths to form fields', () => {
    expect(mapMaskError('bands[1].to_nm: must be a number > 0 (got 0)')).toEqual({
      path: 'bands.1.toNm',
      band: 1,
      message: 'must be a number > 0 (got 0)',
    });
    expect(mapMaskError('Invalid input: bands[0].from_nm: must not exceed to_nm (700 nm > 680 nm)')).toEqual({
      path: 'bands.0.fromNm',
      band: 0,
      message: 'must not exceed to_nm (700 nm > 680 nm)',
    });
    expect(mapMaskError('bands[2].angles_deg[1]: must be below 90°').path).toBe('bands.2.angles');
    expect(mapMaskError('bands[0].max_percent: must lie between 0 and 100 percent (got 120)').path).toBe(
      'bands.0.value',
    );
    expect(mapMaskError('bands[3]: give only one bound (got max_percent and min_percent)')).toEqual({
      path: null,
      band: 3,
      message: 'give only one bound (got max_percent and min_percent)',
    });
    expect(mapMaskError('customerId: customer 99 does not exist')).toEqual({
      path: null,
      band: null,
      message: 'customerId: customer 99 does not exist',
    });
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
