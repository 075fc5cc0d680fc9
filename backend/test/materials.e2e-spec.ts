import type { NestExpressApplication } from '@nestjs/platform-express';
import fs from 'node:fs';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { MaterialView } from '@quietglass/shared/materials';
import { indexAt } from '@quietglass/shared/optics/dispersion';
import { createTestApp, demoSession } from './support/app.js';
import { requestBodies } from './support/openapi.js';
import { customerId, materialIds, twoLayerDesign, versionContent } from './support/fixtures.js';

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
  it('has the published library: substrates and films with their references, no typical coating values', async () => {
    const res = await http().get('/api/materials').set('Cookie', engineer);
    expect(res.status).toBe(200);
    const byName = Object.fromEntries((res.body as MaterialView[]).map((m) => [m.name, m]));
    // SCHOTT optical glass data sheet, N-BK7, coefficients stated for 0.3–2.5 µm.
    expect(byName['N-BK7']).toMatchObject({
      typical: false,
      provenance: { kind: 'published' },
      model: {
        model: 'sellmeier',
        B: [1.03961212, 0.231792344, 1.01046945],
        validNm: { from: 300, to: 2500 },
      },
    });
    for (const name of ['MgF2', 'SiO2', 'Al2O3', 'HfO2', 'ZrO2', 'Ta2O5', 'Nb2O5', 'TiO2']) {
      expect(byName[name]).toMatchObject({ typical: false, provenance: { kind: 'published' } });
      expect(byName[name]!.provenance.source).toMatch(/DOI: 10\./);
      expect(byName[name]!.sourceFile).toMatchObject({ mediaType: 'application/yaml' });
    }
    // I. H. Malitson, J. Opt. Soc. Am. 55, 1205 (1965): n(587.6 nm) = 1.45846, formula stated 0.21–6.7 µm.
    const silica = byName['Fused silica'];
    expect(silica!.provenance.source).toMatch(/Malitson[\s\S]*DOI: 10\.1364\/JOSA\.55\.001205/);
    expect(indexAt(silica!.model, 587.6).n).toBeCloseTo(1.45846, 5);
    expect(silica!.rangeNm).toEqual({ from: 210, to: 6700 });
    // I. H. Malitson, Appl. Opt. 2, 1103 (1963): CaF2 n(587.6 nm) = 1.43385.
    expect(indexAt(byName.CaF2!.model, 587.6).n).toBeCloseTo(1.43385, 5);
    // Malitson & Dodge, J. Opt. Soc. Am. 62, 1405 (1972), ordinary ray: n(589.3 nm) = 1.76808.
    expect(indexAt(byName['Sapphire (ordinary ray)']!.model, 589.3).n).toBeCloseTo(1.76808, 5);
    // Gao, Lemarchand, Lequime, J. Europ. Opt. Soc. Rap. Public. 8, 13010 (2013), first row 0.252 µm.
    expect(indexAt(byName.SiO2!.model, 252)).toEqual({ n: 1.523846, k: 0.001211 });
    // M. A. Green, Sol. Energ. Mat. Sol. Cells 92, 1305 (2008), row 0.5 µm: n 4.294, k 0.044165.
    expect(indexAt(byName.Si!.model, 500)).toEqual({ n: 4.294, k: 0.044165 });
    // M. F. Al-Kuhaili, Opt. Mat. 27, 383 (2004): n = 1.875 + 6.28e-3/λ² + 5.80e-4/λ⁴ (λ in µm), 0.2–2 µm.
    expect(byName.HfO2!.model).toMatchObject({ model: 'cauchy', A: 1.875, B: 6.28e-3, C: 5.8e-4 });
    expect(() => indexAt(byName.HfO2!.model, 2500)).toThrow(/outside the cauchy model's valid range/);
  });

  it('creates a Cauchy material and returns the normalised model', async () => {
    const res = await http()
      .post('/api/materials')
      .set('Cookie', engineer)
      .send({
        name: 'Shop HfO2 run 12',
        model: { model: 'cauchy', A: 1.9, B: 0.015 },
        rangeNm: { from: 350, to: 1100 },
        provenance: {
          kind: 'measured',
          source: 'witness fit',
          date: '2026-11-20',
          run: 'B2-2026-112',
          notes: 'chamber 2, IAD',
        },
      });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      name: 'Shop HfO2 run 12',
      model: { model: 'cauchy', A: 1.9, B: 0.015 },
      rangeNm: { from: 350, to: 1100 },
      typical: false,
      provenance: {
        kind: 'measured',
        source: 'witness fit',
        date: '2026-11-20',
        run: 'B2-2026-112',
        notes: 'chamber 2, IAD',
      },
      retiredAt: null,
      sourceFile: null,
      version: 1,
    });
  });

  it.each([
    [{ model: { model: 'constant', n: -1.5 } }, 'model.n: must be greater than 0 (got -1.5)'],
    [{ model: { model: 'constant', n: 1.5, k: -0.1 } }, 'model.k: must be 0 or more (got -0.1)'],
    [
      { model: { model: 'sellmeier', B: [1.0], C: [0.3] }, rangeNm: { from: 300, to: 900 } },
      /^model: .*no physical index/,
    ],
    [
      { model: { model: 'table', wavelengths: [400, 500], n: [1.5, 1.4] }, rangeNm: { from: 380, to: 500 } },
      'rangeNm: the range 380–500 nm reaches beyond the table (400–500 nm)',
    ],
    [{ rangeNm: { from: 900, to: 400 } }, 'rangeNm.to: To must be above From'],
    [{ model: { model: 'quantum' } }, /^model\.model: must be one of/],
    [{ typical: undefined }, 'provenance.kind: Say where the data come from'],
    [
      { typical: undefined, provenance: { kind: 'published' } },
      'provenance.source: A published material needs its reference',
    ],
    [
      { typical: undefined, provenance: { kind: 'measured', date: '2026-11-20' } },
      'provenance.run: A measurement needs its run',
    ],
    [
      { provenance: { kind: 'published', source: 'x' } },
      'typical: typical (true) contradicts provenance.kind "published"',
    ],
    [{ colour: 'teal' }, 'Unrecognized key: "colour"'],
  ])('rejects a bad model or range %# with 400 and writes nothing', async (patch, message) => {
    const before = await materialCount();
    const res = await http()
      .post('/api/materials')
      .set('Cookie', engineer)
      .send({
        name: 'Bad one',
        model: { model: 'constant', n: 1.5 },
        rangeNm: { from: 400, to: 900 },
        typical: true,
        ...patch,
      });
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual([
      typeof message === 'string' ? message : expect.stringMatching(message),
    ]);
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
        typical: true,
      });
    const id = created.body.id;
    const first = await http()
      .put(`/api/materials/${id}`)
      .set('Cookie', engineer)
      .send({
        name: 'Contested SiO2',
        model: { model: 'constant', n: 1.47 },
        rangeNm: { from: 400, to: 900 },
        typical: true,
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
        typical: true,
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
      typical: true,
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
      'wavelength_nm,value\n400,1.5\n',
      [expect.stringMatching(/must name a wavelength column/)],
    ],
  ])('rejects a file with %s, naming the row, and writes nothing', async (_kind, csv, details) => {
    const before = await materialCount();
    const res = await http()
      .post('/api/materials/import-csv')
      .set('Cookie', engineer)
      .send({ name: 'Should not exist', unit: 'nm', csv, typical: true });
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual(details);
    expect(await materialCount()).toBe(before);
  });

  it('publishes the shared material schemas as the request bodies in the OpenAPI description', async () => {
    const bodyOf = await requestBodies(app);
    const create = bodyOf('post', '/api/materials');
    expect(create.required?.sort()).toEqual(['model', 'name', 'rangeNm']);
    expect(create.properties.provenance!.properties.kind!.enum).toEqual(['published', 'measured', 'typical']);
    expect(bodyOf('put', '/api/materials/{id}').required).toContain('version');
    expect(bodyOf('post', '/api/materials/import-csv').properties.interpolation!.enum).toEqual([
      'linear',
      'pchip',
    ]);
    expect(bodyOf('post', '/api/materials/import-constants').required?.sort()).toEqual([
      'fileName',
      'name',
      'text',
    ]);
    expect(bodyOf('post', '/api/materials/{id}/retire').required).toEqual(['version']);
  });

  it('rejects a file over 1 MB with a clear message', async () => {
    const csv = '400.000,1.500000,0.000000\n'.repeat(45_000);
    const res = await http()
      .post('/api/materials/import-csv')
      .set('Cookie', engineer)
      .send({ name: 'Huge', unit: 'nm', csv, typical: true });
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual(['the file is larger than 1 MB']);
  });
});

describe('n,k files with units and decimal commas: preview, import, original file', () => {
  const csv = 'Wavelength (µm);n;k\r\n0,40;2,2013;0,0012\r\n0,55;2,1204;0\r\n0,80;2,0811;0\r\n';

  it('previews the parsed table without saving, reading the unit from the header', async () => {
    const before = await materialCount();
    const res = await http().post('/api/materials/import-csv/preview').set('Cookie', engineer).send({ csv });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      table: { wavelengths: [400, 550, 800], n: [2.2013, 2.1204, 2.0811], k: [0.0012, 0, 0] },
      unit: 'um',
      decimalComma: true,
      headerRow: true,
      rangeNm: { from: 400, to: 800 },
    });
    expect(await materialCount()).toBe(before);
    const bad = await http()
      .post('/api/materials/import-csv/preview')
      .set('Cookie', engineer)
      .send({ csv: csv.replace('2,1204', 'two') });
    expect(bad.status).toBe(400);
    expect(bad.body.details).toEqual(['row 3: not a number: n "two"']);
  });

  it('imports it with its provenance and keeps the original file for download, byte for byte', async () => {
    const res = await http()
      .post('/api/materials/import-csv')
      .set('Cookie', engineer)
      .send({
        name: 'Ta2O5 witness run 118',
        csv,
        fileName: 'ta2o5 run 118.csv',
        provenance: { kind: 'measured', date: '2026-11-28', run: 'B2-2026-118', notes: 'witness on B270' },
      });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({
      model: { model: 'table', wavelengths: [400, 550, 800], n: [2.2013, 2.1204, 2.0811] },
      provenance: { kind: 'measured', date: '2026-11-28', run: 'B2-2026-118' },
      sourceFile: { fileName: 'ta2o5 run 118.csv', mediaType: 'text/csv', sizeBytes: Buffer.byteLength(csv) },
    });
    const operator = await demoSession(app, 'operator');
    const file = await http()
      .get(`/api/materials/${res.body.id}/source-file`)
      .set('Cookie', operator)
      .buffer(true)
      .parse((r, done) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => done(null, Buffer.concat(chunks)));
      });
    expect(file.status).toBe(200);
    expect(file.headers['content-type']).toMatch(/^text\/csv/);
    expect(file.headers['content-disposition']).toBe('attachment; filename="ta2o5 run 118.csv"');
    expect((file.body as Buffer).toString('utf8')).toBe(csv);
  });

  it('a material entered by hand has no original file (404)', async () => {
    const materials = (await http().get('/api/materials').set('Cookie', engineer)).body as MaterialView[];
    const bk7 = materials.find((m) => m.name === 'N-BK7')!;
    const res = await http().get(`/api/materials/${bk7.id}/source-file`).set('Cookie', engineer);
    expect(res.status).toBe(404);
    expect(res.body.message).toMatch(/was not imported from a file/);
  });
});

describe('published optical-constants files', () => {
  const assets = new URL('../assets/optical-constants/', import.meta.url);
  const read = (file: string) => fs.readFileSync(new URL(file, assets), 'utf8');

  it('imports a formula file with its reference as provenance and its stated range as the valid range', async () => {
    const text = read('substrate/caf2--malitson.yml');
    const res = await http()
      .post('/api/materials/import-constants')
      .set('Cookie', engineer)
      .send({ name: 'CaF2 window stock', text, fileName: 'caf2--malitson.yml', notes: 'Lot 44 windows' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const m = res.body as MaterialView;
    // I. H. Malitson, Appl. Opt. 2, 1103 (1963): n(587.6 nm) = 1.43385, formula stated 0.23–9.7 µm.
    expect(indexAt(m.model, 587.6).n).toBeCloseTo(1.43385, 5);
    expect(m.rangeNm).toEqual({ from: 230, to: 9700 });
    expect(m.model).toMatchObject({ model: 'sellmeier', validNm: { from: 230, to: 9700 }, clamp: false });
    expect(m.provenance).toMatchObject({ kind: 'published' });
    expect(m.provenance.source).toBe(
      'I. H. Malitson. A redetermination of some optical properties of calcium fluoride. Appl. Opt. 2, 1103-1107 (1963)\nDOI: 10.1364/AO.2.001103',
    );
    expect(m.provenance.notes).toBe(
      '24 °C\nData: Sellmeier formula (formula 1, resonance wavelengths in µm), 0.23–9.7 µm\nLot 44 windows',
    );
    expect(m.sourceFile).toEqual({
      fileName: 'caf2--malitson.yml',
      mediaType: 'application/yaml',
      sizeBytes: Buffer.byteLength(text),
    });
    expect(() => indexAt(m.model, 12_000)).toThrow(/outside the sellmeier model's valid range/);
  });

  it('refuses a file it cannot read, naming the part, and writes nothing', async () => {
    const before = await materialCount();
    const text = read('film/hfo2--al-kuhaili.yml').replace('formula 5', 'formula 9');
    const res = await http()
      .post('/api/materials/import-constants')
      .set('Cookie', engineer)
      .send({ name: 'Unreadable', text, fileName: 'x.yml' });
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(/"formula 9" is not read/);
    expect(await materialCount()).toBe(before);
  });
});

describe('formula valid range and retiring', () => {
  it('a Sellmeier model takes the stated range as its valid range; clamp is the shop’s choice', async () => {
    const body = {
      name: 'Shop glass SG-2',
      // SCHOTT N-BK7 coefficients, stated for 0.3–2.5 µm.
      model: {
        model: 'sellmeier',
        B: [1.03961212, 0.231792344, 1.01046945],
        C: [0.00600069867, 0.0200179144, 103.560653],
      },
      rangeNm: { from: 300, to: 2500 },
      provenance: { kind: 'published', source: 'SCHOTT optical glass data sheet, N-BK7' },
    };
    const refuse = await http().post('/api/materials').set('Cookie', engineer).send(body);
    expect(refuse.status).toBe(201);
    expect(refuse.body.model.validNm).toEqual({ from: 300, to: 2500 });
    expect(() => indexAt(refuse.body.model, 12_000)).toThrow(/outside/);
    const hold = await http()
      .post('/api/materials')
      .set('Cookie', engineer)
      .send({ ...body, name: 'Shop glass SG-2 held', model: { ...body.model, clamp: true } });
    expect(hold.status).toBe(201);
    expect(indexAt(hold.body.model, 12_000).n).toBeCloseTo(indexAt(hold.body.model, 2500).n, 12);
  });

  it('retires and restores a material, with stale and repeated actions refused', async () => {
    const created = await http()
      .post('/api/materials')
      .set('Cookie', engineer)
      .send({
        name: 'Old Cr source',
        model: { model: 'constant', n: 3.1, k: 3.3 },
        rangeNm: { from: 400, to: 800 },
        typical: true,
      });
    const id = created.body.id as number;
    const retired = await http()
      .post(`/api/materials/${id}/retire`)
      .set('Cookie', engineer)
      .send({ version: 1 });
    expect(retired.status).toBe(201);
    expect(retired.body.retiredAt).toEqual(expect.any(String));
    expect(retired.body.version).toBe(2);
    // Still listed (versions that use it resolve it), marked retired.
    const list = (await http().get('/api/materials').set('Cookie', engineer)).body as MaterialView[];
    expect(list.find((m) => m.id === id)?.retiredAt).toBe(retired.body.retiredAt);
    const again = await http()
      .post(`/api/materials/${id}/retire`)
      .set('Cookie', engineer)
      .send({ version: 2 });
    expect(again.status).toBe(409);
    expect(again.body.message).toMatch(/already retired/);
    const stale = await http()
      .post(`/api/materials/${id}/restore`)
      .set('Cookie', engineer)
      .send({ version: 1 });
    expect(stale.status).toBe(409);
    const restored = await http()
      .post(`/api/materials/${id}/restore`)
      .set('Cookie', engineer)
      .send({ version: 2 });
    expect(restored.status).toBe(201);
    expect(restored.body.retiredAt).toBeNull();
    const audit = await app
      .get(DataSource)
      .query(`SELECT action FROM audit_events WHERE entity = 'material' AND entity_id = $1 ORDER BY id`, [
        id,
      ]);
    expect(audit.map((a: { action: string }) => a.action)).toEqual(['created', 'retired', 'restored']);
  });
});

describe('a retired material in designs', () => {
  it('cannot be chosen for new work, but a draft that already uses it keeps it and saves', async () => {
    const ids = await materialIds(app, engineer);
    const customer = await customerId(app, engineer, 'Halden Vision Systems');
    const made = await http()
      .post('/api/materials')
      .set('Cookie', engineer)
      .send({
        name: 'Soon retired oxide',
        model: { model: 'constant', n: 1.9 },
        rangeNm: { from: 300, to: 1200 },
        typical: true,
      });
    const design = twoLayerDesign({ ...ids, ZrO2: made.body.id }, customer, 'Uses soon retired oxide');
    const draft = await http().post('/api/designs').set('Cookie', engineer).send(design);
    expect(draft.status, JSON.stringify(draft.body)).toBe(201);
    await http().post(`/api/materials/${made.body.id}/retire`).set('Cookie', engineer).send({ version: 1 });

    const fresh = await http()
      .post('/api/designs')
      .set('Cookie', engineer)
      .send({ ...design, name: 'New with retired' });
    expect(fresh.status).toBe(400);
    expect(fresh.body.message).toMatch(/material "Soon retired oxide" is retired/);

    const version = await http().get(`/api/designs/${draft.body.id}/versions/1`).set('Cookie', engineer);
    const saved = await http()
      .put(`/api/designs/${draft.body.id}/versions/1`)
      .set('Cookie', engineer)
      .send({ ...versionContent(design), rowVersion: version.body.rowVersion });
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
  });
});
