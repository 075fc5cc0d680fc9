import { describe, expect, it } from 'vitest';
import { runSheetQuerySchema } from './run-sheet.js';
import { problems } from './__tests__/problems.js';

const queryProblems = (query: Record<string, unknown>) =>
  problems(runSheetQuerySchema, { chamberId: '7', ...query });

describe('run sheet query', () => {
  it('reads numbers from the text of a query string and trims the part', () => {
    expect(
      runSheetQuerySchema.parse({
        chamberId: '7',
        monitorWavelengthNm: '632.8',
        part: '  BW-7 window ',
        quantity: '24',
        sides: 'front',
        substrateThicknessMm: '2.2',
      }),
    ).toEqual({
      chamberId: 7,
      monitorWavelengthNm: 632.8,
      part: 'BW-7 window',
      quantity: 24,
      sides: 'front',
      substrateThicknessMm: 2.2,
    });
  });

  it.each([
    [{ chamberId: undefined }, 'chamberId: Choose a chamber'],
    [{ chamberId: 'seven' }, 'chamberId: Choose a chamber'],
    [{ monitorWavelengthNm: '0' }, 'monitorWavelengthNm: The monitor wavelength must be above 0 nm'],
    [{ monitorWavelengthNm: 'green' }, 'monitorWavelengthNm: The monitor wavelength must be a number in nm'],
    [{ quantity: '0' }, 'quantity: At least 1'],
    [{ quantity: '2.5' }, 'quantity: A whole number of parts'],
    [{ quantity: '100001' }, 'quantity: At most 100000'],
    [{ substrateThicknessMm: '-1' }, 'substrateThicknessMm: Must be more than 0 mm'],
    [{ substrateThicknessMm: 'abc' }, 'substrateThicknessMm: A number in mm'],
    [{ substrateThicknessMm: '1001' }, 'substrateThicknessMm: At most 1000 mm'],
    [{ part: 'p'.repeat(81) }, 'part: At most 80 characters'],
    [{ part: ['a', 'b'] }, 'part: part must be text'],
    [{ sides: 'back' }, 'sides: sides must be one of front, both'],
    [{ colour: 'red' }, 'Unrecognized key: "colour"'],
  ])('refuses %j', (query, expected) => {
    expect(queryProblems(query)).toEqual([expected]);
  });
});
