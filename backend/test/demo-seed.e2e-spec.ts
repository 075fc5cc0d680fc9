import type { NestExpressApplication } from '@nestjs/platform-express';
import { designStackDescription, engineBackSurface } from '@quietglass/shared/designs';
import { evaluateMask } from '@quietglass/shared/optics/mask';
import { parseStack } from '@quietglass/shared/optics/stack';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { dataSourceOptions } from '../src/database/data-source.js';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoSignIns, seedDemo } from '../src/database/demo-seed.js';
import { createTestApp, demoSession } from './support/app.js';
import { requireE2eEnv } from './support/env.js';

let app: NestExpressApplication;
let engineer: string;
let operator: string;

beforeAll(async () => {
  app = await createTestApp();
  engineer = await demoSession(app, 'engineer');
  operator = await demoSession(app, 'operator');
});
afterAll(async () => {
  await app.close();
});

const http = () => request(app.getHttpServer());

async function demoRecipe(): Promise<{ designId: number; number: number }> {
  const recipes = await http().get('/api/recipes').set('Cookie', operator);
  expect(recipes.status).toBe(200);
  const found = (recipes.body as { designId: number; number: number; name: string }[]).find(
    (r) => r.name === 'HVS-2210 four-layer AR',
  );
  if (!found) throw new Error('the demo recipe is missing');
  return found;
}

describe('demo shop', () => {
  it('has a released recipe that a second engineer approved, with its audit trail', async () => {
    const { designId, number } = await demoRecipe();
    expect(number).toBe(1);
    const history = await http().get(`/api/designs/${designId}/history`).set('Cookie', engineer);
    expect(
      (history.body as { from: string; to: string; actor: { displayName: string } }[]).map((e) => [
        e.from,
        e.to,
        e.actor.displayName,
      ]),
    ).toEqual([
      ['draft', 'submitted', 'Mira Castell'],
      ['submitted', 'approved', 'Tomas Reyes'],
      ['approved', 'released', 'Tomas Reyes'],
    ]);
  });

  it("the demo recipe meets its customer's mask with the frozen materials", async () => {
    const { designId } = await demoRecipe();
    const design = await http().get(`/api/designs/${designId}`).set('Cookie', engineer);
    const version = await http().get(`/api/designs/${designId}/versions/1`).set('Cookie', engineer);
    const mask = await http().get(`/api/spec-masks/${design.body.specMaskId}`).set('Cookie', engineer);
    expect(mask.body.name).toBe('HVS-2210 lens AR');
    const stack = parseStack(designStackDescription(version.body, version.body.materialsSnapshot));
    // The mask is the customer's limit (R ≤ 0.5 % over 420–680 nm at 0, 15 and 30°); the engine is
    // checked against published values in its own tests. A demo recipe that fails its mask would
    // mislead everyone who tries the product.
    const result = evaluateMask({ bands: mask.body.bands }, stack, {
      back: engineBackSurface(version.body.backSurface),
    });
    expect(result.pass).toBe(true);
    expect(result.worstMargin).toBeGreaterThan(0);
  });

  it('seeding again creates nothing and keeps the recipe released', async () => {
    const { databaseUrl, credentialsFile } = requireE2eEnv();
    const db = new DataSource(dataSourceOptions(databaseUrl));
    await db.initialize();
    try {
      expect(await seedDemo(db, demoSignIns(credentialsFile))).toBe(0);
    } finally {
      await db.destroy();
    }
    const recipes = await http().get('/api/recipes').set('Cookie', operator);
    expect(
      (recipes.body as { name: string }[]).filter((r) => r.name === 'HVS-2210 four-layer AR'),
    ).toHaveLength(1);
  });

  it('never re-creates a demo record the shop renamed', async () => {
    const { databaseUrl, credentialsFile } = requireE2eEnv();
    const db = new DataSource(dataSourceOptions(databaseUrl));
    await db.initialize();
    try {
      const [chamber] = (await db.query(`SELECT id, name FROM chambers WHERE name = 'Box coater B2'`)) as {
        id: number;
        name: string;
      }[];
      expect(chamber).toBeDefined();
      await db.query(`UPDATE chambers SET name = 'Box coater B2 (renamed)' WHERE id = $1`, [chamber!.id]);
      try {
        expect(await seedDemo(db, demoSignIns(credentialsFile))).toBe(0);
        const rows = (await db.query(`SELECT name FROM chambers WHERE name LIKE 'Box coater B2%'`)) as {
          name: string;
        }[];
        expect(rows.map((r) => r.name)).toEqual(['Box coater B2 (renamed)']);
      } finally {
        await db.query(`UPDATE chambers SET name = 'Box coater B2' WHERE id = $1`, [chamber!.id]);
      }
    } finally {
      await db.destroy();
    }
  });
});
