import { describe, expect, it } from 'vitest';
import { TEST_MATERIALS } from '../../../test/design-fixtures';
import {
  looksLikeRows,
  parsePastedRows,
  pastedSeparator,
  periodRows,
  reverseBlock,
  rowsFromLayers,
} from '../layers';

// QWOT = 4·n·d/λref and FWOT = n·d/λref (Macleod, Thin-Film Optical Filters, 5th ed., ch. 2): with
// MgF2 at a constant n = 1.38 and λref = 550 nm, QWOT 1 is 99.6377 nm and FWOT 0.25 the same.
const QUARTER_MGF2_NM = 550 / (4 * 1.38);

function parsed(text: string, options = {}) {
  const result = parsePastedRows(text, TEST_MATERIALS, { referenceNm: 550, ...options });
  if (!result.ok) throw new Error(result.problems.join('; '));
  return result.rows.map((r) => ({ materialId: r.materialId, nm: Number(r.thicknessNm), notes: r.notes }));
}

describe('parsePastedRows', () => {
  it('reads tab, semicolon and comma separated rows, names in any case', () => {
    const expected = [
      { materialId: 4, nm: 99.64, notes: 'outer' },
      { materialId: 5, nm: 58.5, notes: '' },
    ];
    expect(parsed('MgF2\t99.64\touter\ntio2\t58.5')).toEqual(expected);
    expect(parsed('MgF2;99,64;outer\r\nTIO2;58,5\n')).toEqual(expected);
    expect(parsed('MgF2,99.64,outer\nTiO2,58.5')).toEqual(expected);
    expect(parsed('"MgF2","99.64","outer"\nTiO2,58.5')).toEqual(expected);
  });

  it('takes the column order and the thickness unit from a header line', () => {
    const rows = parsed('Notes;QWOT;Material\nouter;1,0;MgF2\n;2;MgF2');
    expect(rows.map((r) => r.notes)).toEqual(['outer', '']);
    expect(rows[0]!.nm).toBeCloseTo(QUARTER_MGF2_NM, 9);
    expect(rows[1]!.nm).toBeCloseTo(2 * QUARTER_MGF2_NM, 9);
    expect(parsed('Material\tFWOT\nMgF2\t0.25')[0]!.nm).toBeCloseTo(QUARTER_MGF2_NM, 9);
    // A header naming nm wins over the unit toggle.
    expect(parsed('Material,Thickness (nm)\nMgF2,99.64', { unit: 'qwot' })[0]!.nm).toBe(99.64);
  });

  it('reads headerless thicknesses in the unit chosen by the toggle', () => {
    expect(parsed('MgF2\t1', { unit: 'qwot' })[0]!.nm).toBeCloseTo(QUARTER_MGF2_NM, 9);
    expect(parsed('MgF2\t0.5', { unit: 'fwot' })[0]!.nm).toBeCloseTo(2 * QUARTER_MGF2_NM, 9);
  });

  it('rejects the whole paste and names every bad line', () => {
    const result = parsePastedRows('MgF2;1\nMgF3;1\nTiO2;-1', TEST_MATERIALS, {
      unit: 'qwot',
      referenceNm: 550,
    });
    expect(result).toEqual({
      ok: false,
      problems: ['Row 2: unknown material "MgF3"', 'Row 3: QWOT must be greater than 0'],
    });
    expect(parsePastedRows('MgF2\t1', TEST_MATERIALS, { unit: 'qwot', referenceNm: null })).toEqual({
      ok: false,
      problems: ['Row 1: QWOT needs a valid reference wavelength'],
    });
  });

  it('tells a block of rows from a single value', () => {
    expect(pastedSeparator('a\tb;c')).toBe('\t');
    expect(pastedSeparator('a;b,c')).toBe(';');
    expect(looksLikeRows('99.64')).toBe(false);
    expect(looksLikeRows('99,64')).toBe(false);
    expect(looksLikeRows('MgF2;99,64')).toBe(true);
    expect(looksLikeRows('MgF2\t99.64')).toBe(true);
    expect(looksLikeRows('1\n2')).toBe(true);
  });
});

describe('block tools', () => {
  const rows = rowsFromLayers(
    [10, 20, 30, 40].map((nm) => ({ materialId: 4, thicknessNm: nm, locked: false, notes: '' })),
  );

  it('repeats a period (H L)^n with fresh row ids', () => {
    const period = periodRows(rows[0]!, rows[1]!, 3);
    expect(period.map((r) => r.thicknessNm)).toEqual(['10', '20', '10', '20', '10', '20']);
    expect(new Set(period.map((r) => r.id)).size).toBe(6);
  });

  it('reverses a block and leaves the rest', () => {
    expect(reverseBlock(rows, 1, 3).map((r) => r.thicknessNm)).toEqual(['10', '40', '30', '20']);
    expect(reverseBlock(rows, 3, 0).map((r) => r.thicknessNm)).toEqual(['40', '30', '20', '10']);
  });
});
