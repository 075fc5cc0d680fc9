/*
 * Fault drill against the real supervisor: `node tools/start.mjs` runs the API and the worker on
 * this suite's PostgreSQL (its own database) and Redis (its own db index), on QG_TEST_PORT. Then:
 * kill -9 of the worker mid-job, a 10 s PostgreSQL stop, and SIGINT of the supervisor.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Redis } from 'ioredis';
import { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { startPostgres, stopPostgresAt } from '../../tools/lib/services.mjs';
import { dataSourceOptions } from '../src/database/data-source.js';
import { requireE2eEnv } from './support/env.js';
import { CSRF_HEADER } from '@quietglass/shared';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const DRILL_DB = 'quietglass_drill';

const env = requireE2eEnv();
const port = Number(process.env.QG_TEST_PORT ?? 3100);
const pgDir = process.env.QG_TEST_PG_DIR ?? '';
const pgPort = Number(process.env.QG_TEST_PG_PORT ?? 5434);
const base = `http://127.0.0.1:${port}/api`;
const drillDbUrl = (() => {
  const u = new URL(env.databaseUrl);
  u.pathname = `/${DRILL_DB}`;
  return u.toString();
})();
const drillRedisUrl = `${env.redisUrl.replace(/\/\d*$/, '')}/3`;

let supervisor: ChildProcess;
let output = '';
let dataDir: string;
let cookie = '';
let pgStopped = false;
/** Connection pool on the drill database; it reconnects by itself after PostgreSQL's restart. */
let db: DataSource;

/** Output of the supervised processes since `from` (an offset into the whole output). */
const since = (from: number) => output.slice(from);

async function waitForOutput(pattern: RegExp, from = 0, timeout = 60_000): Promise<RegExpExecArray> {
  let match: RegExpExecArray | null = null;
  await vi.waitFor(
    () => {
      match = pattern.exec(since(from));
      if (!match) throw new Error(`no ${pattern} in the output yet`);
    },
    { timeout, interval: 100 },
  );
  return match as unknown as RegExpExecArray;
}

function api(pathname: string, init: RequestInit = {}): Promise<Response> {
  return fetch(`${base}${pathname}`, {
    ...init,
    headers: { 'content-type': 'application/json', [CSRF_HEADER]: '1', cookie, ...(init.headers ?? {}) },
  });
}

async function calculation(id: number): Promise<{ status: string; progress: number; error: string | null }> {
  return (await api(`/calculations/${id}`)).json() as Promise<{
    status: string;
    progress: number;
    error: string | null;
  }>;
}

/** Submits a Yield forecast of the demo's released recipe; returns the calculation id. */
async function submitYield(seed: number, trials: number): Promise<number> {
  const designs = (await (await api('/designs')).json()) as { id: number; name: string }[];
  const demo = designs.find((d) => d.name.startsWith('HVS-2210'));
  if (!demo) throw new Error('the demo design is missing');
  const res = await api(`/designs/${demo.id}/versions/1/yield`, {
    method: 'POST',
    body: JSON.stringify({ trials, seed, thickness: { relativePercent: 1 } }),
  });
  const body = (await res.json()) as { id: number };
  expect(res.status, JSON.stringify(body)).toBe(201);
  return body.id;
}

const alive = (pid: number) => {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
};

const pidsOf = (what: 'worker' | 'api') =>
  [
    ...output.matchAll(
      what === 'worker' ? /\[worker\] worker (\d+) consuming/g : /\[api\] API (\d+) listening/g,
    ),
  ].map((m) => Number(m[1]));

beforeAll(async () => {
  if (!pgDir) throw new Error('QG_TEST_PG_DIR is not set; run the drill through `npm test`');
  const admin = new DataSource(dataSourceOptions(env.databaseUrl));
  await admin.initialize();
  await admin.query(`DROP DATABASE IF EXISTS ${DRILL_DB} WITH (FORCE)`);
  await admin.query(`CREATE DATABASE ${DRILL_DB}`);
  await admin.destroy();
  const redis = new Redis(drillRedisUrl);
  await redis.flushdb();
  await redis.quit();
  dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'qg-drill-'));
  supervisor = spawn(process.execPath, ['tools/start.mjs', '--no-build'], {
    cwd: ROOT,
    env: {
      ...process.env,
      DATABASE_URL: drillDbUrl,
      REDIS_URL: drillRedisUrl,
      PORT: String(port),
      QG_DATA_DIR: dataDir,
      QG_JOB_LOCK_MS: '3000',
      QG_STALLED_INTERVAL_MS: '1500',
      QG_COMPUTE_THREADS: '1',
      QG_RESTART_DELAY_MS: '500',
      NO_COLOR: '1',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const collect = (chunk: Buffer) => {
    output += chunk.toString();
    if (process.env.QG_WORKER_LOG) process.stderr.write(chunk);
  };
  supervisor.stdout?.on('data', collect);
  supervisor.stderr?.on('data', collect);
  await waitForOutput(/Quietglass is up/, 0, 90_000);
  const signIns = JSON.parse(fs.readFileSync(path.join(dataDir, 'demo-sign-ins.json'), 'utf8')) as {
    role: string;
    email: string;
    password: string;
  }[];
  const mira = signIns.find((s) => s.role === 'engineer');
  const res = await fetch(`${base}/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', [CSRF_HEADER]: '1' },
    body: JSON.stringify({ email: mira?.email, password: mira?.password }),
  });
  cookie = (res.headers.get('set-cookie') ?? '').split(';')[0]!;
  expect(cookie).toMatch(/^qg_session=/);
  db = new DataSource(dataSourceOptions(drillDbUrl));
  await db.initialize();
}, 120_000);

afterAll(async () => {
  if (pgStopped) await startPostgres({ dir: pgDir, port: pgPort, database: DRILL_DB });
  await db?.destroy().catch(() => undefined);
  if (supervisor && supervisor.exitCode === null) {
    supervisor.kill('SIGKILL');
  }
  if (dataDir) fs.rmSync(dataDir, { recursive: true, force: true });
}, 60_000);

describe('fault drill under the npm start supervisor', () => {
  it('kill -9 of the worker mid-job: the API stays up, the worker is restarted, the job completes once', async () => {
    const id = await submitYield(11, 20_000);
    await vi.waitFor(
      async () => {
        const c = await calculation(id);
        expect(c.status).toBe('running');
        expect(c.progress).toBeGreaterThan(0);
      },
      { timeout: 60_000, interval: 100 },
    );
    const [killed] = pidsOf('worker').slice(-1);
    // The worker's main thread and the threads it started (the running job's compute threads) run
    // at a lower CPU priority than the API, so the job cannot starve light requests of the CPU.
    // (Linux /proc/<pid>/task/<tid>/stat, field 19 is the niceness; Node's own helper threads start
    // before the worker lowers its priority and keep theirs.)
    const niceness = (pid: number, tid: number | string) =>
      Number(fs.readFileSync(`/proc/${pid}/task/${tid}/stat`, 'utf8').split(') ')[1]!.split(' ')[16]);
    const apiPid = pidsOf('api').at(-1)!;
    expect(niceness(killed!, killed!)).toBe(Math.max(10, niceness(apiPid, apiPid)));
    const lowered = fs.readdirSync(`/proc/${killed!}/task`).filter((tid) => niceness(killed!, tid) >= 10);
    expect(lowered.length).toBeGreaterThanOrEqual(2);
    const mark = output.length;
    process.kill(killed!, 'SIGKILL');
    // The API answers while the worker is down.
    expect((await api(`/calculations/${id}`)).status).toBe(200);
    const restarted = await waitForOutput(/worker restarted \(pid (\d+)\)/, mark);
    const newPid = Number(restarted[1]);
    expect(newPid).not.toBe(killed);
    await vi.waitFor(async () => expect((await calculation(id)).status).toBe('completed'), {
      timeout: 120_000,
      interval: 500,
    });
    const [row] = (await db.query(
      'SELECT completed_count, attempts, processed_by FROM calculations WHERE id = $1',
      [id],
    )) as { completed_count: number; attempts: number; processed_by: string }[];
    expect(row!.completed_count).toBe(1);
    expect(row!.attempts).toBeGreaterThanOrEqual(2);
    expect(row!.processed_by).toMatch(new RegExp(`:${newPid}$`));
    expect(since(mark)).not.toMatch(/api stopped unexpectedly/);
    expect(alive(killed!)).toBe(false);
  }, 180_000);

  it('PostgreSQL stopped for 10 s: plain 503s, then recovery without any restart; a running job completes once', async () => {
    const id = await submitYield(12, 20_000);
    await vi.waitFor(async () => expect((await calculation(id)).status).toBe('running'), {
      timeout: 60_000,
      interval: 100,
    });
    const mark = output.length;
    stopPostgresAt(pgDir);
    pgStopped = true;
    const stoppedAt = Date.now();
    const during = await api('/calculations');
    expect(during.status).toBe(503);
    const body = (await during.json()) as { message: string };
    expect(body.message).toMatch(/^The database is not reachable right now/);
    await vi.waitFor(
      async () => {
        const health = await fetch(`${base}/health`);
        expect(health.status).toBe(503);
        expect(((await health.json()) as { database: { ok: boolean } }).database.ok).toBe(false);
      },
      { timeout: 8000, interval: 250 },
    );
    await new Promise((r) => setTimeout(r, Math.max(0, 10_000 - (Date.now() - stoppedAt))));
    await startPostgres({ dir: pgDir, port: pgPort, database: DRILL_DB });
    pgStopped = false;
    await vi.waitFor(async () => expect((await api('/calculations')).status).toBe(200), {
      timeout: 30_000,
      interval: 250,
    });
    await vi.waitFor(async () => expect((await fetch(`${base}/health`)).status).toBe(200), {
      timeout: 30_000,
      interval: 250,
    });
    await vi.waitFor(async () => expect((await calculation(id)).status).toBe('completed'), {
      timeout: 120_000,
      interval: 500,
    });
    const [row] = (await db.query('SELECT completed_count FROM calculations WHERE id = $1', [id])) as {
      completed_count: number;
    }[];
    expect(row!.completed_count).toBe(1);
    // Nothing crashed: the supervisor restarted nothing.
    expect(since(mark)).not.toMatch(/stopped unexpectedly/);
  }, 240_000);

  it('SIGINT stops the API and the worker and then the supervisor: no process is left behind', async () => {
    const pids = [...pidsOf('worker').slice(-1), ...pidsOf('api').slice(-1)];
    expect(pids.length).toBe(2);
    expect(pids.every(alive)).toBe(true);
    const exited = new Promise<number | null>((resolve) => supervisor.once('exit', (code) => resolve(code)));
    supervisor.kill('SIGINT');
    expect(await exited).toBe(0);
    expect(pids.filter(alive)).toEqual([]);
  }, 60_000);
});
