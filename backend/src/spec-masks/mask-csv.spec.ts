import { describe, expect, it } from 'vitest';
import { validateSpecMask } from '@quietglass/shared/optics/mask';
import { maskToCsv, parseMaskCsv } from './mask-csv.js';

const bad = (text: string) => {
  const r = parseMaskCsv(text);
  if (r.ok) throw new Error('expected rejection');
  return r.problems;
};

describe('spec-mask CSV', () => {
  it('reads bands with angle lists and writes them back unchanged (round trip through the engine)', () => {
    const csv =
      'from_nm,to_nm,angles_deg,polarisation,quantity,max_percent,label\n420,680,0;15;30,avg,R,0.5,visible\n1064,1064,0,s,R,0.2,\n';
    const parsed = parseMaskCsv(csv);
    expect(parsed).toEqual({
      ok: true,
      bands: [
        {
          from_nm: 420,
          to_nm: 680,
          angles_deg: [0, 15, 30],
          polarisation: 'avg',
          quantity: 'R',
          max_percent: 0.5,
          label: 'visible',
        },
        { from_nm: 1064, to_nm: 1064, angles_deg: [0], polarisation: 's', quantity: 'R', max_percent: 0.2 },
      ],
    });
    if (!parsed.ok) return;
    const bands = validateSpecMask({ bands: parsed.bands }).bands;
    const again = parseMaskCsv(maskToCsv(bands));
    expect(again.ok && validateSpecMask({ bands: again.bands }).bands).toEqual(bands);
  });

  it('reads an angle range with a step and a band margin, and writes them back as a range', () => {
    const csv =
      'from_nm,to_nm,angle_from_deg,angle_to_deg,angle_step_deg,quantity,max_percent,margin_percent\n420,680,0,20,5,R,0.5,0.1\n';
    const parsed = parseMaskCsv(csv);
    if (!parsed.ok) throw new Error('expected the file to be read');
    const bands = validateSpecMask({ bands: parsed.bands }).bands;
    expect(bands[0]).toMatchObject({
      angles_deg: [0, 5, 10, 15, 20],
      angle_step_deg: 5,
      margin_percent: 0.1,
    });
    const written = maskToCsv(bands);
    expect(written.split('\n')[1]).toContain('0;5;10;15;20');
    const again = parseMaskCsv(written);
    expect(again.ok && validateSpecMask({ bands: again.bands }).bands).toEqual(bands);
  });

  it('rejects unknown or missing columns in the header', () => {
    expect(bad('from_nm,to_nm,colour\n400,500,red\n')[0]!.reason).toMatch(
      /unknown column\(s\) colour; missing column\(s\) quantity/,
    );
  });
  it('rejects text in a number column and a bad angle list, naming the line', () => {
    expect(bad('from_nm,to_nm,quantity,max_percent,angles_deg\n400,500,R,half,0\n400,500,R,1,0;x\n')).toEqual(
      [
        { row: 2, reason: 'max_percent "half" is not a number' },
        { row: 3, reason: 'angles_deg "0;x" must be numbers separated by spaces or ;' },
      ],
    );
  });
  it('rejects an empty file, a header without bands and ragged rows', () => {
    expect(bad('')[0]!.reason).toBe('the file is empty');
    expect(bad('from_nm,to_nm,quantity\n')[0]!.reason).toBe('the file has a header but no limit band');
    expect(bad('from_nm,to_nm,quantity\n400,500\n')).toEqual([
      { row: 2, reason: 'has 2 column(s), the header has 3' },
    ]);
  });
});
