import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { requestBodies } from './support/openapi.js';
import { createTestApp, demoSession } from './support/app.js';
import { customerId, materialIds, twoLayerDesign, versionContent } from './support/fixtures.js';

let app: NestExpressApplication;
let engineer: string;
let engineer2: string;
let m: Record<string, number>;
let customer: number;

beforeAll(async () => {
  app = await createTestApp();
  engineer = await demoSession(app, 'engineer', 0);
  engineer2 = await demoSession(app, 'engineer', 1);
  m = await materialIds(app, engineer);
  customer = await customerId(app, engineer, 'Halden Vision Systems');
});
afterAll(async () => {
  await app.close();
});

const http = () => request(app.getHttpServer());
const versionRows = async () =>
  Number((await app.get(DataSource).query('SELECT count(*) AS n FROM design_versions'))[0].n);

async function createDesign(name: string) {
  const res = await http()
    .post('/api/designs')
    .set('Cookie', engineer)
    .send(twoLayerDesign(m, customer, name));
  expect(res.status).toBe(201);
  return res.body as { id: number; version: number; versions: { number: number; status: string }[] };
}

describe('stack designs', () => {
  it('creates a design with version 1 as a draft holding the layers in order', async () => {
    const design = await createDesign('Window AR 450-650');
    expect(design.versions).toEqual([expect.objectContaining({ number: 1, status: 'draft' })]);
    const v1 = await http().get(`/api/designs/${design.id}/versions/1`).set('Cookie', engineer);
    expect(v1.status).toBe(200);
    expect(v1.body).toMatchObject({
      number: 1,
      status: 'draft',
      rowVersion: 1,
      backSurface: 'bare',
      referenceWavelengthNm: 550,
      layers: [
        { materialId: m['MgF2'], thicknessNm: 99.6, locked: false, notes: '' },
        { materialId: m['ZrO2'], thicknessNm: 67.1, locked: true, notes: 'adhesion layer' },
      ],
      materialsSnapshot: null,
    });
    const list = await http().get('/api/designs').set('Cookie', engineer);
    expect(list.body.find((d: { id: number }) => d.id === design.id)).toMatchObject({
      name: 'Window AR 450-650',
      customer: { id: customer, name: 'Halden Vision Systems' },
      latestVersion: { number: 1, status: 'draft' },
    });
  });

  it.each([
    [{ thicknessNm: -5 }, 'layers.0.thicknessNm: Thickness must be greater than 0 nm'],
    [{ thicknessNm: 'thick' }, 'layers.0.thicknessNm: Enter the thickness in nm as a number'],
    [{ thicknessNm: null }, 'layers.0.thicknessNm: Enter the thickness in nm as a number'],
    [{ thicknessNm: 100_001 }, 'layers.0.thicknessNm: Thickness must be at most 100000 nm'],
    [{ colour: 'blue' }, 'layers.0: Unrecognized key: "colour"'],
    [{ materialId: 987654 }, 'layers.0.materialId: material 987654 does not exist'],
  ])('rejects a bad layer %j with 400 and writes nothing', async (patch, detail) => {
    const body = twoLayerDesign(m, customer, 'Bad layers');
    body.layers[0] = { ...body.layers[0], ...patch } as (typeof body.layers)[0];
    const before = await versionRows();
    const res = await http().post('/api/designs').set('Cookie', engineer).send(body);
    expect(res.status).toBe(400);
    expect(res.body.details.join(' | ')).toContain(detail);
    expect(await versionRows()).toBe(before);
  });

  it('rejects an unknown customer and a NaN substrate thickness', async () => {
    const res = await http()
      .post('/api/designs')
      .set('Cookie', engineer)
      .send({ ...twoLayerDesign(m, 999999) });
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual(['customerId: customer 999999 does not exist']);
    const nan = await http()
      .post('/api/designs')
      .set('Cookie', engineer)
      .set('Content-Type', 'application/json')
      .send(JSON.stringify({ ...twoLayerDesign(m, customer), substrateThicknessMm: 'NaN' }));
    expect(nan.status).toBe(400);
    expect(nan.body.details).toContain('substrateThicknessMm: Enter the substrate thickness in mm');
  });

  it('a stale save gets 409 with a clear message, and the newer layers survive', async () => {
    const design = await createDesign('Contested AR');
    const url = `/api/designs/${design.id}/versions/1`;
    const base = versionContent(twoLayerDesign(m, customer));
    const first = await http()
      .put(url)
      .set('Cookie', engineer)
      .send({ ...base, rowVersion: 1, layers: [...base.layers, { materialId: m['SiO2'], thicknessNm: 20 }] });
    expect(first.status).toBe(200);
    expect(first.body.rowVersion).toBe(2);
    expect(first.body.layers).toHaveLength(3);
    const stale = await http()
      .put(url)
      .set('Cookie', engineer2)
      .send({ ...base, rowVersion: 1, layers: [base.layers[0]] });
    expect(stale.status).toBe(409);
    expect(stale.body.message).toMatch(
      /^Version 1 was saved by Mira Castell at \S+ since you opened it \(you saw row version 1, it is now 2\); reload/,
    );
    const now = await http().get(url).set('Cookie', engineer);
    expect(now.body.layers).toHaveLength(3);
    expect(now.body.rowVersion).toBe(2);
  });

  it('a submitted version is frozen (409 on save), keeps a snapshot of its materials, and a new version copies it', async () => {
    const design = await createDesign('Frozen AR');
    const submit = await http()
      .post(`/api/designs/${design.id}/versions/1/submit`)
      .set('Cookie', engineer)
      .send({ rowVersion: 1 });
    expect(submit.status).toBe(201);
    expect(submit.body.status).toBe('submitted');
    expect(submit.body.materialsSnapshot[String(m['MgF2'])]).toMatchObject({
      name: 'MgF2',
      // The demo library's MgF2 is the tabulated film of Rodríguez-de Marcos et al.
      model: { model: 'table' },
    });
    const edit = await http()
      .put(`/api/designs/${design.id}/versions/1`)
      .set('Cookie', engineer)
      .send({ ...versionContent(twoLayerDesign(m, customer)), rowVersion: 2 });
    expect(edit.status).toBe(409);
    expect(edit.body.message).toBe(
      'Version 1 is submitted and cannot change; start a new version from it to make changes',
    );
    const v2 = await http()
      .post(`/api/designs/${design.id}/versions`)
      .set('Cookie', engineer2)
      .send({ fromNumber: 1 });
    expect(v2.status).toBe(201);
    expect(v2.body).toMatchObject({ number: 2, status: 'draft', rowVersion: 1, materialsSnapshot: null });
    expect(v2.body.layers).toEqual(submit.body.layers);
    expect(v2.body.createdBy.displayName).toBe('Tomas Reyes');
  });

  it('a new version can take imported content: saved as a draft with an audit line naming the file; a bad one writes nothing', async () => {
    const design = await createDesign('Imported AR');
    const imported = {
      ...versionContent(twoLayerDesign(m, customer)),
      layers: [{ materialId: m['MgF2'], thicknessNm: 94.2, locked: false, notes: 'outer' }],
    };
    const before = await versionRows();
    const bad = await http()
      .post(`/api/designs/${design.id}/versions`)
      .set('Cookie', engineer)
      .send({
        fromNumber: 1,
        content: { ...imported, layers: [{ ...imported.layers[0], thicknessNm: -5 }] },
      });
    expect(bad.status).toBe(400);
    expect(bad.body.details.join(' ')).toMatch(/thicknessNm/);
    const unknown = await http()
      .post(`/api/designs/${design.id}/versions`)
      .set('Cookie', engineer)
      .send({ fromNumber: 1, content: { ...imported, substrateMaterialId: 987654 } });
    expect(unknown.status).toBe(400);
    expect(await versionRows()).toBe(before);

    const v2 = await http()
      .post(`/api/designs/${design.id}/versions`)
      .set('Cookie', engineer)
      .send({ fromNumber: 1, content: imported, sourceFile: 'trial.stack.json' });
    expect(v2.status).toBe(201);
    expect(v2.body).toMatchObject({ number: 2, status: 'draft', layers: imported.layers });
    const admin = await demoSession(app, 'admin');
    const audit = await http().get(`/api/audit?entity=design&entityId=${design.id}`).set('Cookie', admin);
    expect(audit.body.map((e: { summary: string }) => e.summary)).toContain(
      'draft version 2 imported from stack file trial.stack.json',
    );
  });

  it('publishes the shared design schemas as the bodies of create, rename, save and new version', async () => {
    const bodyOf = await requestBodies(app);
    const create = bodyOf('post', '/api/designs');
    expect(create.required?.sort()).toEqual([
      'backSurface',
      'customerId',
      'incidentMaterialId',
      'layers',
      'name',
      'referenceWavelengthNm',
      'substrateMaterialId',
      'substrateThicknessMm',
    ]);
    expect(create.properties.layers!.items!.properties.thicknessNm!.maximum).toBe(100_000);
    expect(bodyOf('patch', '/api/designs/{id}').required).toEqual(['version']);
    expect(bodyOf('put', '/api/designs/{id}/versions/{number}').required).toContain('rowVersion');
    expect(bodyOf('post', '/api/designs/{id}/versions').required).toEqual(['fromNumber']);
  });

  it('a rename to an empty name or an unknown field gets 400 with the field named', async () => {
    const design = await createDesign('Renamed AR');
    const res = await http()
      .patch(`/api/designs/${design.id}`)
      .set('Cookie', engineer)
      .send({ version: design.version, name: '  ', colour: 'teal' });
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual(['name: Enter a name', 'Unrecognized key: "colour"']);
  });

  it('404 for a missing design or version', async () => {
    expect((await http().get('/api/designs/999999').set('Cookie', engineer)).status).toBe(404);
    const design = await createDesign('Lonely');
    const res = await http().get(`/api/designs/${design.id}/versions/7`).set('Cookie', engineer);
    expect(res.status).toBe(404);
    expect(res.body.message).toBe(`Design ${design.id} has no version 7`);
  });

  it('sales read designs but cannot change them; operators cannot read drafts', async () => {
    const design = await createDesign('Read only for sales');
    const sales = await demoSession(app, 'sales');
    expect((await http().get(`/api/designs/${design.id}/versions/1`).set('Cookie', sales)).status).toBe(200);
    const put = await http()
      .put(`/api/designs/${design.id}/versions/1`)
      .set('Cookie', sales)
      .send({ ...versionContent(twoLayerDesign(m, customer)), rowVersion: 1 });
    expect(put.status).toBe(403);
    const operator = await demoSession(app, 'operator');
    expect((await http().get(`/api/designs/${design.id}/versions/1`).set('Cookie', operator)).status).toBe(
      403,
    );
    expect((await http().get('/api/designs').set('Cookie', operator)).status).toBe(403);
  });
});
