import { describe, expect, it } from 'vitest';
import { shopLogoSchema, shopNameSchema, shopTargetMarginSchema } from './shop.js';
import { problems } from './__tests__/problems.js';

describe('shop settings schemas', () => {
  it('trims the shop name; version 0 is the first save', () => {
    expect(shopNameSchema.parse({ shopName: '  Larkspur Optics ', version: 0 })).toEqual({
      shopName: 'Larkspur Optics',
      version: 0,
    });
  });

  it.each([
    [{ shopName: '   ', version: 0 }, 'shopName: The shop needs a name'],
    [{ shopName: 'x'.repeat(121), version: 0 }, 'shopName: At most 120 characters'],
    [{ shopName: 'Fine', version: -1 }, 'version: version must be the version you read'],
    [{ shopName: 'Fine', version: 0, colour: 'red' }, 'Unrecognized key: "colour"'],
  ])('refuses the name %j', (body, expected) => {
    expect(problems(shopNameSchema, body)).toEqual([expected]);
  });

  it.each([
    [-0.1, 'targetMarginPercent: A number from 0 to 5 percentage points'],
    [6, 'targetMarginPercent: A number from 0 to 5 percentage points'],
    ['0.2', 'targetMarginPercent: A number from 0 to 5 percentage points'],
    [undefined, 'targetMarginPercent: A number from 0 to 5 percentage points'],
  ])('refuses the target margin %j', (targetMarginPercent, expected) => {
    expect(problems(shopTargetMarginSchema, { targetMarginPercent, version: 3 })).toEqual([expected]);
  });

  it('accepts margins from 0 to 5 percentage points', () => {
    expect(problems(shopTargetMarginSchema, { targetMarginPercent: 0, version: 3 })).toEqual([]);
    expect(problems(shopTargetMarginSchema, { targetMarginPercent: 5, version: 3 })).toEqual([]);
  });

  it.each([
    [
      { contentType: 'image/gif', dataBase64: 'R0lGODlh' },
      'contentType: The logo must be a PNG or JPEG image',
    ],
    [{ contentType: 'image/png', dataBase64: '' }, 'dataBase64: The logo file is empty'],
    [
      // 512 KB of file is 699 052 characters of base64 (4 per 3 bytes, padded).
      { contentType: 'image/png', dataBase64: 'A'.repeat(699_056) },
      'dataBase64: The logo must be at most 512 KB',
    ],
  ])('refuses the logo %#', (body, expected) => {
    expect(problems(shopLogoSchema, { ...body, version: 1 })).toEqual([expected]);
  });
});
