import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, demoSession } from './support/app.js';
import { customerId, materialIds, twoLayerDesign, versionContent } from './support/fixtures.js';

// What is approved must be exactly what was reviewed, by someone who did not write it: the race
// and four-eyes checks run against the real PostgreSQL that `npm test` starts. The rules are
// common practice for controlled records in an ISO 9001-audited shop (no source).

let app: NestExpressApplication;
let mira: string;
let tomas: string;
let admin: string;
let m: Record<string, number>;
let design: ReturnType<typeof twoLayerDesign>;

beforeAll(async () => {
  app = await createTestApp();
  mira = await demoSession(app, 'engineer', 0);
  tomas = await demoSession(app, 'engineer', 1);
  admin = await demoSession(app, 'admin');
  m = await materialIds(app, mira);
  design = twoLayerDesign(m, await customerId(app, mira, 'Orrin Medical Imaging'), 'Chain AR');
});
afterAll(async () => {
  await app.close();
});

const http = () => request(app.getHttpServer());
const act = (cookie: string, id: number, n: number, action: string, body: object = {}) =>
  http().post(`/api/designs/${id}/versions/${n}/${action}`).set('Cookie', cookie).send(body);

async function newDesign(): Promise<number> {
  const res = await http().post('/api/designs').set('Cookie', mira).send(design);
  expect(res.status).toBe(201);
  return res.body.id as number;
}

describe('submit racing a save', () => {
  it('in 30 races never both succeed, and a submitted version holds exactly what the submitter saw', async () => {
    const withSilica = {
      ...versionContent(design),
      layers: [...design.layers, { materialId: m['SiO2'], thicknessNm: 20 }],
    };
    let submits = 0;
    let saves = 0;
    for (let round = 0; round < 30; round++) {
      const id = await newDesign();
      const [save, submit] = await Promise.all([
        http()
          .put(`/api/designs/${id}/versions/1`)
          .set('Cookie', tomas)
          .send({ ...withSilica, rowVersion: 1 }),
        act(mira, id, 1, 'submit', { rowVersion: 1 }),
      ]);
      const won = [save.status === 200, submit.status === 201];
      expect(
        won.filter(Boolean),
        `round ${round}: save ${save.status}, submit ${submit.status}`,
      ).toHaveLength(1);
      const v = (await http().get(`/api/designs/${id}/versions/1`).set('Cookie', mira)).body;
      if (won[1]) {
        submits++;
        expect(save.status).toBe(409);
        expect(v.status).toBe('submitted');
        expect(v.layers.map((l: { materialId: number }) => l.materialId)).toEqual([m['MgF2'], m['ZrO2']]);
        expect(Object.keys(v.materialsSnapshot).map(Number).sort()).toEqual(
          [m['Air'], m['N-BK7'], m['MgF2'], m['ZrO2']].sort(),
        );
      } else {
        saves++;
        expect(submit.status).toBe(409);
        expect(submit.body.message).toMatch(
          /was saved by Tomas Reyes at .*\(you saw row version 1, it is now 2\)/,
        );
        expect(v.status).toBe('draft');
        expect(v.layers).toHaveLength(3);
        expect(v.materialsSnapshot).toBeNull();
      }
    }
    expect(submits + saves).toBe(30);
  });

  it('a submit with an old token is refused with what changed, and the newer content is what gets submitted', async () => {
    const id = await newDesign();
    const saved = await http()
      .put(`/api/designs/${id}/versions/1`)
      .set('Cookie', mira)
      .send({ ...versionContent(design), rowVersion: 1, notes: 'second coat' });
    expect(saved.status).toBe(200);
    const stale = await act(mira, id, 1, 'submit', { rowVersion: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.message).toMatch(
      /^Version 1 was saved by Mira Castell at .* \(you saw row version 1, it is now 2\)/,
    );
    const ok = await act(mira, id, 1, 'submit', { rowVersion: 2 });
    expect(ok.status).toBe(201);
    expect(ok.body.notes).toBe('second coat');
  });
});

describe('four-eyes on everyone who edited', () => {
  it('refuses the approver who edited the draft, records the refusal, and lists every editor', async () => {
    const id = await newDesign();
    const edit = await http()
      .put(`/api/designs/${id}/versions/1`)
      .set('Cookie', tomas)
      .send({ ...versionContent(design), rowVersion: 1, notes: 'thinner outer layer' });
    expect(edit.status).toBe(200);
    expect(edit.body.editors.map((e: { displayName: string }) => e.displayName)).toEqual([
      'Mira Castell',
      'Tomas Reyes',
    ]);
    expect((await act(mira, id, 1, 'submit', { rowVersion: 2 })).status).toBe(201);
    const approve = await act(tomas, id, 1, 'approve');
    expect(approve.status).toBe(403);
    expect(approve.body.message).toBe(
      'Four-eyes rule: another engineer must approve version 1; you edited it',
    );
    expect((await act(admin, id, 1, 'approve')).status).toBe(201);
    const release = await act(tomas, id, 1, 'release');
    expect(release.status).toBe(403);
    expect(release.body.message).toBe(
      'Four-eyes rule: another engineer must release version 1; you edited it',
    );
    expect((await act(admin, id, 1, 'release')).status).toBe(201);

    const history = (await http().get(`/api/designs/${id}/history`).set('Cookie', mira)).body as {
      kind: string;
      to: string;
      actor: { displayName: string };
    }[];
    expect(history.map((e) => [e.kind, e.to, e.actor.displayName])).toEqual([
      ['saved', 'draft', 'Tomas Reyes'],
      ['status', 'submitted', 'Mira Castell'],
      ['status', 'approved', 'Elin Voss'],
      ['status', 'released', 'Elin Voss'],
    ]);
    const audit = (await http().get(`/api/audit?designId=${id}`).set('Cookie', admin)).body as {
      action: string;
      actor: { displayName: string };
    }[];
    expect(audit.map((e) => [e.action, e.actor.displayName]).reverse()).toEqual([
      ['created', 'Mira Castell'],
      ['version saved', 'Tomas Reyes'],
      ['submitted', 'Mira Castell'],
      ['approve refused', 'Tomas Reyes'],
      ['approved', 'Elin Voss'],
      ['release refused', 'Tomas Reyes'],
      ['released', 'Elin Voss'],
    ]);
  });

  it('the author may not release an approved version either', async () => {
    const id = await newDesign();
    await act(mira, id, 1, 'submit', { rowVersion: 1 });
    expect((await act(tomas, id, 1, 'approve')).status).toBe(201);
    const release = await act(mira, id, 1, 'release');
    expect(release.status).toBe(403);
    expect(release.body.message).toBe(
      'Four-eyes rule: another engineer must release version 1; you wrote or submitted it',
    );
  });
});
