import { describe, expect, it } from 'vitest';
import { MAX_NK_CSV_BYTES, parseNkCsv } from './nk-csv.js';

function problems(text: string, unit: 'nm' | 'um' = 'nm') {
  const r = parseNkCsv(text, unit);
  if (r.ok) throw new Error('expected the file to be rejected');
  return r.problems;
}

describe('parseNkCsv: valid files', () => {
  it('reads a headed file with columns in any order and converts µm to nm', () => {
    const r = parseNkCsv('k,wavelength_um,n\n0,0.4,1.47\n0.001,0.5,1.46\n', 'um');
    expect(r).toEqual({
      ok: true,
      headerRow: true,
      unit: 'um',
      decimalComma: false,
      table: { wavelengths: [400, 500], n: [1.47, 1.46], k: [0, 0.001] },
    });
  });

  it('reads a headerless two-column file (k = 0), semicolon- or tab-separated, with a BOM and blank lines', () => {
    const semi = parseNkCsv('\uFEFF400;2.30\n\n500;2.25\n', 'nm');
    expect(semi.ok && semi.table).toEqual({ wavelengths: [400, 500], n: [2.3, 2.25], k: [0, 0] });
    const tab = parseNkCsv('400\t2.30\t0\r\n500\t2.25\t1e-4\r\n', 'nm');
    expect(tab.ok && tab.table.k).toEqual([0, 1e-4]);
  });
});

describe('parseNkCsv: headers with units, decimal commas', () => {
  it('takes the unit from a header such as "Wavelength (nm)" or "wavelength [µm]"', () => {
    const nm = parseNkCsv('Wavelength (nm),n,k\n400,1.47,0\n500,1.46,0.001\n', null);
    expect(nm).toMatchObject({ ok: true, unit: 'nm', table: { wavelengths: [400, 500] } });
    const um = parseNkCsv(
      'wavelength [µm]\tn (-)\tk (-)\n0.252\t1.523846\t0.001211\n0.254\t1.522945\t0.001171\n',
      null,
    );
    expect(um).toMatchObject({
      ok: true,
      unit: 'um',
      table: { wavelengths: [252, 254], n: [1.523846, 1.522945] },
    });
    expect(parseNkCsv('λ/nm;n\n400;2.3\n500;2.25\n', null)).toMatchObject({ ok: true, unit: 'nm' });
  });

  it('reads decimal commas in semicolon- and tab-separated files', () => {
    const r = parseNkCsv('Wavelength (µm);n;k\n0,40;1,4701;0\n0,50;1,4623;1,2e-4\n', null);
    expect(r).toEqual({
      ok: true,
      headerRow: true,
      unit: 'um',
      decimalComma: true,
      table: { wavelengths: [400, 500], n: [1.4701, 1.4623], k: [0, 1.2e-4] },
    });
  });

  it('refuses a header unit that contradicts the chosen unit, and a file with no unit at all', () => {
    expect(problems('Wavelength (nm),n\n400,1.5\n500,1.4\n', 'um')[0]!.reason).toMatch(
      /the header gives the wavelengths in nm, but µm was chosen/,
    );
    const r = parseNkCsv('400,1.5\n500,1.4\n', null);
    expect(r.ok === false && r.problems[0]!.reason).toMatch(/names no wavelength unit/);
  });
});

describe('parseNkCsv: every kind of bad file is rejected with row-level reasons', () => {
  it('1 empty file', () => {
    expect(problems('')).toEqual([{ row: 0, reason: 'the file is empty' }]);
    expect(problems('  \n\n')).toEqual([{ row: 0, reason: 'the file is empty' }]);
  });
  it('2 header only', () => {
    expect(problems('wavelength_nm,n,k\n')).toEqual([{ row: 0, reason: 'at least 2 data rows are needed' }]);
  });
  it('3 a header without an n column', () => {
    expect(problems('wavelength_nm,value\n400,1.5\n')[0]!.reason).toMatch(
      /must name a wavelength column .* and an n column/,
    );
  });
  it('4 non-numeric cells, each named, on their own line numbers', () => {
    expect(problems('wavelength_nm,n,k\n400,1.5,0\n450,abc,0\n500,1.4,x\n')).toEqual([
      { row: 3, reason: 'not a number: n "abc"' },
      { row: 4, reason: 'not a number: k "x"' },
    ]);
  });
  it('5 NaN and Infinity are not numbers', () => {
    expect(problems('400,NaN\n500,Infinity\n').map((p) => p.row)).toEqual([1, 2]);
  });
  it('6 negative or zero n, negative k', () => {
    expect(problems('400,-1.5,0\n500,1.5,-0.01\n600,0,0\n')).toEqual([
      { row: 1, reason: 'n must be > 0' },
      { row: 2, reason: 'k must be ≥ 0 (k > 0 is absorption)' },
      { row: 3, reason: 'n must be > 0' },
    ]);
  });
  it('7 wavelengths that repeat or go backwards', () => {
    expect(problems('400,1.5\n500,1.4\n500,1.4\n450,1.45\n')).toEqual([
      { row: 3, reason: 'wavelength 500 nm does not increase (previous row 500 nm)' },
      { row: 4, reason: 'wavelength 450 nm does not increase (previous row 500 nm)' },
    ]);
  });
  it('8 rows with a different number of columns', () => {
    expect(problems('400,1.5,0\n500,1.4\n')).toEqual([{ row: 2, reason: 'has 2 column(s), the file has 3' }]);
  });
  it('9 a single column', () => {
    expect(problems('400\n500\n')[0]!.reason).toBe('expected 2 or 3 columns: wavelength, n and optionally k');
  });
  it('10 the wrong unit: µm values read as nm, and nm values read as µm', () => {
    expect(problems('0.4,1.5\n0.5,1.4\n', 'nm')[0]!.reason).toMatch(/look like µm/);
    expect(problems('400000,1.5\n500000,1.4\n', 'um')[0]!.reason).toMatch(/look like nm/);
  });
  it('11 a file over the size limit', () => {
    const big = '400,1.5\n'.repeat(Math.ceil(MAX_NK_CSV_BYTES / 8) + 10);
    expect(problems(big)).toEqual([{ row: 0, reason: 'the file is larger than 1 MB' }]);
  });
  it('12 unbalanced quotes', () => {
    expect(problems('400,"1.5\n500,1.4\n')[0]!.reason).toMatch(/unbalanced quotes/);
  });
  it('13 a negative wavelength', () => {
    expect(problems('-400,1.5\n500,1.4\n')).toEqual([{ row: 1, reason: 'wavelength must be > 0' }]);
  });
});
