import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, demoSession } from './support/app.js';
import { customerId, materialIds } from './support/fixtures.js';

let app: NestExpressApplication;
let mira: string;
let admin: string;
let m: Record<string, number>;
let halden: number;

const http = () => request(app.getHttpServer());

beforeAll(async () => {
  app = await createTestApp();
  mira = await demoSession(app, 'engineer', 0);
  admin = await demoSession(app, 'admin');
  m = await materialIds(app, mira);
  halden = await customerId(app, mira, 'Halden Vision Systems');
});
afterAll(async () => {
  await app.close();
});

/** A constant-index test material (invented values). */
const materialBody = (name: string, n: number, version?: number) => ({
  name,
  model: { model: 'constant', n, k: 0 },
  rangeNm: { from: 300, to: 1200 },
  provenance: { kind: 'published', source: 'invented for this test', notes: '' },
  ...(version === undefined ? {} : { version }),
});

async function newMaterial(name: string, n: number): Promise<{ id: number; version: number }> {
  const res = await http().post('/api/materials').set('Cookie', mira).send(materialBody(name, n));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body;
}

async function designWith(materialId: number, name: string): Promise<number> {
  const res = await http()
    .post('/api/designs')
    .set('Cookie', mira)
    .send({
      name,
      customerId: halden,
      incidentMaterialId: m['Air'],
      substrateMaterialId: m['N-BK7'],
      substrateThicknessMm: 3,
      backSurface: 'front-only',
      referenceWavelengthNm: 550,
      layers: [{ materialId, thicknessNm: 68.75 }],
    });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.id;
}

const snapshotOf = async (designId: number, materialId: number) =>
  (await http().get(`/api/designs/${designId}/versions/1`).set('Cookie', mira)).body.materialsSnapshot?.[
    String(materialId)
  ];

describe('material revisions', () => {
  it('edits a material only drafts use in place; once a version froze it, an edit makes the next revision', async () => {
    const mat = await newMaterial('Revision test oxide', 2.0);
    const design = await designWith(mat.id, 'Revision test design');

    // Only a draft uses it: edited in place, still revision 1, nothing kept.
    const inPlace = await http()
      .put(`/api/materials/${mat.id}`)
      .set('Cookie', mira)
      .send(materialBody('Revision test oxide', 2.05, mat.version));
    expect(inPlace.status).toBe(200);
    expect(inPlace.body).toMatchObject({ revision: 1, version: mat.version + 1 });
    expect((await http().get(`/api/materials/${mat.id}/revisions`).set('Cookie', mira)).body).toEqual([]);

    const submit = await http()
      .post(`/api/designs/${design}/versions/1/submit`)
      .set('Cookie', mira)
      .send({ rowVersion: 1 });
    expect(submit.status, JSON.stringify(submit.body)).toBe(201);
    expect(await snapshotOf(design, mat.id)).toMatchObject({
      name: 'Revision test oxide',
      model: { model: 'constant', n: 2.05, k: 0 },
      revision: 1,
    });

    const revised = await http()
      .put(`/api/materials/${mat.id}`)
      .set('Cookie', mira)
      .send(materialBody('Revision test oxide', 2.1, inPlace.body.version));
    expect(revised.status).toBe(200);
    expect(revised.body).toMatchObject({ revision: 2, model: { n: 2.1 } });
    // Revision 1 stays readable, with who replaced it, and the submitted version keeps it.
    const revisions = await http().get(`/api/materials/${mat.id}/revisions`).set('Cookie', mira);
    expect(revisions.status).toBe(200);
    expect(revisions.body).toEqual([
      {
        revision: 1,
        name: 'Revision test oxide',
        model: { model: 'constant', n: 2.05, k: 0 },
        rangeNm: { from: 300, to: 1200 },
        typical: false,
        provenance: { kind: 'published', source: 'invented for this test', date: null, run: '', notes: '' },
        supersededAt: expect.any(String),
        supersededBy: 'Mira Castell',
      },
    ]);
    expect(await snapshotOf(design, mat.id)).toMatchObject({ model: { n: 2.05 }, revision: 1 });

    // A change of notes only leaves the optical content alone: no new revision.
    const notesOnly = await http()
      .put(`/api/materials/${mat.id}`)
      .set('Cookie', mira)
      .send({
        ...materialBody('Revision test oxide', 2.1, revised.body.version),
        provenance: { kind: 'published', source: 'invented for this test', notes: 'checked on a witness' },
      });
    expect(notesOnly.body).toMatchObject({ revision: 2, provenance: { notes: 'checked on a witness' } });

    const audit = await http().get(`/api/audit?entity=material&entityId=${mat.id}`).set('Cookie', admin);
    expect((audit.body as { action: string; summary: string }[]).map((e) => e.action).reverse()).toEqual([
      'created',
      'edited',
      'revised',
      'edited',
    ]);
    expect(audit.body[1].summary).toBe(
      'material "Revision test oxide" revised: revision 1 → 2; 1 submitted, approved or released version(s) keep revision 1',
    );
  });

  it('a stale edit of a material in use is refused and keeps no revision', async () => {
    const mat = await newMaterial('Revision test fluoride', 1.38);
    const design = await designWith(mat.id, 'Revision stale design');
    await http().post(`/api/designs/${design}/versions/1/submit`).set('Cookie', mira).send({ rowVersion: 1 });
    const stale = await http()
      .put(`/api/materials/${mat.id}`)
      .set('Cookie', mira)
      .send(materialBody('Revision test fluoride', 1.4, mat.version + 5));
    expect(stale.status).toBe(409);
    const rows = await app
      .get(DataSource)
      .query('SELECT count(*)::int AS n FROM material_revisions WHERE material_id = $1', [mat.id]);
    expect(rows[0].n).toBe(0);
    expect((await http().get(`/api/materials/${mat.id}`).set('Cookie', mira)).body).toMatchObject({
      revision: 1,
      model: { n: 1.38 },
    });
  });

  it('an edit arriving while a submit is freezing the material waits for it, then makes the next revision', async () => {
    const db = app.get(DataSource);
    const mat = await newMaterial('Revision race oxide', 1.6);
    const design = await designWith(mat.id, 'Revision race design');
    // Hold the submit after it has read the material and before it commits: it waits to write its
    // lifecycle event while this connection holds the table.
    const holder = db.createQueryRunner();
    await holder.connect();
    await holder.startTransaction();
    await holder.query('LOCK TABLE version_events IN EXCLUSIVE MODE');
    const submitting = http()
      .post(`/api/designs/${design}/versions/1/submit`)
      .set('Cookie', mira)
      .send({ rowVersion: 1 })
      .then((r) => r);
    /** Polls until at least `min` statements matching `query` wait on a lock (up to 5 s). */
    const waitingOn = async (query: string, min = 1) => {
      for (let i = 0; i < 100; i++) {
        const rows = (await db.query(
          `SELECT count(*)::int AS n FROM pg_stat_activity WHERE wait_event_type = 'Lock' AND query ILIKE $1`,
          [`%${query}%`],
        )) as { n: number }[];
        if (rows[0]!.n >= min) return true;
        await new Promise((r) => setTimeout(r, 50));
      }
      return false;
    };
    expect(await waitingOn('INSERT INTO "version_events"')).toBe(true);
    let editDone = false;
    const editing = http()
      .put(`/api/materials/${mat.id}`)
      .set('Cookie', mira)
      .send(materialBody('Revision race oxide', 1.65, mat.version))
      .then((r) => {
        editDone = true;
        return r;
      });
    // The edit may not slip in between: it waits on a lock (beside the submit) while the submit is
    // freezing the material.
    expect(await waitingOn('', 2)).toBe(true);
    expect(editDone).toBe(false);
    await holder.rollbackTransaction();
    await holder.release();
    const [submit, edit] = await Promise.all([submitting, editing]);
    expect(submit.status, JSON.stringify(submit.body)).toBe(201);
    expect(edit.status, JSON.stringify(edit.body)).toBe(200);
    expect(edit.body).toMatchObject({ revision: 2, model: { n: 1.65 } });
    expect(await snapshotOf(design, mat.id)).toMatchObject({ model: { n: 1.6 }, revision: 1 });
    const earlier = await http().get(`/api/materials/${mat.id}/revisions`).set('Cookie', mira);
    expect(
      earlier.body.map((r: { revision: number; model: { n: number } }) => [r.revision, r.model.n]),
    ).toEqual([[1, 1.6]]);
  });
});
