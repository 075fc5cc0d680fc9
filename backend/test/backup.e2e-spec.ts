import { spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import { get as httpGet } from 'node:http';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { dataSourceOptions } from '../src/database/data-source.js';
import { demoSignIns, seedDemo } from '../src/database/demo-seed.js';
import { createTestApp, demoSession } from './support/app.js';
import { binary } from './support/binary.js';
import { requireE2eEnv } from './support/env.js';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const BACKUP_DB = 'quietglass_backup';

let app: NestExpressApplication;
let db: DataSource;
let mira: string;
let tomas: string;
let admin: string;

const http = () => request(app.getHttpServer());

beforeAll(async () => {
  app = await createTestApp();
  db = app.get(DataSource);
  mira = await demoSession(app, 'engineer', 0);
  tomas = await demoSession(app, 'engineer', 1);
  admin = await demoSession(app, 'admin');
});
afterAll(async () => {
  await app.close();
});

/** A finished calculation of the user with `email`, inserted directly. */
async function calculationOf(email: string, hash: string): Promise<number> {
  const [row] = (await db.query(
    `INSERT INTO calculations (kind, input_hash, input, status, values, created_by)
     VALUES ('analysis', $1, '{}', 'completed', $2, (SELECT id FROM users WHERE email = $3)) RETURNING id`,
    [
      hash.length === 64 ? hash : hash.repeat(64),
      Buffer.from(new Float64Array([0.01, 0.99, 0]).buffer),
      email,
    ],
  )) as { id: number }[];
  return row!.id;
}

describe('deleting calculations', () => {
  it('lets the owner or an admin delete a calculation and its result, and nobody else', async () => {
    const mine = await calculationOf('mira.castell@larkspur.example', 'a');
    const other = await calculationOf('tomas.reyes@larkspur.example', 'b');
    const refused = await http().delete(`/api/calculations/${mine}`).set('Cookie', tomas);
    expect(refused.status).toBe(403);
    expect(refused.body.message).toBe(
      `Only Mira Castell, who asked for calculation ${mine}, or an admin may delete it`,
    );
    expect((await http().get(`/api/calculations/${mine}`).set('Cookie', mira)).status).toBe(200);
    expect((await http().delete(`/api/calculations/${mine}`).set('Cookie', mira)).status).toBe(204);
    expect((await http().get(`/api/calculations/${mine}`).set('Cookie', mira)).status).toBe(404);
    expect((await http().delete(`/api/calculations/${other}`).set('Cookie', admin)).status).toBe(204);
    expect(await db.query('SELECT id FROM calculations WHERE id = ANY($1)', [[mine, other]])).toEqual([]);
    expect((await http().delete(`/api/calculations/${other}`).set('Cookie', admin)).status).toBe(404);
  });
});

describe('backups', () => {
  it('admins download the database as a pg_dump archive', async () => {
    const res = await binary(http().get('/api/backup').set('Cookie', admin));
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toMatch(
      /^attachment; filename="quietglass-\d{8}-\d{6}\.dump"$/,
    );
    // pg_dump's custom format starts with the magic bytes "PGDMP" (PostgreSQL docs, pg_dump -Fc).
    expect((res.body as Buffer).subarray(0, 5).toString('latin1')).toBe('PGDMP');
    // The whole test database, with the stored results of every suite before this one.
  }, 180_000);

  it('a download the client abandons stops pg_dump, leaving no transaction open', async () => {
    // 16 MiB of random bytes (incompressible) so the archive is far larger than the socket buffers.
    const big = await calculationOf('mira.castell@larkspur.example', randomBytes(32).toString('hex'));
    await db.query(
      `UPDATE calculations SET values =
         (SELECT decode(string_agg(md5(random()::text), ''), 'hex') FROM generate_series(1, 1048576))
       WHERE id = $1`,
      [big],
    );
    const dumps = async () =>
      Number(
        (
          (await db.query(
            `SELECT count(*) AS n FROM pg_stat_activity WHERE application_name = 'pg_dump'`,
          )) as { n: string }[]
        )[0]!.n,
      );
    const server = app.getHttpServer().listen(0, '127.0.0.1');
    try {
      await new Promise<void>((resolve) => server.once('listening', () => resolve()));
      const { port } = server.address() as { port: number };
      await new Promise<void>((resolve, reject) => {
        const req = httpGet(
          { host: '127.0.0.1', port, path: '/api/backup', headers: { Cookie: admin } },
          (res) => {
            expect(res.statusCode).toBe(200);
            res.once('data', () => {
              req.destroy();
              resolve();
            });
          },
        );
        req.once('error', (err) => (req.destroyed ? resolve() : reject(err)));
      });
      let left = await dumps();
      for (let i = 0; i < 50 && left > 0; i++) {
        await new Promise((r) => setTimeout(r, 100));
        left = await dumps();
      }
      expect(left).toBe(0);
    } finally {
      await new Promise((r) => server.close(r));
      await db.query('DELETE FROM calculations WHERE id = $1', [big]);
    }
  }, 60_000);

  it('npm run backup, a wiped schema and npm run restore give back every table exactly', async () => {
    const { databaseUrl } = requireE2eEnv();
    const url = new URL(databaseUrl);
    url.pathname = `/${BACKUP_DB}`;
    await db.query(`DROP DATABASE IF EXISTS ${BACKUP_DB} WITH (FORCE)`);
    await db.query(`CREATE DATABASE ${BACKUP_DB}`);
    const target = new DataSource(dataSourceOptions(url.toString()));
    await target.initialize();
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'qg-backup-'));
    try {
      await target.runMigrations({ transaction: 'each' });
      await seedDemo(target, demoSignIns(path.join(dir, 'sign-ins.json')));
      await target.query(
        `INSERT INTO calculations (kind, input_hash, input, status, values, created_by)
         VALUES ('analysis', $1, '{"note": "ü"}', 'completed', $2, (SELECT min(id) FROM users))`,
        ['c'.repeat(64), Buffer.from(new Float64Array([0.5, 0.25, 0.125]).buffer)],
      );
      const tables = (
        (await target.query(
          `SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE' ORDER BY 1`,
        )) as { table_name: string }[]
      ).map((t) => t.table_name);
      expect(tables).toEqual(
        expect.arrayContaining(['calculations', 'users', 'designs', 'schema_migrations', 'demo_seeds']),
      );
      const fingerprint = async () => {
        const out: Record<string, string> = {};
        for (const t of tables) {
          const [row] = (await target.query(
            `SELECT count(*) AS n, md5(coalesce(string_agg(x::text, '|' ORDER BY x::text), '')) AS h FROM "${t}" x`,
          )) as { n: string; h: string }[];
          out[t] = `${row!.n}:${row!.h}`;
        }
        return out;
      };
      const before = await fingerprint();
      expect(Number(before.users!.split(':')[0])).toBeGreaterThan(0);

      const file = path.join(dir, 'shop.dump');
      const env = { ...process.env, DATABASE_URL: url.toString() };
      const backup = spawnSync(process.execPath, ['tools/backup.mjs', file], {
        cwd: ROOT,
        env,
        encoding: 'utf8',
      });
      expect(backup.status, backup.stderr).toBe(0);
      expect(backup.stdout).toContain(`backup written: ${file}`);

      await target.query('DROP SCHEMA public CASCADE');
      await target.query('CREATE SCHEMA public');
      expect(
        await target.query(`SELECT table_name FROM information_schema.tables WHERE table_schema = 'public'`),
      ).toEqual([]);

      // A file that is no archive is refused and changes nothing.
      const junk = path.join(dir, 'junk.dump');
      fs.writeFileSync(junk, 'not a backup');
      const bad = spawnSync(process.execPath, ['tools/backup.mjs', '--restore', junk], {
        cwd: ROOT,
        env,
        encoding: 'utf8',
      });
      expect(bad.status).toBe(1);
      expect(bad.stderr).toContain('pg_restore failed');

      const restore = spawnSync(process.execPath, ['tools/backup.mjs', '--restore', file], {
        cwd: ROOT,
        env,
        encoding: 'utf8',
      });
      expect(restore.status, restore.stderr).toBe(0);
      expect(await fingerprint()).toEqual(before);
      // Sequences come back too: a new row gets a fresh id.
      const [{ max }] = (await target.query('SELECT max(id) AS max FROM customers')) as [{ max: number }];
      const [{ id }] = (await target.query(
        `INSERT INTO customers (name) VALUES ('After restore') RETURNING id`,
      )) as [{ id: number }];
      expect(id).toBeGreaterThan(max);
    } finally {
      await target.destroy();
      fs.rmSync(dir, { recursive: true, force: true });
      await db.query(`DROP DATABASE IF EXISTS ${BACKUP_DB} WITH (FORCE)`);
    }
  }, 120_000);
});
