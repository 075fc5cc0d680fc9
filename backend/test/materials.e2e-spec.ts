import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, demoSession } from './support/app.js';

let app: NestExpressApplication;
let engineer: string;
let engineer2: string;

beforeAll(async () => {
  app = await createTestApp();
  engineer = await demoSession(app, 'engineer', 0);
  engineer2 = await demoSession(app, 'engineer', 1);
});
afterAll(async () => {
  await app.close();
});

const http = () => request(app.getHttpServer());
const materialCount = async () =>
  Number((await app.get(DataSource).query('SELECT count(*) AS n FROM materials'))[0].n);

describe('materials library', () => {
  it('has the demo substrates from published Sellmeier coefficients and typical coating materials', async () => {
    const res = await http().get('/api/materials').set('Cookie', engineer);
    expect(res.status).toBe(200);
    const byName = Object.fromEntries(
      (res.body as { name: string; typical: boolean }[]).map((m) => [m.name, m]),
    );
    // SCHOTT optical glass data sheet, N-BK7.
    expect(byName['N-BK7']).toMatchObject({
      typical: false,
      model: { model: 'sellmeier', B: [1.03961212, 0.231792344, 1.01046945] },
    });
    for (const name of ['MgF2', 'SiO2', 'Al2O3', 'ZrO2', 'Ta2O5', 'TiO2'])
      expect(byName[name]?.typical).toBe(true);
  });

  it('creates a Cauchy material and returns the normalised model', async () => {
    const res = await http()
      .post('/api/materials')
      .set('Cookie', engineer)
      .send({
        name: 'Shop HfO2 run 12',
        model: { model: 'cauchy', A: 1.9, B: 0.015 },
        rangeNm: { from: 350, to: 1100 },
        provenance: { source: 'witness fit', date: '2026-11-20', notes: 'chamber 2, IAD' },
      });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      name: 'Shop HfO2 run 12',
      model: { model: 'cauchy', A: 1.9, B: 0.015 },
      rangeNm: { from: 350, to: 1100 },
      typical: false,
      provenance: { source: 'witness fit', date: '2026-11-20', notes: 'chamber 2, IAD' },
      version: 1,
    });
  });

  it.each([
    [{ model: { model: 'constant', n: -1.5 } }, /model\.n/],
    [{ model: { model: 'constant', n: 1.5, k: -0.1 } }, /model\.k/],
    [
      { model: { model: 'sellmeier', B: [1.0], C: [0.3] }, rangeNm: { from: 300, to: 900 } },
      /no physical index/,
    ],
    [
      { model: { model: 'table', wavelengths: [400, 500], n: [1.5, 1.4] }, rangeNm: { from: 380, to: 500 } },
      /beyond the table/,
    ],
    [{ rangeNm: { from: 900, to: 400 } }, /must be > 0 and below/],
    [{ model: { model: 'quantum' } }, /model\.model/],
  ])('rejects a bad model or range %# with 400 and writes nothing', async (patch, message) => {
    const before = await materialCount();
    const res = await http()
      .post('/api/materials')
      .set('Cookie', engineer)
      .send({
        name: 'Bad one',
        model: { model: 'constant', n: 1.5 },
        rangeNm: { from: 400, to: 900 },
        ...patch,
      });
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(message);
    expect(await materialCount()).toBe(before);
  });

  it('a stale save gets 409 and does not overwrite the newer version', async () => {
    const created = await http()
      .post('/api/materials')
      .set('Cookie', engineer)
      .send({
        name: 'Contested SiO2',
        model: { model: 'constant', n: 1.46 },
        rangeNm: { from: 400, to: 900 },
      });
    const id = created.body.id;
    const first = await http()
      .put(`/api/materials/${id}`)
      .set('Cookie', engineer)
      .send({
        name: 'Contested SiO2',
        model: { model: 'constant', n: 1.47 },
        rangeNm: { from: 400, to: 900 },
        version: 1,
      });
    expect(first.status).toBe(200);
    expect(first.body.version).toBe(2);
    const stale = await http()
      .put(`/api/materials/${id}`)
      .set('Cookie', engineer2)
      .send({
        name: 'Contested SiO2',
        model: { model: 'constant', n: 1.44 },
        rangeNm: { from: 400, to: 900 },
        version: 1,
      });
    expect(stale.status).toBe(409);
    expect(stale.body.message).toMatch(/changed by someone else \(now version 2\)/);
    const now = await http().get(`/api/materials/${id}`).set('Cookie', engineer);
    expect(now.body.model.n).toBe(1.47);
  });

  it('sales and operators read the library but cannot change it', async () => {
    for (const role of ['sales', 'operator'] as const) {
      const cookie = await demoSession(app, role);
      expect((await http().get('/api/materials').set('Cookie', cookie)).status).toBe(200);
      const res = await http()
        .post('/api/materials')
        .set('Cookie', cookie)
        .send({ name: `By ${role}`, model: { model: 'constant', n: 1.5 }, rangeNm: { from: 400, to: 900 } });
      expect(res.status).toBe(403);
    }
  });
});

describe('n,k CSV import', () => {
  it('creates a tabulated material over the file range, µm converted to nm', async () => {
    const res = await http().post('/api/materials/import-csv').set('Cookie', engineer).send({
      name: 'Measured Ta2O5',
      unit: 'um',
      csv: 'wavelength_um,n,k\n0.40,2.20,0.001\n0.55,2.12,0\n0.80,2.08,0\n',
    });
    expect(res.status).toBe(201);
    expect(res.body.model).toEqual({
      model: 'table',
      wavelengths: [400, 550, 800],
      n: [2.2, 2.12, 2.08],
      k: [0.001, 0, 0],
      interpolation: 'linear',
      clamp: false,
    });
    expect(res.body.rangeNm).toEqual({ from: 400, to: 800 });
  });

  it.each([
    ['empty', '', ['the file is empty']],
    ['header only', 'wavelength_nm,n,k\n', ['at least 2 data rows are needed']],
    ['text in a cell', '400,1.5\n500,abc\n', ['row 2: not a number: n "abc"']],
    ['negative n', '400,-1.5\n500,1.4\n', ['row 1: n must be > 0']],
    ['negative k', '400,1.5,-0.2\n500,1.4,0\n', ['row 1: k must be ≥ 0 (k > 0 is absorption)']],
    [
      'descending wavelengths',
      '500,1.5\n400,1.4\n',
      ['row 2: wavelength 400 nm does not increase (previous row 500 nm)'],
    ],
    ['ragged rows', '400,1.5,0\n500,1.4\n', ['row 2: has 2 column(s), the file has 3']],
    ['one column', '400\n500\n', ['row 1: expected 2 or 3 columns: wavelength, n and optionally k']],
    [
      'µm read as nm',
      '0.4,1.5\n0.5,1.4\n',
      ['the wavelengths look like µm (all below 20); choose µm as the unit'],
    ],
    ['NaN', '400,NaN\n500,1.4\n', ['row 1: not a number: n "NaN"']],
    ['unbalanced quotes', '400,"1.5\n500,1.4\n', [expect.stringMatching(/unbalanced quotes/)]],
    [
      'no n column',
      'wavelength_nm,index\n400,1.5\n',
      [expect.stringMatching(/must name a wavelength column/)],
    ],
  ])('rejects a file with %s, naming the row, and writes nothing', async (_kind, csv, details) => {
    const before = await materialCount();
    const res = await http()
      .post('/api/materials/import-csv')
      .set('Cookie', engineer)
      .send({ name: 'Should not exist', unit: 'nm', csv });
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual(details);
    expect(await materialCount()).toBe(before);
  });

  it('rejects a file over 1 MB with a clear message', async () => {
    const csv = '400.000,1.500000,0.000000\n'.repeat(45_000);
    const res = await http()
      .post('/api/materials/import-csv')
      .set('Cookie', engineer)
      .send({ name: 'Huge', unit: 'nm', csv });
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual(['the file is larger than 1 MB']);
  });
});
