import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { JOB_WORK_LIMITS, MAX_ACTIVE_JOBS_PER_USER } from '@quietglass/shared/budgets';
import { createTestApp, demoSession, sessionWithOwnPassword } from './support/app.js';
import { customerId, materialIds, twoLayerDesign } from './support/fixtures.js';
import { startWorkerProcess, type WorkerProcess } from './support/worker-process.js';

// This file checks the product's own per-user limit (npm test raises it for the other suites).
process.env.QG_MAX_ACTIVE_JOBS = String(MAX_ACTIVE_JOBS_PER_USER);

let app: NestExpressApplication;
let db: DataSource;
let mira: string;
let admin: string;
/** A user of this file alone, so jobs other suites left queued do not count against the limit. */
let tester = '';
let worker: WorkerProcess | null = null;
let demo: { id: number; specMaskId: number };

const http = () => request(app.getHttpServer());
const calculationCount = async () =>
  Number(((await db.query('SELECT count(*) AS n FROM calculations')) as { n: string }[])[0]!.n);

async function status(id: number, cookie = mira): Promise<{ status: string; progress: number }> {
  return (await http().get(`/api/calculations/${id}`).set('Cookie', cookie)).body as {
    status: string;
    progress: number;
  };
}

beforeAll(async () => {
  app = await createTestApp();
  db = app.get(DataSource);
  mira = await demoSession(app, 'engineer');
  admin = await demoSession(app, 'admin');
  const designs = (await http().get('/api/designs').set('Cookie', mira)).body as {
    id: number;
    name: string;
  }[];
  const found = designs.find((d) => d.name.startsWith('HVS-2210'));
  if (!found) throw new Error('the demo design is missing');
  const detail = (await http().get(`/api/designs/${found.id}`).set('Cookie', mira)).body as {
    id: number;
    specMaskId: number;
  };
  demo = { id: detail.id, specMaskId: detail.specMaskId };
});

afterAll(async () => {
  await worker?.stop();
  await app.close();
});

describe('work budgets at submit', () => {
  it('refuses a Yield forecast and a Fit to mask over their budget, stating the limit, and writes nothing', async () => {
    const m = await materialIds(app, mira);
    const body = twoLayerDesign(m, await customerId(app, mira, 'Halden Vision Systems'), 'Budget 400 layers');
    body.layers = Array.from({ length: 400 }, (_, i) => ({
      materialId: i % 2 === 0 ? m['MgF2'] : m['ZrO2'],
      thicknessNm: 80,
    }));
    const created = await http().post('/api/designs').set('Cookie', mira).send(body);
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const id = created.body.id as number;
    const before = await calculationCount();

    const yieldRes = await http()
      .post(`/api/designs/${id}/versions/1/yield`)
      .set('Cookie', mira)
      .send({ specMaskId: demo.specMaskId, trials: 100_000, thickness: { relativePercent: 1 } });
    expect(yieldRes.status).toBe(400);
    expect(yieldRes.body.message).toMatch(/This Yield forecast needs about [\d.]+e\+\d+ layer-evaluations/);
    expect(yieldRes.body.message).toContain(`at most ${JOB_WORK_LIMITS.yield.toExponential(1)}`);

    const fitRes = await http()
      .post(`/api/designs/${id}/versions/1/fit`)
      .set('Cookie', mira)
      .send({ specMaskId: demo.specMaskId, maxIterations: 1000 });
    expect(fitRes.status).toBe(400);
    expect(fitRes.body.message).toContain(`at most ${JOB_WORK_LIMITS.fit.toExponential(1)}`);

    expect(await calculationCount()).toBe(before);
  });

  it(`lets one user have at most ${MAX_ACTIVE_JOBS_PER_USER} calculations queued or running`, async () => {
    const email = 'queue.limit@larkspur.example';
    const made = await http()
      .post('/api/users')
      .set('Cookie', admin)
      .send({ email, displayName: 'Queue Limit', role: 'engineer', password: 'queue-limit-pass-1' });
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    const cookie = await sessionWithOwnPassword(app, email, 'queue-limit-pass-1');
    tester = cookie;
    const ask = (seed: number) =>
      http()
        .post(`/api/designs/${demo.id}/versions/1/yield`)
        .set('Cookie', cookie)
        .send({ trials: 100, seed, thickness: { relativePercent: 1 } });
    // No worker runs yet: every job stays queued.
    const ids: number[] = [];
    for (let seed = 1; seed <= MAX_ACTIVE_JOBS_PER_USER; seed++) {
      const res = await ask(1000 + seed);
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      ids.push(res.body.id as number);
    }
    const before = await calculationCount();
    const refused = await ask(2000);
    expect(refused.status).toBe(409);
    expect(refused.body.message).toBe(
      `You already have ${MAX_ACTIVE_JOBS_PER_USER} calculations queued or running; at most ${MAX_ACTIVE_JOBS_PER_USER} per user. Wait for one to finish or cancel one.`,
    );
    expect(await calculationCount()).toBe(before);
    // An identical request shares the queued calculation and takes no slot.
    expect((await ask(1001)).status).toBe(200);
    // Cancelling one frees a slot.
    expect((await http().post(`/api/calculations/${ids[0]}/cancel`).set('Cookie', cookie)).status).toBe(201);
    const again = await ask(2000);
    expect(again.status).toBe(201);
    for (const id of [...ids.slice(1), again.body.id as number])
      await http().post(`/api/calculations/${id}/cancel`).set('Cookie', cookie);
  });
});

describe('cancel of the largest Yield forecast', () => {
  it('ends its threads mid-chunk, leaves it cancelled partway, and frees the worker for the next job', async () => {
    worker = await startWorkerProcess();
    const big = await http()
      .post(`/api/designs/${demo.id}/versions/1/yield`)
      .set('Cookie', tester)
      .send({ trials: 100_000, seed: 5, thickness: { relativePercent: 1 } });
    expect(big.status, JSON.stringify(big.body)).toBe(201);
    const id = big.body.id as number;
    await vi.waitFor(async () => expect((await status(id, tester)).status).toBe('running'), {
      timeout: 30_000,
      interval: 100,
    });
    expect((await http().post(`/api/calculations/${id}/cancel`).set('Cookie', tester)).status).toBe(201);
    const w = worker;
    // Another suite's worker may still be consuming the shared queue: look for the report in the
    // output of whichever of ours ran the job.
    const [row] = (await db.query('SELECT processed_by FROM calculations WHERE id = $1', [id])) as {
      processed_by: string;
    }[];
    if (row!.processed_by === w.id) {
      const line = await vi.waitFor(
        () => {
          const m = new RegExp(`calculation ${id} cancelled: its threads stopped (\\d+) ms`).exec(w.output());
          if (!m) throw new Error('the worker has not reported its threads stopped');
          return m;
        },
        { timeout: 10_000, interval: 100 },
      );
      expect(Number(line[1])).toBeGreaterThanOrEqual(0);
    }
    const after = await status(id, tester);
    expect(after.status).toBe('cancelled');
    expect(after.progress).toBeLessThan(1);
    // The worker takes the next job at once instead of finishing 100 000 trials first.
    const small = await http()
      .post(`/api/designs/${demo.id}/versions/1/yield`)
      .set('Cookie', tester)
      .send({ trials: 200, seed: 6, thickness: { relativePercent: 1 } });
    await vi.waitFor(
      async () => expect((await status(small.body.id as number, tester)).status).toBe('completed'),
      {
        timeout: 30_000,
        interval: 200,
      },
    );
  }, 90_000);
});
