import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, demoSession } from './support/app.js';
import { requestBodies } from './support/openapi.js';

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
    expect(bad.body.details).toContain('contactEmail: Enter a valid e-mail address');
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

  it('keeps contacts with checked e-mail addresses; a bad contact gets 400 and writes nothing', async () => {
    const count = async () =>
      Number((await app.get(DataSource).query('SELECT count(*) AS n FROM customers'))[0].n);
    const before = await count();
    const bad = await http()
      .post('/api/customers')
      .set('Cookie', sales)
      .send({ name: 'Tessaly Lens Works', contacts: [{ name: 'Ona Vell', email: 'ona at tessaly' }] });
    expect(bad.status).toBe(400);
    expect(bad.body.details).toContain('contacts.0.email: Enter a valid e-mail address');
    const unnamed = await http()
      .post('/api/customers')
      .set('Cookie', sales)
      .send({ name: 'Tessaly Lens Works', contacts: [{ name: ' ', email: 'ona@tessaly.example' }] });
    expect(unnamed.status).toBe(400);
    expect(unnamed.body.details).toContain("contacts.0.name: Enter the contact's name");
    const extra = await http()
      .post('/api/customers')
      .set('Cookie', sales)
      .send({
        name: 'Tessaly Lens Works',
        contacts: [{ name: 'Ona', email: 'ona@tessaly.example', fax: '1' }],
      });
    expect(extra.status).toBe(400);
    expect(extra.body.details).toContain('contacts.0: Unrecognized key: "fax"');
    expect(await count()).toBe(before);
    const created = await http()
      .post('/api/customers')
      .set('Cookie', sales)
      .send({
        name: 'Tessaly Lens Works',
        contacts: [
          { name: 'Ona Vell', email: ' Ona@Tessaly.example ', role: 'purchasing', phone: '' },
          { name: 'Pim Arro', email: 'pim@tessaly.example' },
        ],
      });
    expect(created.status).toBe(201);
    expect(created.body.contacts).toEqual([
      { name: 'Ona Vell', email: 'ona@tessaly.example', role: 'purchasing' },
      { name: 'Pim Arro', email: 'pim@tessaly.example' },
    ]);
    expect(created.body.archivedAt).toBeNull();
    const audit = await app
      .get(DataSource)
      .query(`SELECT action FROM audit_events WHERE entity = 'customer' AND entity_id = $1`, [
        created.body.id,
      ]);
    expect(audit).toEqual([{ action: 'created' }]);
  });

  it('archives and restores with the version token: hidden from the list, kept on request, audited', async () => {
    const created = await http().post('/api/customers').set('Cookie', sales).send({ name: 'Varro Filters' });
    const id = created.body.id as number;
    const names = async (query = '') =>
      ((await http().get(`/api/customers${query}`).set('Cookie', sales)).body as { name: string }[]).map(
        (c) => c.name,
      );
    const stale = await http()
      .post(`/api/customers/${id}/archive`)
      .set('Cookie', sales)
      .send({ version: created.body.version + 5 });
    expect(stale.status).toBe(409);
    expect((await http().post(`/api/customers/${id}/archive`).set('Cookie', sales).send({})).status).toBe(
      400,
    );
    const archived = await http()
      .post(`/api/customers/${id}/archive`)
      .set('Cookie', sales)
      .send({ version: created.body.version });
    expect(archived.status).toBe(201);
    expect(archived.body.archivedAt).toEqual(expect.any(String));
    expect(archived.body.version).toBe(created.body.version + 1);
    expect(await names()).not.toContain('Varro Filters');
    expect(await names('?includeArchived=true')).toContain('Varro Filters');
    const again = await http()
      .post(`/api/customers/${id}/archive`)
      .set('Cookie', sales)
      .send({ version: archived.body.version });
    expect(again.status).toBe(409);
    expect(again.body.message).toBe('Customer "Varro Filters" is already archived');
    const restored = await http()
      .post(`/api/customers/${id}/restore`)
      .set('Cookie', sales)
      .send({ version: archived.body.version });
    expect(restored.body.archivedAt).toBeNull();
    expect(await names()).toContain('Varro Filters');
    const audit = await app
      .get(DataSource)
      .query(`SELECT action FROM audit_events WHERE entity = 'customer' AND entity_id = $1 ORDER BY id`, [
        id,
      ]);
    expect(audit.map((a: { action: string }) => a.action)).toEqual(['created', 'archived', 'restored']);
  });

  it("lists a customer's masks, designs, reports and quotes", async () => {
    const list = (await http().get('/api/customers').set('Cookie', sales)).body as {
      id: number;
      name: string;
    }[];
    const halden = list.find((c) => c.name === 'Halden Vision Systems');
    const res = await http().get(`/api/customers/${halden?.id}/records`).set('Cookie', sales);
    expect(res.status).toBe(200);
    expect(Object.keys(res.body).sort()).toEqual(['designs', 'masks', 'quotes', 'reports']);
    expect(res.body.masks).toContainEqual(
      expect.objectContaining({ title: 'HVS-2210 lens AR rev A', status: 'customer' }),
    );
    expect((await http().get('/api/customers/424242/records').set('Cookie', sales)).status).toBe(404);
  });

  it('publishes the shared customer schemas as the request bodies in the OpenAPI description', async () => {
    const bodyOf = await requestBodies(app);
    const create = bodyOf('post', '/api/customers');
    expect(Object.keys(create.properties).sort()).toEqual(['contactEmail', 'contacts', 'name', 'notes']);
    expect(create.required).toEqual(['name']);
    expect(create.properties.contacts!.maxItems).toBe(20);
    expect(create.properties.contacts!.items!.required?.sort()).toEqual(['email', 'name']);
    expect(bodyOf('put', '/api/customers/{id}').required?.sort()).toEqual(['name', 'version']);
    expect(bodyOf('post', '/api/customers/{id}/archive').required).toEqual(['version']);
  });

  it('operators do not see customers', async () => {
    const operator = await demoSession(app, 'operator');
    expect((await http().get('/api/customers').set('Cookie', operator)).status).toBe(403);
  });
});
