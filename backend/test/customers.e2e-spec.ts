import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, demoSession } from './support/app.js';

let app: NestExpressApplication;
let sales: string;

beforeAll(async () => {
  app = await createTestApp();
  sales = await demoSession(app, 'sales');
});
afterAll(async () => {
  await app.close();
});

const http = () => request(app.getHttpServer());

describe('customers', () => {
  it('lists the invented demo customers', async () => {
    const res = await http().get('/api/customers').set('Cookie', sales);
    expect(res.status).toBe(200);
    expect((res.body as { name: string }[]).map((c) => c.name)).toEqual(
      expect.arrayContaining(['Halden Vision Systems', 'Orrin Medical Imaging', 'Brightwater Instruments']),
    );
  });

  it('creates and edits a customer; a duplicate name gets 409; a bad e-mail 400', async () => {
    const created = await http()
      .post('/api/customers')
      .set('Cookie', sales)
      .send({ name: 'Quillon Optics', contactEmail: 'Buyer@Quillon.example' });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({
      name: 'Quillon Optics',
      contactEmail: 'buyer@quillon.example',
      notes: '',
    });
    const dup = await http().post('/api/customers').set('Cookie', sales).send({ name: 'Quillon Optics' });
    expect(dup.status).toBe(409);
    const bad = await http()
      .post('/api/customers')
      .set('Cookie', sales)
      .send({ name: 'X', contactEmail: 'nope' });
    expect(bad.status).toBe(400);
    expect(bad.body.details).toContain('contactEmail must be a valid e-mail address');
    const edited = await http()
      .put(`/api/customers/${created.body.id}`)
      .set('Cookie', sales)
      .send({ name: 'Quillon Optics', notes: 'Prefers PDF by e-mail', version: created.body.version });
    expect(edited.body.notes).toBe('Prefers PDF by e-mail');
    expect(edited.body.version).toBe(created.body.version + 1);
    // An edit from the old version is refused and changes nothing.
    const stale = await http()
      .put(`/api/customers/${created.body.id}`)
      .set('Cookie', sales)
      .send({ name: 'Quillon Optics', notes: 'lost', version: created.body.version });
    expect(stale.status).toBe(409);
    expect(stale.body.message).toMatch(
      /^Customer "Quillon Optics" was changed by someone else \(now version \d+\)/,
    );
    expect((await http().get('/api/customers/424242').set('Cookie', sales)).status).toBe(404);
  });

  it('operators do not see customers', async () => {
    const operator = await demoSession(app, 'operator');
    expect((await http().get('/api/customers').set('Cookie', operator)).status).toBe(403);
  });
});
