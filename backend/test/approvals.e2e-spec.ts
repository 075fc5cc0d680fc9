import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { requestBodies } from './support/openapi.js';
import { createTestApp, demoSession } from './support/app.js';
import { customerId, materialIds, twoLayerDesign, versionContent } from './support/fixtures.js';

let app: NestExpressApplication;
let mira: string; // engineer, usually the author
let tomas: string; // the second engineer
let admin: string;
let operator: string;
let design: ReturnType<typeof twoLayerDesign>;

beforeAll(async () => {
  app = await createTestApp();
  mira = await demoSession(app, 'engineer', 0);
  tomas = await demoSession(app, 'engineer', 1);
  admin = await demoSession(app, 'admin');
  operator = await demoSession(app, 'operator');
  design = twoLayerDesign(
    await materialIds(app, mira),
    await customerId(app, mira, 'Orrin Medical Imaging'),
    'Window 532 AR',
  );
});
afterAll(async () => {
  await app.close();
});

const http = () => request(app.getHttpServer());
const act = (cookie: string, id: number, n: number, action: string, body: object = {}) =>
  http().post(`/api/designs/${id}/versions/${n}/${action}`).set('Cookie', cookie).send(body);

async function newDesign(cookie = mira): Promise<number> {
  const res = await http().post('/api/designs').set('Cookie', cookie).send(design);
  expect(res.status).toBe(201);
  return res.body.id;
}

describe('four-eyes approval and release', () => {
  it('draft → submitted → approved by another engineer → released; the author may not approve', async () => {
    const id = await newDesign();
    expect((await act(mira, id, 1, 'submit', { rowVersion: 1 })).body.status).toBe('submitted');
    const own = await act(mira, id, 1, 'approve');
    expect(own.status).toBe(403);
    expect(own.body.message).toBe(
      'Four-eyes rule: another engineer must approve version 1; you wrote or submitted it',
    );
    const approved = await act(tomas, id, 1, 'approve', { comment: 'Margins fine at 30°' });
    expect(approved.status).toBe(201);
    expect(approved.body.status).toBe('approved');
    // Approved is immutable.
    const edit = await http()
      .put(`/api/designs/${id}/versions/1`)
      .set('Cookie', mira)
      .send({ ...versionContent(design), rowVersion: approved.body.rowVersion });
    expect(edit.status).toBe(409);
    expect(edit.body.message).toMatch(/is approved and cannot change/);
    const released = await act(tomas, id, 1, 'release');
    expect(released.body.status).toBe('released');
    expect((await act(mira, id, 1, 'approve')).status).toBe(409);
  });

  it('the submitter may not approve either, even when someone else wrote the version', async () => {
    const id = await newDesign(mira);
    await act(tomas, id, 1, 'submit', { rowVersion: 1 });
    expect((await act(tomas, id, 1, 'approve')).status).toBe(403);
    expect((await act(mira, id, 1, 'approve')).status).toBe(403);
    expect((await act(admin, id, 1, 'approve')).status).toBe(201);
  });

  it('a returned version needs a comment, can be edited again and resubmitted', async () => {
    const id = await newDesign();
    await act(mira, id, 1, 'submit', { rowVersion: 1 });
    const bare = await act(tomas, id, 1, 'return');
    expect(bare.status).toBe(400);
    expect(bare.body.details).toEqual(['comment: A return needs a comment: say what to change']);
    const returned = await act(tomas, id, 1, 'return', { comment: 'Outer layer too thin for abrasion' });
    expect(returned.body.status).toBe('returned');
    const edited = await http()
      .put(`/api/designs/${id}/versions/1`)
      .set('Cookie', mira)
      .send({ ...versionContent(design), rowVersion: returned.body.rowVersion });
    expect(edited.status).toBe(200);
    const again = await act(mira, id, 1, 'submit', { rowVersion: edited.body.rowVersion });
    expect(again.body.status).toBe('submitted');
    expect((await act(tomas, id, 1, 'approve')).body.status).toBe('approved');
  });

  it('writes every transition to the audit trail, queryable by admins only', async () => {
    const id = await newDesign();
    await act(mira, id, 1, 'submit', { rowVersion: 1 });
    await act(tomas, id, 1, 'return', { comment: 'Check 680 nm' });
    const v = (await http().get(`/api/designs/${id}/versions/1`).set('Cookie', mira)).body;
    await act(mira, id, 1, 'submit', { rowVersion: v.rowVersion });
    await act(tomas, id, 1, 'approve');
    await act(tomas, id, 1, 'release');
    await act(admin, id, 1, 'retire', { comment: 'Superseded' });
    const history = await http().get(`/api/designs/${id}/history`).set('Cookie', mira);
    expect(history.status).toBe(200);
    expect(
      history.body.map((e: { from: string; to: string; actor: { displayName: string }; comment: string }) => [
        e.from,
        e.to,
        e.actor.displayName,
        e.comment,
      ]),
    ).toEqual([
      ['draft', 'submitted', 'Mira Castell', ''],
      ['submitted', 'returned', 'Tomas Reyes', 'Check 680 nm'],
      ['returned', 'submitted', 'Mira Castell', ''],
      ['submitted', 'approved', 'Tomas Reyes', ''],
      ['approved', 'released', 'Tomas Reyes', ''],
      ['released', 'retired', 'Elin Voss', 'Superseded'],
    ]);
    const audit = await http().get(`/api/audit?designId=${id}`).set('Cookie', admin);
    expect(audit.status).toBe(200);
    // Newest first: the lifecycle steps, then the creation of the design.
    expect(
      audit.body.map((e: { action: string; actor: { displayName: string } }) => [
        e.action,
        e.actor.displayName,
      ]),
    ).toEqual([
      ['retired', 'Elin Voss'],
      ['released', 'Tomas Reyes'],
      ['approved', 'Tomas Reyes'],
      ['submitted', 'Mira Castell'],
      ['returned', 'Tomas Reyes'],
      ['submitted', 'Mira Castell'],
      ['created', 'Mira Castell'],
    ]);
    expect((await http().get('/api/audit').set('Cookie', mira)).status).toBe(403);
  });

  it('operators see released recipes only: drafts are 404 as recipes and 403 as designs', async () => {
    const draftId = await newDesign();
    const releasedId = await newDesign();
    await act(mira, releasedId, 1, 'submit', { rowVersion: 1 });
    await act(tomas, releasedId, 1, 'approve');
    await act(tomas, releasedId, 1, 'release');
    const list = await http().get('/api/recipes').set('Cookie', operator);
    expect(list.status).toBe(200);
    const ids = list.body.map((r: { designId: number }) => r.designId);
    expect(ids).toContain(releasedId);
    expect(ids).not.toContain(draftId);
    expect(list.body.find((r: { designId: number }) => r.designId === releasedId)).toMatchObject({
      number: 1,
      name: 'Window 532 AR',
      customer: 'Orrin Medical Imaging',
      releasedBy: 'Tomas Reyes',
    });
    const recipe = await http().get(`/api/recipes/${releasedId}/1`).set('Cookie', operator);
    expect(recipe.status).toBe(200);
    expect(recipe.body).toMatchObject({ status: 'released', name: 'Window 532 AR' });
    expect(recipe.body.layers).toHaveLength(2);
    const draft = await http().get(`/api/recipes/${draftId}/1`).set('Cookie', operator);
    expect(draft.status).toBe(404);
    expect((await http().get(`/api/designs/${draftId}/versions/1`).set('Cookie', operator)).status).toBe(403);
  });

  it('refuses transitions out of order with 409', async () => {
    const id = await newDesign();
    const early = await act(tomas, id, 1, 'release');
    expect(early.status).toBe(409);
    expect(early.body.message).toBe('Version 1 is draft; it can be released only when approved');
    const unread = await act(mira, id, 1, 'submit', {});
    expect(unread.status).toBe(400);
    expect(unread.body.details).toEqual([
      'rowVersion: rowVersion is required to submit: the row version you reviewed',
    ]);
  });

  it('takes a step without a body, refuses unknown fields and overlong comments, and publishes the bodies', async () => {
    const id = await newDesign();
    await act(mira, id, 1, 'submit', { rowVersion: 1 });
    const extra = await act(tomas, id, 1, 'approve', { comment: 'ok', signature: 'T.' });
    expect(extra.status).toBe(400);
    expect(extra.body.details).toEqual(['Unrecognized key: "signature"']);
    const long = await act(tomas, id, 1, 'approve', { comment: 'x'.repeat(4001) });
    expect(long.body.details).toEqual(['comment: At most 4000 characters']);
    const bare = await http().post(`/api/designs/${id}/versions/1/approve`).set('Cookie', tomas);
    expect(bare.status, JSON.stringify(bare.body)).toBe(201);
    expect(bare.body.status).toBe('approved');

    const bodyOf = await requestBodies(app);
    const submit = bodyOf('post', '/api/designs/{id}/versions/{number}/submit');
    expect(submit.required).toEqual(['rowVersion']);
    const giveBack = bodyOf('post', '/api/designs/{id}/versions/{number}/return');
    expect(giveBack.required).toEqual(['comment']);
    expect(giveBack.properties.comment!.maxLength).toBe(4000);
  });
});
