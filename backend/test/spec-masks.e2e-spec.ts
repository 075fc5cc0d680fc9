import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, demoSession } from './support/app.js';
import { customerId, materialIds, twoLayerDesign } from './support/fixtures.js';
import { requestBodies } from './support/openapi.js';

let app: NestExpressApplication;
let sales: string;
let engineer: string;
let halden: number;
let orrin: number;

beforeAll(async () => {
  app = await createTestApp();
  sales = await demoSession(app, 'sales');
  engineer = await demoSession(app, 'engineer');
  halden = await customerId(app, sales, 'Halden Vision Systems');
  orrin = await customerId(app, sales, 'Orrin Medical Imaging');
});
afterAll(async () => {
  await app.close();
});

const http = () => request(app.getHttpServer());
const maskCount = async () =>
  Number((await app.get(DataSource).query('SELECT count(*) AS n FROM spec_masks'))[0].n);
const broadband = { from_nm: 420, to_nm: 680, angles_deg: [0, 30], quantity: 'R', max_percent: 0.5 };

describe('spec masks', () => {
  it('lists the demo masks, filtered by customer', async () => {
    const res = await http().get(`/api/spec-masks?customerId=${halden}`).set('Cookie', sales);
    expect(res.status).toBe(200);
    // Other spec files may add masks for Halden; every listed one is Halden's.
    const masks = res.body as { customer: { id: number }; name: string; bands: object[] }[];
    expect(masks.every((m) => m.customer.id === halden)).toBe(true);
    const demo = masks.filter((m) => m.name === 'HVS-2210 lens AR');
    expect(demo).toEqual([
      expect.objectContaining({
        name: 'HVS-2210 lens AR',
        revision: 'A',
        // Masks from before mask kinds existed are the customer's specifications.
        kind: 'customer',
        customer: { id: halden, name: 'Halden Vision Systems' },
      }),
    ]);
    expect(demo[0]!.bands[0]).toMatchObject({
      from_nm: 420,
      to_nm: 680,
      max_percent: 0.5,
      angles_deg: [0, 15, 30],
    });
  });

  it('creates a mask with the engine normalising its bands', async () => {
    const res = await http()
      .post('/api/spec-masks')
      .set('Cookie', sales)
      .send({ name: 'HVS-3000 AR', customerId: halden, revision: 'A', bands: [broadband] });
    expect(res.status).toBe(201);
    expect(res.body.bands).toEqual([{ ...broadband, polarisation: 'avg', weight: 1, step_nm: 1 }]);
    const dup = await http()
      .post('/api/spec-masks')
      .set('Cookie', sales)
      .send({ name: 'HVS-3000 AR', customerId: halden, revision: 'A', bands: [broadband] });
    expect(dup.status).toBe(409);
  });

  it.each([
    [[{ ...broadband, from_nm: 700 }], /bands\.0\.from_nm: must not exceed to_nm/],
    [[{ ...broadband, max_percent: 'NaN' }], /bands\.0\.max_percent: must be a finite number/],
    [
      [broadband, { ...broadband, max_percent: undefined, min_percent: 2 }],
      /bands\.1: .*contradicts bands\[0\]/,
    ],
    [[], /bands: must hold at least one limit band/],
    [
      [{ ...broadband, to_nm: 0 }, broadband, { ...broadband, quantity: 'A' }],
      /bands\.0\.to_nm: must be greater than 0 \(got 0\); bands\.2\.quantity: must be one of/,
    ],
  ])('rejects bad bands %# with a clear 400 and writes nothing', async (bands, message) => {
    const before = await maskCount();
    const res = await http()
      .post('/api/spec-masks')
      .set('Cookie', sales)
      .send({ name: 'Bad', customerId: halden, revision: 'X', bands });
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(message);
    expect(await maskCount()).toBe(before);
  });

  it('exports CSV and imports it back as a new revision; bad CSV rows are named', async () => {
    const list = await http().get(`/api/spec-masks?customerId=${orrin}`).set('Cookie', sales);
    const id = list.body[0].id;
    const csv = await http().get(`/api/spec-masks/${id}/csv`).set('Cookie', sales);
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    expect(csv.text.split('\n')[0]).toBe(
      'from_nm,to_nm,angles_deg,angle_from_deg,angle_to_deg,angle_step_deg,polarisation,quantity,max_percent,min_percent,target_percent,tolerance_percent,margin_percent,weight,step_nm,label',
    );
    const imported = await http()
      .post('/api/spec-masks/import-csv')
      .set('Cookie', sales)
      .send({ name: 'OMI window 532', customerId: orrin, revision: 'C', csv: csv.text });
    expect(imported.status).toBe(201);
    expect(imported.body.bands).toEqual(list.body[0].bands);

    const before = await maskCount();
    const badCsv = 'from_nm,to_nm,quantity,max_percent\n400,500,R,1\n600,550,R,1\n';
    const rejected = await http()
      .post('/api/spec-masks/import-csv')
      .set('Cookie', sales)
      .send({ name: 'Broken', customerId: orrin, revision: 'Z', csv: badCsv });
    expect(rejected.status).toBe(400);
    expect(rejected.body.details).toEqual(['row 3 from_nm: must not exceed to_nm (600 nm > 550 nm)']);
    expect(await maskCount()).toBe(before);
  });

  it('a stale edit gets 409', async () => {
    const created = await http()
      .post('/api/spec-masks')
      .set('Cookie', engineer)
      .send({ name: 'Edited twice', customerId: halden, revision: 'A', bands: [broadband] });
    const edit = {
      name: 'Edited twice',
      customerId: halden,
      revision: 'A',
      bands: [{ ...broadband, max_percent: 0.4 }],
      version: 1,
    };
    expect(
      (await http().put(`/api/spec-masks/${created.body.id}`).set('Cookie', engineer).send(edit)).status,
    ).toBe(200);
    const stale = await http().put(`/api/spec-masks/${created.body.id}`).set('Cookie', sales).send(edit);
    expect(stale.status).toBe(409);
    expect(stale.body.message).toMatch(/changed by someone else \(now version 2\)/);
  });

  it('a design may only use a mask of its own customer', async () => {
    const m = await materialIds(app, engineer);
    const haldenMask = (await http().get(`/api/spec-masks?customerId=${halden}`).set('Cookie', sales)).body[0]
      .id;
    const ok = await http()
      .post('/api/designs')
      .set('Cookie', engineer)
      .send({ ...twoLayerDesign(m, halden), specMaskId: haldenMask });
    expect(ok.status).toBe(201);
    expect(ok.body.specMaskId).toBe(haldenMask);
    const wrong = await http()
      .post('/api/designs')
      .set('Cookie', engineer)
      .send({ ...twoLayerDesign(m, orrin), specMaskId: haldenMask });
    expect(wrong.status).toBe(400);
    expect(wrong.body.details[0]).toMatch(/belongs to Halden Vision Systems, not to this design's customer/);
  });

  it('takes an angle range with a step, a band margin and the mask kind; bad ones get 400 and write nothing', async () => {
    const ranged = {
      from_nm: 420,
      to_nm: 680,
      angle_from_deg: 0,
      angle_to_deg: 20,
      angle_step_deg: 5,
      quantity: 'R',
      max_percent: 0.5,
      margin_percent: 0.1,
    };
    const res = await http()
      .post('/api/spec-masks')
      .set('Cookie', engineer)
      .send({ name: 'HVS-4000 target', customerId: orrin, revision: 'A', kind: 'internal', bands: [ranged] });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.kind).toBe('internal');
    expect(res.body.bands[0]).toMatchObject({ ...ranged, angles_deg: [0, 5, 10, 15, 20] });
    const before = await maskCount();
    const cases: [object, string | RegExp][] = [
      [{ kind: 'secret', bands: [ranged] }, 'kind: Must be one of customer, internal'],
      [{ bands: [{ ...ranged, angle_step_deg: 0 }] }, /bands\.0\.angle_step_deg.*greater than 0/],
      [{ bands: [{ ...ranged, margin_percent: 0.6 }] }, /bands\.0\.margin_percent.*outside 0–100 %/],
      [{ name: ' ', bands: [ranged] }, 'name: Enter a name'],
      [{ customerId: 'orrin', bands: [ranged] }, 'customerId: Choose the customer'],
      [{ colour: 'blue', bands: [ranged] }, 'Unrecognized key: "colour"'],
      [
        { bands: [{ ...ranged, angle_to_deg: undefined }] },
        /needs angle_from_deg, angle_to_deg and angle_step_deg/,
      ],
    ];
    for (const [patch, message] of cases) {
      const bad = await http()
        .post('/api/spec-masks')
        .set('Cookie', engineer)
        .send({ name: 'HVS-4000 bad', customerId: orrin, revision: 'B', bands: [ranged], ...patch });
      expect(bad.status, JSON.stringify(patch)).toBe(400);
      expect(bad.body.details).toContainEqual(
        typeof message === 'string' ? message : expect.stringMatching(message),
      );
    }
    expect(await maskCount()).toBe(before);
  });

  it('publishes the shared spec-mask schemas as the bodies of create, edit and CSV import', async () => {
    const bodyOf = await requestBodies(app);
    const create = bodyOf('post', '/api/spec-masks');
    expect(create.required?.sort()).toEqual(['bands', 'customerId', 'name', 'revision']);
    expect(create.properties.bands!.type).toBe('array');
    expect(create.properties.name!.maxLength).toBe(160);
    expect(bodyOf('put', '/api/spec-masks/{id}').required).toContain('version');
    expect(bodyOf('post', '/api/spec-masks/import-csv').required?.sort()).toEqual([
      'csv',
      'customerId',
      'name',
      'revision',
    ]);
  });

  it('operators cannot see spec masks', async () => {
    const operator = await demoSession(app, 'operator');
    expect((await http().get('/api/spec-masks').set('Cookie', operator)).status).toBe(403);
  });
});
