import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { writeCsv } from './csv.js';

// OWASP "CSV Injection": cells starting with = + - @ (and tab, carriage return) are run as formulas
// by spreadsheet programs; the advised defence is a leading single quote on such text cells.
describe('writeCsv', () => {
  it('neutralises formula-looking text cells and leaves numbers as numbers', () => {
    const csv = writeCsv(
      ['name', 'value'],
      [
        ['=HYPERLINK("http://x.example","click")', 1],
        ['+SUM(A1:A2)', -0.25],
        ['-2+3', 0],
        ['@cmd', 2],
        ['plain text', -1.5e-3],
      ],
    );
    const rows = Papa.parse<string[]>(csv.trim()).data;
    expect(rows).toEqual([
      ['name', 'value'],
      ['\'=HYPERLINK("http://x.example","click")', '1'],
      ["'+SUM(A1:A2)", '-0.25'],
      ["'-2+3", '0'],
      ["'@cmd", '2'],
      ['plain text', '-0.0015'],
    ]);
  });
});
