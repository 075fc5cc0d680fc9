import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LOGO_MAX_BYTES } from '@quietglass/shared/shop';
import { DEFAULT_TARGET_MARGIN_PERCENT } from '@quietglass/shared/optimise/fit';
import { createTestApp, demoSession } from './support/app.js';
import { binary } from './support/binary.js';
import { customerId, maskId, materialIds, twoLayerDesign } from './support/fixtures.js';
import { solidPng } from './support/png.js';

let app: NestExpressApplication;
let admin: string;
let engineer: string;
let operator: string;
let firstAudit: number;
const http = () => request(app.getHttpServer());

beforeAll(async () => {
  app = await createTestApp();
  admin = await demoSession(app, 'admin');
  engineer = await demoSession(app, 'engineer');
  operator = await demoSession(app, 'operator');
  // Start from a shop no one has configured, whatever ran before on this database.
  const db = app.get(DataSource);
  await db.query('DELETE FROM shop_settings');
  firstAudit = Number(
    ((await db.query('SELECT coalesce(max(id), 0) AS n FROM audit_events')) as { n: string }[])[0]!.n,
  );
});
afterAll(async () => {
  // Leave the shop as the other files expect it: the demo name, no logo.
  const db = app.get(DataSource);
  await db.query('DELETE FROM shop_settings');
  await app.close();
});

const settingsRow = async () =>
  (await app.get(DataSource).query('SELECT shop_name, logo_type, version FROM shop_settings')) as {
    shop_name: string;
    logo_type: string | null;
    version: number;
  }[];
const auditCount = async () =>
  Number(
    (
      (await app
        .get(DataSource)
        .query(`SELECT count(*) AS n FROM audit_events WHERE entity = 'shop-settings'`)) as { n: string }[]
    )[0]!.n,
  );

describe('shop settings', () => {
  it('starts from SHOP_NAME with no logo', async () => {
    const res = await http().get('/api/shop-settings').set('Cookie', operator);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      shopName: 'Larkspur Thin Film Works',
      logo: null,
      targetMarginPercent: DEFAULT_TARGET_MARGIN_PERCENT,
      version: 0,
      updatedAt: null,
    });
    expect((await http().get('/api/shop-settings/logo').set('Cookie', operator)).status).toBe(404);
  });

  it.each([
    [{ shopName: '   ', version: 0 }, 'shopName: The shop needs a name'],
    [{ shopName: 'x'.repeat(121), version: 0 }, 'shopName: At most 120 characters'],
    [{ shopName: 'Fine', version: -1 }, 'version: version must be the version you read'],
    [{ shopName: 'Fine', version: 0, colour: 'red' }, 'Unrecognized key: "colour"'],
  ])('refuses the name %j with 400 and writes nothing', async (body, detail) => {
    const res = await http().put('/api/shop-settings').set('Cookie', admin).send(body);
    expect(res.status).toBe(400);
    expect(res.body.details).toContain(detail);
    expect(await settingsRow()).toEqual([]);
  });

  it('only admins rename the shop; the rename is audited and version-locked', async () => {
    expect(
      (await http().put('/api/shop-settings').set('Cookie', engineer).send({ shopName: 'X', version: 0 }))
        .status,
    ).toBe(403);
    const before = await auditCount();
    const res = await http()
      .put('/api/shop-settings')
      .set('Cookie', admin)
      .send({ shopName: '  Larkspur Optics  ', version: 0 });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ shopName: 'Larkspur Optics', version: 1, logo: null });
    expect(await auditCount()).toBe(before + 1);
    const stale = await http()
      .put('/api/shop-settings')
      .set('Cookie', admin)
      .send({ shopName: 'Someone else', version: 0 });
    expect(stale.status).toBe(409);
    expect(stale.body.message).toMatch(/now version 1/);
    expect((await settingsRow())[0]).toEqual({ shop_name: 'Larkspur Optics', logo_type: null, version: 1 });
  });

  it.each([
    [
      { contentType: 'image/gif', dataBase64: 'R0lGODlh', version: 1 },
      'contentType: The logo must be a PNG or JPEG image',
    ],
    [{ contentType: 'image/png', dataBase64: 'not base64!', version: 1 }, 'dataBase64: not valid base64'],
    [
      {
        contentType: 'image/png',
        dataBase64: Buffer.from('%PDF-1.7 not an image').toString('base64'),
        version: 1,
      },
      'dataBase64: the file is not a PNG image',
    ],
    [
      { contentType: 'image/jpeg', dataBase64: solidPng(8, 8).toString('base64'), version: 1 },
      'dataBase64: the file is not a JPEG image',
    ],
    [
      { contentType: 'image/png', dataBase64: solidPng(4001, 2).toString('base64'), version: 1 },
      'the logo is 4001 × 2 px; each side must be 1–4000 px',
    ],
    [
      { contentType: 'image/png', dataBase64: 'A'.repeat(Math.ceil(LOGO_MAX_BYTES / 3) * 4 + 4), version: 1 },
      'dataBase64: The logo must be at most 512 KB',
    ],
  ])('refuses the logo %# with 400 and writes nothing', async (body, detail) => {
    const res = await http().put('/api/shop-settings/logo').set('Cookie', admin).send(body);
    expect(res.status).toBe(400);
    expect(res.body.details).toContain(detail);
    expect((await settingsRow())[0]).toEqual({ shop_name: 'Larkspur Optics', logo_type: null, version: 1 });
  });

  it('stores a PNG logo, serves it back byte for byte, and removes it', async () => {
    const png = solidPng(120, 40);
    const up = await http()
      .put('/api/shop-settings/logo')
      .set('Cookie', admin)
      .send({ contentType: 'image/png', dataBase64: png.toString('base64'), version: 1 });
    expect(up.status).toBe(200);
    expect(up.body).toMatchObject({ logo: { contentType: 'image/png', bytes: png.length }, version: 2 });
    const back = await binary(http().get('/api/shop-settings/logo').set('Cookie', operator));
    expect(back.status).toBe(200);
    expect(back.headers['content-type']).toBe('image/png');
    expect(Buffer.compare(back.body as Buffer, png)).toBe(0);
    expect((await http().delete('/api/shop-settings/logo?version=2').set('Cookie', engineer)).status).toBe(
      403,
    );
    const gone = await http().delete('/api/shop-settings/logo?version=2').set('Cookie', admin);
    expect(gone.status).toBe(200);
    expect(gone.body).toMatchObject({ logo: null, version: 3, shopName: 'Larkspur Optics' });
    const actions = (
      (await app
        .get(DataSource)
        .query(`SELECT action FROM audit_events WHERE entity = 'shop-settings' AND id > $1 ORDER BY id`, [
          firstAudit,
        ])) as {
        action: string;
      }[]
    ).map((r) => r.action);
    expect(actions).toEqual(['renamed', 'logo uploaded', 'logo removed']);
  });

  it.each([
    [
      { targetMarginPercent: -0.1, version: 3 },
      'targetMarginPercent: A number from 0 to 5 percentage points',
    ],
    [{ targetMarginPercent: 6, version: 3 }, 'targetMarginPercent: A number from 0 to 5 percentage points'],
    [
      { targetMarginPercent: '0.2', version: 3 },
      'targetMarginPercent: A number from 0 to 5 percentage points',
    ],
    [{ version: 3 }, 'targetMarginPercent: A number from 0 to 5 percentage points'],
  ])('refuses the target margin %j with 400 and writes nothing', async (body, detail) => {
    const res = await http().put('/api/shop-settings/target-margin').set('Cookie', admin).send(body);
    expect(res.status).toBe(400);
    expect(res.body.details).toContain(detail);
    expect((await settingsRow())[0]!.version).toBe(3);
  });

  it('sets the default target margin (admins only, audited) that a Fit to mask without one designs in', async () => {
    const engineerTry = await http()
      .put('/api/shop-settings/target-margin')
      .set('Cookie', engineer)
      .send({ targetMarginPercent: 0.25, version: 3 });
    expect(engineerTry.status).toBe(403);
    const res = await http()
      .put('/api/shop-settings/target-margin')
      .set('Cookie', admin)
      .send({ targetMarginPercent: 0.25, version: 3 });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ targetMarginPercent: 0.25, version: 4, shopName: 'Larkspur Optics' });
    const audit = (await app.get(DataSource).query(
      `SELECT summary FROM audit_events
         WHERE entity = 'shop-settings' AND action = 'target margin changed' AND id > $1`,
      [firstAudit],
    )) as { summary: string }[];
    expect(audit.map((a) => a.summary)).toEqual([
      `default target margin changed from ${DEFAULT_TARGET_MARGIN_PERCENT} to 0.25 percentage points`,
    ]);

    const m = await materialIds(app, engineer);
    const customer = await customerId(app, engineer, 'Halden Vision Systems');
    const specMaskId = await maskId(app, engineer, customer, 'HVS-2210 lens AR');
    const design = await http()
      .post('/api/designs')
      .set('Cookie', engineer)
      .send({ ...twoLayerDesign(m, customer, 'Shop target margin'), specMaskId });
    expect(design.status, JSON.stringify(design.body)).toBe(201);
    // What the queued Fit to mask designs in: the shop's default, or the margin the request names.
    const marginOf = async (body: object) => {
      const sub = await http()
        .post(`/api/designs/${design.body.id}/versions/1/fit`)
        .set('Cookie', engineer)
        .send({ maxIterations: 3, ...body });
      expect(sub.status, JSON.stringify(sub.body)).toBe(201);
      const rows = (await app
        .get(DataSource)
        .query('SELECT input FROM calculations WHERE id = $1', [sub.body.id])) as {
        input: { options: { marginPercent: number } };
      }[];
      return rows[0]!.input.options.marginPercent;
    };
    expect(await marginOf({})).toBe(0.25);
    expect(await marginOf({ targetMarginPercent: 0.05 })).toBe(0.05);
  });
});
