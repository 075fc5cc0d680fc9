import { describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { MAX_MASK_BANDS } from '../optics/mask.js';
import { enginePath, issueLines } from './common.js';
import {
  limitBandsSchema,
  specMaskCsvImportSchema,
  specMaskInputSchema,
  specMaskUpdateSchema,
} from './spec-masks.js';
import { problems } from './__tests__/problems.js';

const broadband = { from_nm: 420, to_nm: 680, quantity: 'R', max_percent: 0.5 };
const good = { name: ' HVS-3000 AR ', customerId: 4, revision: ' A ', bands: [broadband] };

const maskProblems = (body: unknown, schema: z.ZodType = specMaskInputSchema) => problems(schema, body);

describe('spec mask schemas', () => {
  it('trims name and revision and hands over the bands as the engine normalised them', () => {
    const parsed = specMaskInputSchema.parse(good);
    expect(parsed.name).toBe('HVS-3000 AR');
    expect(parsed.revision).toBe('A');
    expect(parsed.notes).toBeUndefined();
    expect(parsed.kind).toBeUndefined();
    expect(parsed.bands).toEqual([
      { ...broadband, angles_deg: [0], polarisation: 'avg', weight: 1, step_nm: 1 },
    ]);
  });

  it.each([
    [{ name: '  ' }, 'name: Enter a name'],
    [{ name: 'x'.repeat(161) }, 'name: At most 160 characters'],
    [{ revision: '' }, 'revision: Enter a revision'],
    [{ revision: 'x'.repeat(21) }, 'revision: At most 20 characters'],
    [{ customerId: 'Orrin' }, 'customerId: Choose the customer'],
    [{ notes: 'x'.repeat(4001) }, 'notes: At most 4000 characters'],
    [{ kind: 'secret' }, 'kind: Must be one of customer, internal'],
    [{ bands: 'R<1' }, 'bands: bands must be a list of limit bands'],
    [{ bands: [] }, 'bands: must hold at least one limit band'],
    [{ colour: 'red' }, 'Unrecognized key: "colour"'],
  ])('refuses %j with one message at the field', (patch, expected) => {
    expect(maskProblems({ ...good, ...patch })).toEqual([expected]);
  });

  it("names every bad band at once, at the engine's field, in the engine's words", () => {
    const bands = [
      { ...broadband, from_nm: 700 },
      broadband,
      { ...broadband, angles_deg: [0, 95] },
      { ...broadband, max_percent: 'NaN' },
    ];
    expect(maskProblems({ ...good, bands })).toEqual([
      'bands.0.from_nm: must not exceed to_nm (700 nm > 680 nm)',
      'bands.2.angles_deg.1: angle of incidence must be at least 0° and below 90° (got 95)',
      'bands.3.max_percent: must be a finite number (got "NaN")',
    ]);
  });

  it('checks the bands together once each band is sound: contradicting bands are refused at the later one', () => {
    const lines = maskProblems({
      ...good,
      bands: [broadband, { from_nm: 500, to_nm: 600, quantity: 'R', min_percent: 2 }],
    });
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/^bands\.1: .*contradicts .*no value meets both$/);
  });

  it('refuses more bands than a mask may have without checking each one', () => {
    const parsed = limitBandsSchema.safeParse(Array(MAX_MASK_BANDS + 1).fill(broadband));
    expect(parsed.success ? [] : issueLines(parsed.error)).toEqual([
      `holds ${MAX_MASK_BANDS + 1} bands; a mask has at most ${MAX_MASK_BANDS}`,
    ]);
  });

  it('an edit needs the version it was based on', () => {
    expect(maskProblems(good, specMaskUpdateSchema)).toEqual([
      'version: version must be the version number last read',
    ]);
    expect(specMaskUpdateSchema.parse({ ...good, version: 3 }).version).toBe(3);
  });

  it('a CSV import takes the details and the file text instead of bands', () => {
    const { bands: _bands, ...details } = good;
    expect(specMaskCsvImportSchema.parse({ ...details, csv: 'from_nm,to_nm\n' }).csv).toBe('from_nm,to_nm\n');
    expect(maskProblems({ ...details, csv: 3 }, specMaskCsvImportSchema)).toEqual([
      'csv: csv must be the text of the file',
    ]);
    expect(maskProblems({ ...good, csv: '' }, specMaskCsvImportSchema)).toEqual([
      'Unrecognized key: "bands"',
    ]);
  });

  it('reads engine field paths as path segments', () => {
    expect(enginePath('bands[2].angles_deg[0]')).toEqual(['bands', 2, 'angles_deg', 0]);
    expect(enginePath('layers[1].k')).toEqual(['layers', 1, 'k']);
    expect(enginePath('')).toEqual([]);
  });
});
