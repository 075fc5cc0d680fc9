import { describe, expect, it } from 'vitest';
import { MAX_SPECTRUM_CSV_BYTES, parseSpectrumCsv } from './spectrum-csv.js';

const bad = (text: string) => {
  const r = parseSpectrumCsv(text);
  if (r.ok) throw new Error('expected the file to be rejected');
  return r.problems;
};

describe('measured spectrum CSV', () => {
  it('reads wavelength_nm with R_percent, ignoring other columns, with a BOM and CRLF', () => {
    const r = parseSpectrumCsv('\uFEFFwavelength_nm,R_percent,note\r\n400,0.82,a\r\n401,0.80,b\r\n');
    expect(r).toEqual({
      ok: true,
      spectrum: { quantity: 'R', wavelengthsNm: [400, 401], valuesPercent: [0.82, 0.8] },
    });
    const t = parseSpectrumCsv('wavelength_nm;T_percent\n500;95.5\n600;96.1\n');
    expect(t.ok && t.spectrum.quantity).toBe('T');
  });

  it.each([
    ['1 empty', '', [{ row: 0, reason: 'the file is empty' }]],
    [
      '2 no header',
      '400,0.8\n500,0.7\n',
      [{ row: 1, reason: expect.stringMatching(/no wavelength_nm column/) }],
    ],
    [
      '3 no value column',
      'wavelength_nm,absorbance\n400,0.1\n',
      [{ row: 1, reason: expect.stringMatching(/no R_percent or T_percent column/) }],
    ],
    [
      '4 both R and T',
      'wavelength_nm,R_percent,T_percent\n400,1,98\n500,1,98\n',
      [{ row: 1, reason: expect.stringMatching(/both R and T columns: choose the quantity/) }],
    ],
    ['5 header only', 'wavelength_nm,R_percent\n', [{ row: 0, reason: 'at least 2 data rows are needed' }]],
    [
      '6 text in a cell',
      'wavelength_nm,R_percent\n400,0.8\n410,high\n',
      [{ row: 3, reason: 'not a number: R "high"' }],
    ],
    ['7 NaN', 'wavelength_nm,R_percent\n400,NaN\n410,0.5\n', [{ row: 2, reason: 'not a number: R "NaN"' }]],
    [
      '8 negative percent',
      'wavelength_nm,R_percent\n400,-0.1\n410,0.5\n',
      [{ row: 2, reason: 'R must lie between 0 and 100 percent (got -0.1)' }],
    ],
    [
      '9 over 100 percent',
      'wavelength_nm,T_percent\n400,100.5\n410,99\n',
      [{ row: 2, reason: 'T must lie between 0 and 100 percent (got 100.5)' }],
    ],
    [
      '10 wavelengths going back',
      'wavelength_nm,R_percent\n400,1\n390,1\n',
      [{ row: 3, reason: 'wavelength 390 nm does not increase (previous row 400 nm)' }],
    ],
    [
      '11 ragged row',
      'wavelength_nm,R_percent\n400,1\n410\n',
      [{ row: 3, reason: 'has 1 column(s), the header has 2' }],
    ],
    [
      '12 µm wavelengths',
      'wavelength_nm,R_percent\n0.4,1\n0.5,1\n',
      [{ row: 0, reason: 'the wavelengths look like µm (all below 100); the file must give nm' }],
    ],
    [
      '13 unbalanced quotes',
      'wavelength_nm,R_percent\n400,"1\n410,1\n',
      [{ row: 2, reason: expect.stringMatching(/unbalanced quotes/) }],
    ],
    [
      '14 zero wavelength',
      'wavelength_nm,R_percent\n0,1\n410,1\n',
      [{ row: 2, reason: 'wavelength must be > 0' }],
    ],
  ])('rejects %s with a row-level reason', (_name, text, problems) => {
    expect(bad(text)).toEqual(problems);
  });

  // Rows as `npm run calc -- --angles 0,20 --pol s,p,avg` writes them: fractions 0–1. The 0° values
  // are the Fresnel normal-incidence reflectance of an uncoated n = 1.52 surface,
  // R = ((n − 1)/(n + 1))² = 0.0425784… (Hecht, Optics, 5th ed., eq. 4.47); the 20° rows differ.
  const cli = [
    'wavelength_nm,angle_deg,pol,R,T,A',
    '500,0,s,0.04257844,0.95742156,0',
    '500,0,p,0.04257844,0.95742156,0',
    '500,0,avg,0.04257844,0.95742156,0',
    '600,0,s,0.04257844,0.95742156,0',
    '600,0,p,0.04257844,0.95742156,0',
    '600,0,avg,0.04257844,0.95742156,0',
    '500,20,avg,0.0432,0.9568,0',
    '600,20,avg,0.0432,0.9568,0',
    '',
  ].join('\n');

  it("reads the calculation CLI's output: the rows at the measured angle, avg polarisation, fraction to percent", () => {
    const r = parseSpectrumCsv(cli, { angleDeg: 0, quantity: 'R' });
    if (!r.ok) throw new Error(JSON.stringify(r.problems));
    expect(r.spectrum.quantity).toBe('R');
    expect(r.spectrum.wavelengthsNm).toEqual([500, 600]);
    expect(r.spectrum.valuesPercent[0]).toBeCloseTo(4.257844, 9);
    const t = parseSpectrumCsv(cli, { angleDeg: 20, quantity: 'T' });
    expect(t.ok && t.spectrum.valuesPercent).toEqual([95.68, 95.68]);
    const plain = parseSpectrumCsv('wavelength_nm,R\n400,0.005\n500,0.004\n');
    expect(plain.ok && plain.spectrum.valuesPercent).toEqual([0.5, 0.4]);
  });

  it('says what to choose when the CLI output is ambiguous, and rejects fractions above 1', () => {
    expect(bad(cli)).toEqual([
      { row: 1, reason: expect.stringMatching(/both R and T columns: choose the quantity/) },
    ]);
    const r = parseSpectrumCsv(cli, { quantity: 'R' });
    expect(!r.ok && r.problems).toEqual([
      { row: 0, reason: 'the file holds angles 0, 20°: say which one was measured' },
    ]);
    const at8 = parseSpectrumCsv(cli, { quantity: 'R', angleDeg: 8 });
    expect(!at8.ok && at8.problems).toEqual([
      { row: 0, reason: 'no rows at 8°; the file holds angles 0, 20°' },
    ]);
    const noAvg = parseSpectrumCsv(
      'wavelength_nm,angle_deg,pol,R\n500,45,s,0.1\n500,45,p,0.02\n600,45,s,0.1\n',
      { angleDeg: 45 },
    );
    expect(!noAvg.ok && noAvg.problems).toEqual([
      { row: 0, reason: 'the file holds polarisations s, p: upload one, or avg' },
    ]);
    expect(bad('wavelength_nm,R\n400,1.2\n500,0.5\n')).toEqual([
      { row: 2, reason: 'R must lie between 0 and 1 (the column is a fraction) (got 1.2)' },
    ]);
    const missing = parseSpectrumCsv('wavelength_nm,R_percent\n400,1\n500,1\n', { quantity: 'T' });
    expect(!missing.ok && missing.problems[0]!.reason).toMatch(/no T column/);
  });

  it('rejects a file over 2 MB', () => {
    const big =
      'wavelength_nm,R_percent\n' +
      '400.000000,0.500000\n'.repeat(Math.ceil(MAX_SPECTRUM_CSV_BYTES / 20) + 10);
    expect(bad(big)).toEqual([{ row: 0, reason: 'the file is larger than 2 MB' }]);
  });
});
