import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { approvedDesign } from './support/approved.js';
import { createTestApp, demoSession } from './support/app.js';
import { customerId, materialIds, twoLayerDesign } from './support/fixtures.js';

// Every editable record saves through one conditional UPDATE on its version, customer-visible
// facts are revisioned, and every change is on the audit trail. Checked against the real
// PostgreSQL; the rules are common practice for controlled records under ISO 9001 (no source).

let app: NestExpressApplication;
let admin: string;
let mira: string;
let tomas: string;
let sales: string;
let m: Record<string, number>;
let orrin: number;

beforeAll(async () => {
  app = await createTestApp();
  admin = await demoSession(app, 'admin');
  mira = await demoSession(app, 'engineer', 0);
  tomas = await demoSession(app, 'engineer', 1);
  sales = await demoSession(app, 'sales');
  m = await materialIds(app, mira);
  orrin = await customerId(app, mira, 'Orrin Medical Imaging');
});
afterAll(async () => {
  await app.close();
});

const http = () => request(app.getHttpServer());
let counter = 0;
const unique = (what: string) => `${what} ${Date.now().toString(36)}-${(counter += 1)}`;

interface RecordKind {
  name: string;
  /** Creates a record; returns its id, version and a body to edit it with. */
  create: () => Promise<{ id: number; version: number }>;
  edit: (id: number, version: number, mark: string) => request.Test;
  read: (id: number) => Promise<Record<string, unknown>>;
  /** What an edit marked `mark` leaves on the record. */
  marked: (mark: string) => Record<string, unknown>;
}

const chamberBody = (name: string, notes = '', rate = 0.5) => ({
  name,
  monitorWavelengthsNm: [550],
  monitorChipMaterialId: m['Fused silica'],
  materials: ['MgF2', 'ZrO2'].map((n) => ({ materialId: m[n], toolingFactor: 1, rateNmPerS: rate })),
  notes,
});
const maskBody = (name: string, maxPercent = 1, notes = '') => ({
  name,
  customerId: orrin,
  revision: 'A',
  bands: [{ from_nm: 400, to_nm: 700, quantity: 'R', max_percent: maxPercent }],
  notes,
});
const materialBody = (name: string, n = 1.9, source = 'test value') => ({
  name,
  model: { model: 'constant', n, k: 0 },
  rangeNm: { from: 400, to: 900 },
  typical: true,
  provenance: { source },
});

const created = (res: request.Response) => {
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { id: res.body.id as number, version: res.body.version as number };
};

const KINDS: RecordKind[] = [
  {
    name: 'customer',
    create: async () =>
      created(
        await http()
          .post('/api/customers')
          .set('Cookie', sales)
          .send({ name: unique('Race customer') }),
      ),
    edit: (id, version, mark) =>
      http()
        .put(`/api/customers/${id}`)
        .set('Cookie', sales)
        .send({ name: `Customer ${id} ${mark}`, notes: mark, version }),
    read: async (id) => (await http().get(`/api/customers/${id}`).set('Cookie', sales)).body,
    marked: (mark) => ({ notes: mark }),
  },
  {
    name: 'chamber',
    create: async () =>
      created(
        await http()
          .post('/api/chambers')
          .set('Cookie', mira)
          .send(chamberBody(unique('Race chamber'))),
      ),
    edit: (id, version, mark) =>
      http()
        .put(`/api/chambers/${id}`)
        .set('Cookie', mira)
        .send({ ...chamberBody(`Chamber ${id} ${mark}`, mark, mark === 'A' ? 0.4 : 0.6), version }),
    read: async (id) => (await http().get(`/api/chambers/${id}`).set('Cookie', mira)).body,
    marked: (mark) => ({
      notes: mark,
      materials: ['MgF2', 'ZrO2'].map((n) => ({
        materialId: m[n],
        toolingFactor: 1,
        rateNmPerS: mark === 'A' ? 0.4 : 0.6,
      })),
    }),
  },
  {
    name: 'material',
    create: async () =>
      created(
        await http()
          .post('/api/materials')
          .set('Cookie', mira)
          .send(materialBody(unique('Race material'))),
      ),
    edit: (id, version, mark) =>
      http()
        .put(`/api/materials/${id}`)
        .set('Cookie', mira)
        .send({ ...materialBody(`Material ${id} ${mark}`, mark === 'A' ? 1.7 : 2.1, mark), version }),
    read: async (id) => (await http().get(`/api/materials/${id}`).set('Cookie', mira)).body,
    marked: (mark) => ({
      model: { model: 'constant', n: mark === 'A' ? 1.7 : 2.1, k: 0 },
      provenance: expect.objectContaining({ source: mark }),
    }),
  },
  {
    name: 'spec mask',
    create: async () =>
      created(
        await http()
          .post('/api/spec-masks')
          .set('Cookie', sales)
          .send(maskBody(unique('Race mask'))),
      ),
    edit: (id, version, mark) =>
      http()
        .put(`/api/spec-masks/${id}`)
        .set('Cookie', sales)
        .send({ ...maskBody(`Mask ${id}`, mark === 'A' ? 0.5 : 2, mark), version }),
    read: async (id) => (await http().get(`/api/spec-masks/${id}`).set('Cookie', sales)).body,
    marked: (mark) => ({
      notes: mark,
      bands: [expect.objectContaining({ max_percent: mark === 'A' ? 0.5 : 2 })],
    }),
  },
  {
    name: 'design',
    create: async () => {
      const res = await http()
        .post('/api/designs')
        .set('Cookie', mira)
        .send(twoLayerDesign(m, orrin, unique('Race design')));
      return created(res);
    },
    edit: (id, version, mark) =>
      http()
        .patch(`/api/designs/${id}`)
        .set('Cookie', mira)
        .send({ name: `Design ${id} ${mark}`, version }),
    read: async (id) => (await http().get(`/api/designs/${id}`).set('Cookie', mira)).body,
    marked: () => ({}),
  },
];

describe('concurrent edits with one version token', () => {
  for (const kind of KINDS) {
    it(`${kind.name}: in 30 rounds exactly one of two edits wins, and the record holds that edit whole`, async () => {
      for (let round = 0; round < 30; round++) {
        const { id, version } = await kind.create();
        const [a, b] = await Promise.all([kind.edit(id, version, 'A'), kind.edit(id, version, 'B')]);
        expect([a.status, b.status].sort(), `round ${round}: ${JSON.stringify([a.body, b.body])}`).toEqual([
          200, 409,
        ]);
        const mark = a.status === 200 ? 'A' : 'B';
        const now = await kind.read(id);
        expect(now).toMatchObject({ ...kind.marked(mark), version: version + 1 });
        expect(String(now.name)).toMatch(new RegExp(`(${mark}$)|^Mask `));
      }
    });
  }
});

describe('customer-visible facts are revisioned', () => {
  it('a mask edit after approval creates revision B and leaves rev A and the approved version’s report unchanged', async () => {
    const mask = created(
      await http()
        .post('/api/spec-masks')
        .set('Cookie', sales)
        .send(maskBody(unique('Lens mask'), 0.5)),
    );
    const designId = await approvedDesign(app, mira, tomas, {
      ...twoLayerDesign(m, orrin, unique('Revisioned AR')),
      specMaskId: mask.id,
    });
    const report = await http()
      .post('/api/reports')
      .set('Cookie', sales)
      .send({ designId, versionNumber: 1 });
    expect(report.status, JSON.stringify(report.body)).toBe(201);
    const before = (await http().get(`/api/reports/${report.body.id}`).set('Cookie', sales)).body;

    const edit = await http()
      .put(`/api/spec-masks/${mask.id}`)
      .set('Cookie', sales)
      .send({
        ...maskBody('Lens mask', 5),
        name: (await http().get(`/api/spec-masks/${mask.id}`).set('Cookie', sales)).body.name,
        version: mask.version,
      });
    expect(edit.status, JSON.stringify(edit.body)).toBe(200);
    expect(edit.body.id).not.toBe(mask.id);
    expect(edit.body.revision).toBe('B');
    expect(edit.body.bands[0].max_percent).toBe(5);

    const old = (await http().get(`/api/spec-masks/${mask.id}`).set('Cookie', sales)).body;
    expect(old).toMatchObject({ revision: 'A', supersededById: edit.body.id, version: mask.version + 1 });
    expect(old.bands[0].max_percent).toBe(0.5);
    // The design still refers to rev A, and its report says exactly what it said.
    expect((await http().get(`/api/designs/${designId}`).set('Cookie', sales)).body.specMaskId).toBe(mask.id);
    expect((await http().get(`/api/reports/${report.body.id}`).set('Cookie', sales)).body).toEqual(before);
    // Rev A no longer changes; rev B is edited from now on.
    const again = await http()
      .put(`/api/spec-masks/${mask.id}`)
      .set('Cookie', sales)
      .send({ ...maskBody(old.name, 4), version: old.version });
    expect(again.status).toBe(409);
    expect(again.body.message).toMatch(/was revised \(see spec mask \d+\); edit the newest revision/);

    const audit = (await http().get(`/api/audit?entity=spec-mask&entityId=${mask.id}`).set('Cookie', admin))
      .body;
    expect(audit.map((e: { action: string }) => e.action)).toEqual(['revised', 'created']);
    expect(audit[0].summary).toMatch(/rev A → rev B/);
  });

  it('a mask stays in use once a version was submitted against it, also after the design moves to another mask or the version is returned', async () => {
    const first = created(
      await http()
        .post('/api/spec-masks')
        .set('Cookie', sales)
        .send(maskBody(unique('First mask'))),
    );
    const second = created(
      await http()
        .post('/api/spec-masks')
        .set('Cookie', sales)
        .send(maskBody(unique('Second mask'))),
    );
    const design = await http()
      .post('/api/designs')
      .set('Cookie', mira)
      .send({ ...twoLayerDesign(m, orrin, unique('Moving mask AR')), specMaskId: first.id });
    expect(design.status, JSON.stringify(design.body)).toBe(201);
    const id = design.body.id as number;
    const submit = await http()
      .post(`/api/designs/${id}/versions/1/submit`)
      .set('Cookie', mira)
      .send({ rowVersion: 1 });
    expect(submit.status, JSON.stringify(submit.body)).toBe(201);
    const returned = await http()
      .post(`/api/designs/${id}/versions/1/return`)
      .set('Cookie', tomas)
      .send({ comment: 'thicker outer layer, please' });
    expect(returned.status, JSON.stringify(returned.body)).toBe(201);
    const moved = await http()
      .patch(`/api/designs/${id}`)
      .set('Cookie', mira)
      .send({ specMaskId: second.id, version: design.body.version });
    expect(moved.status, JSON.stringify(moved.body)).toBe(200);

    const edit = async (mask: { id: number }, maxPercent: number) => {
      const now = (await http().get(`/api/spec-masks/${mask.id}`).set('Cookie', sales)).body;
      const res = await http()
        .put(`/api/spec-masks/${mask.id}`)
        .set('Cookie', sales)
        .send({ ...maskBody(now.name as string, maxPercent), version: now.version });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      return res.body as { id: number; revision: string };
    };
    // The returned version was submitted against the first mask: that stays a fact.
    const firstB = await edit(first, 3);
    expect(firstB.revision).toBe('B');
    expect(firstB.id).not.toBe(first.id);
    // Nothing was submitted against the second mask yet: still edited in place …
    expect(await edit(second, 3)).toMatchObject({ id: second.id, revision: 'A' });
    // … until the version is submitted again.
    const version = (await http().get(`/api/designs/${id}/versions/1`).set('Cookie', mira)).body;
    const again = await http()
      .post(`/api/designs/${id}/versions/1/submit`)
      .set('Cookie', mira)
      .send({ rowVersion: version.rowVersion });
    expect(again.status, JSON.stringify(again.body)).toBe(201);
    const revised = await edit(second, 2);
    expect(revised.id).not.toBe(second.id);
    expect(revised.revision).toBe('B');
  });

  it('a mask nobody used yet is edited in place', async () => {
    const mask = created(
      await http()
        .post('/api/spec-masks')
        .set('Cookie', sales)
        .send(maskBody(unique('Draft mask'))),
    );
    const name = (await http().get(`/api/spec-masks/${mask.id}`).set('Cookie', sales)).body.name as string;
    const edit = await http()
      .put(`/api/spec-masks/${mask.id}`)
      .set('Cookie', sales)
      .send({ ...maskBody(name, 2), version: mask.version });
    expect(edit.status).toBe(200);
    expect(edit.body).toMatchObject({ id: mask.id, revision: 'A', supersededById: null });
  });
});

describe('the audit trail', () => {
  it('records users, materials, customers, chambers and design renames, filtered by record, person and date, and exports CSV', async () => {
    const email = `${unique('audited').replace(/\W+/g, '-')}@larkspur.example`;
    const user = await http()
      .post('/api/users')
      .set('Cookie', admin)
      .send({ email, displayName: 'Audited Person', role: 'operator', password: 'long-enough-password' });
    expect(user.status).toBe(201);
    const id = user.body.id as number;
    const toSales = await http()
      .patch(`/api/users/${id}`)
      .set('Cookie', admin)
      .send({ role: 'sales', version: user.body.version });
    expect(toSales.status).toBe(200);
    const off = await http()
      .patch(`/api/users/${id}`)
      .set('Cookie', admin)
      .send({ active: false, version: toSales.body.version });
    expect(off.status).toBe(200);
    expect(
      (
        await http()
          .post(`/api/users/${id}/password`)
          .set('Cookie', admin)
          .send({ newPassword: 'another-long-password' })
      ).status,
    ).toBe(204);
    const trail = (await http().get(`/api/audit?entity=user&entityId=${id}`).set('Cookie', admin)).body as {
      action: string;
      actor: { displayName: string };
      summary: string;
    }[];
    expect(trail.map((e) => [e.action, e.actor.displayName]).reverse()).toEqual([
      ['created', 'Elin Voss'],
      ['role changed', 'Elin Voss'],
      ['deactivated', 'Elin Voss'],
      ['password reset', 'Elin Voss'],
    ]);
    expect(trail[2]!.summary).toBe(`${email}: role operator → sales`);

    const design = created(
      await http()
        .post('/api/designs')
        .set('Cookie', mira)
        .send(twoLayerDesign(m, orrin, unique('Audited AR'))),
    );
    const renamed = await http()
      .patch(`/api/designs/${design.id}`)
      .set('Cookie', tomas)
      .send({ name: 'Audited AR renamed', version: design.version });
    expect(renamed.status).toBe(200);
    const material = created(
      await http()
        .post('/api/materials')
        .set('Cookie', mira)
        .send(materialBody(unique('Audited material'))),
    );
    const chamber = created(
      await http()
        .post('/api/chambers')
        .set('Cookie', mira)
        .send(chamberBody(unique('Audited chamber'))),
    );

    const designTrail = (await http().get(`/api/audit?designId=${design.id}`).set('Cookie', admin)).body;
    expect(designTrail[0]).toMatchObject({ action: 'renamed', actor: { displayName: 'Tomas Reyes' } });
    expect(designTrail[0].details).toMatchObject({ to: 'Audited AR renamed' });
    const tomasId = designTrail[0].actor.id as number;
    const tomasOnly = (await http().get(`/api/audit?actorId=${tomasId}`).set('Cookie', admin)).body as {
      actor: { id: number };
    }[];
    expect(tomasOnly.length).toBeGreaterThan(0);
    expect(tomasOnly.every((e) => e.actor.id === tomasId)).toBe(true);
    for (const [entity, recordId] of [
      ['material', material.id],
      ['chamber', chamber.id],
    ] as const) {
      const rows = (await http().get(`/api/audit?entity=${entity}&entityId=${recordId}`).set('Cookie', admin))
        .body;
      expect(rows.map((e: { action: string }) => e.action)).toEqual(['created']);
    }

    // Dates: today holds these entries; yesterday holds none of them.
    const today = new Date().toISOString().slice(0, 10);
    const yesterday = new Date(Date.now() - 86_400_000).toISOString().slice(0, 10);
    expect(
      (await http().get(`/api/audit?designId=${design.id}&from=${today}&to=${today}`).set('Cookie', admin))
        .body,
    ).toHaveLength(2);
    expect(
      (await http().get(`/api/audit?designId=${design.id}&to=${yesterday}`).set('Cookie', admin)).body,
    ).toEqual([]);
    const backwards = await http().get(`/api/audit?from=${today}&to=${yesterday}`).set('Cookie', admin);
    expect(backwards.status).toBe(400);
    expect(backwards.body.details).toEqual([`to: The last day must not be before the first (${today})`]);
    const spaceship = await http().get('/api/audit?entity=spaceship').set('Cookie', admin);
    expect(spaceship.status).toBe(400);
    expect(spaceship.body.details[0]).toMatch(/^entity: entity must be one of user, material, /);
    const both = await http().get('/api/audit?designId=4&entity=quote').set('Cookie', admin);
    expect(both.status).toBe(400);
    expect(both.body.details).toEqual(['designId: Use either designId or entity, not both']);
    expect(
      (await http().get('/api/audit/export.csv?designId=4&entity=quote').set('Cookie', admin)).status,
    ).toBe(400);
    const docs = (await http().get('/api/docs-json')).body as {
      paths: Record<string, Record<string, { parameters: { name: string; in: string }[] }>>;
    };
    expect(
      docs.paths['/api/audit']!['get']!.parameters.filter((x) => x.in === 'query').map((x) => x.name),
    ).toEqual(['entity', 'entityId', 'designId', 'actorId', 'from', 'to']);

    const csv = await http().get(`/api/audit/export.csv?entity=user&entityId=${id}`).set('Cookie', admin);
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toMatch(/^text\/csv/);
    const lines = csv.text.trim().split('\r\n');
    expect(lines[0]).toBe('at_utc,who,role,record,record_id,action,summary,details_json');
    expect(lines).toHaveLength(5);
    expect(lines[1]).toMatch(
      new RegExp(`^\\d{4}-\\d\\d-\\d\\dT[^,]+,Elin Voss,admin,User,${id},password reset,`),
    );
    expect((await http().get('/api/audit/export.csv').set('Cookie', mira)).status).toBe(403);
  });
});
