import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { designStackDescription, engineBackSurface } from '@quietglass/shared/designs';
import { calculateSpectrum } from '@quietglass/shared/optics/batch';
import { parseStack } from '@quietglass/shared/optics/stack';
import { createTestApp, demoSession } from './support/app.js';
import { customerId, materialIds, twoLayerDesign } from './support/fixtures.js';
import { startWorkerProcess, type WorkerProcess } from './support/worker-process.js';

let app: NestExpressApplication;
let engineer: string;
let m: Record<string, number>;
let customer: number;
const workers: WorkerProcess[] = [];

beforeAll(async () => {
  app = await createTestApp();
  engineer = await demoSession(app, 'engineer');
  m = await materialIds(app, engineer);
  customer = await customerId(app, engineer, 'Brightwater Instruments');
});
afterAll(async () => {
  await Promise.all(workers.map((w) => w.stop('SIGKILL')));
  await app.close();
});

const http = () => request(app.getHttpServer());
const db = () => app.get(DataSource);
const small = {
  fromNm: 400,
  toNm: 700,
  wavelengthCount: 31,
  angleFromDeg: 0,
  angleToDeg: 60,
  angleCount: 4,
  fieldWavelengthNm: 550,
};

async function design(layers: { material: string; thicknessNm: number }[], name: string): Promise<number> {
  const body = {
    ...twoLayerDesign(m, customer, name),
    layers: layers.map((l) => ({ materialId: m[l.material], thicknessNm: l.thicknessNm })),
  };
  const res = await http().post('/api/designs').set('Cookie', engineer).send(body);
  expect(res.status).toBe(201);
  return res.body.id;
}

/** A 40-layer stack: slow enough on one thread to catch the job mid-run. */
const slowLayers = Array.from({ length: 40 }, (_, j) => ({
  material: j % 2 ? 'SiO2' : 'TiO2',
  thicknessNm: 50 + 3 * j,
}));
const slowGrid = {
  fromNm: 400,
  toNm: 1000,
  wavelengthCount: 4001,
  angleFromDeg: 0,
  angleToDeg: 80,
  angleCount: 181,
};

async function waitFor<T>(
  what: string,
  fn: () => Promise<T | undefined | false>,
  timeoutMs = 60_000,
): Promise<T> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    const v = await fn();
    if (v) return v;
    if (process.env.QG_WORKER_LOG) console.log(what, JSON.stringify(v));
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`timed out waiting for ${what}`);
}

const calc = async (id: number) => (await http().get(`/api/calculations/${id}`).set('Cookie', engineer)).body;
const statusIs = (id: number, status: string) => async () =>
  (await calc(id)).status === status ? calc(id) : undefined;

describe('compute queue: full analysis', () => {
  it('queues a job; an identical request returns the same calculation; a worker completes it with the engine’s numbers', async () => {
    const id = await design(
      [
        { material: 'MgF2', thicknessNm: 99.6 },
        { material: 'ZrO2', thicknessNm: 67.1 },
      ],
      'Queue AR',
    );
    const first = await http()
      .post(`/api/designs/${id}/versions/1/analysis`)
      .set('Cookie', engineer)
      .send(small);
    expect(first.status).toBe(201);
    expect(first.body).toMatchObject({ status: 'queued', reused: false, progress: 0 });
    const again = await http()
      .post(`/api/designs/${id}/versions/1/analysis`)
      .set('Cookie', engineer)
      .send(small);
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ id: first.body.id, reused: true });

    workers.push(await startWorkerProcess());
    const done = await waitFor('completion', statusIs(first.body.id, 'completed'));
    expect(done.progress).toBe(1);
    expect(done.computeMs).toBeGreaterThan(0);
    expect(done.processedBy).toBe(workers[0]!.id);
    expect(done.summary.wavelengthsNm).toHaveLength(31);
    expect(done.summary.anglesDeg).toEqual([0, 20, 40, 60]);
    expect(done.summary.colour).toHaveLength(4);
    expect(done.summary.field.depthsNm).toHaveLength(400);

    // The stored map equals the engine computing the same stack directly.
    const version = (await http().get(`/api/designs/${id}/versions/1`).set('Cookie', engineer)).body;
    const materials = (await http().get('/api/materials').set('Cookie', engineer)).body as {
      id: number;
      name: string;
      model: never;
    }[];
    const stack = parseStack(
      designStackDescription(
        version,
        new Map(materials.map((x) => [x.id, { name: x.name, model: x.model }])),
      ),
    );
    const direct = calculateSpectrum(
      stack,
      { wavelengthsNm: done.summary.wavelengthsNm, anglesDeg: [40], polarisations: ['p'] },
      { back: engineBackSurface(version.backSurface) },
    );
    const stored = await http()
      .get(`/api/calculations/${first.body.id}/result?quantity=R&polarisation=p`)
      .set('Cookie', engineer);
    expect(stored.status).toBe(200);
    stored.body.values[2].forEach((v: number, i: number) => expect(v).toBeCloseTo(direct.R[i]!, 12));
    // s and p coincide at normal incidence (Hecht, ch. 4).
    const s0 = (
      await http()
        .get(`/api/calculations/${first.body.id}/result?quantity=R&polarisation=s`)
        .set('Cookie', engineer)
    ).body.values[0];
    const p0 = (
      await http()
        .get(`/api/calculations/${first.body.id}/result?quantity=R&polarisation=p`)
        .set('Cookie', engineer)
    ).body.values[0];
    s0.forEach((v: number, i: number) => expect(v).toBeCloseTo(p0[i], 12));

    const csv = await http().get(`/api/calculations/${first.body.id}/result.csv`).set('Cookie', engineer);
    const lines = csv.text.trim().split('\n');
    expect(lines[0]).toBe('wavelength_nm,angle_deg,pol,R_percent,T_percent,A_percent');
    expect(lines).toHaveLength(1 + 3 * 4 * 31);
    // Percent with 4 decimals, the same values the result route gives as fractions.
    const [, , , r] = lines[1]!.split(',');
    expect(r).toMatch(/^\d+\.\d{4}$/);
    expect(Number(r)).toBeCloseTo(100 * s0[0], 4);

    const later = await http()
      .post(`/api/designs/${id}/versions/1/analysis`)
      .set('Cookie', engineer)
      .send(small);
    expect(later.status).toBe(200);
    expect(later.body).toMatchObject({ id: first.body.id, status: 'completed', reused: true });

    // Reopening the version finds the result again, with who ran it; other kinds have none yet.
    const latest = await http()
      .get(`/api/designs/${id}/versions/1/calculations/latest`)
      .set('Cookie', engineer);
    expect(latest.status).toBe(200);
    expect(latest.body.analysis).toMatchObject({
      id: first.body.id,
      status: 'completed',
      createdBy: 'Mira Castell',
    });
    expect(latest.body.analysis.finishedAt).toEqual(done.finishedAt);
    expect(latest.body).toMatchObject({ fit: null, grow: null, yield: null });
    const missing = await http()
      .get(`/api/designs/${id}/versions/9/calculations/latest`)
      .set('Cookie', engineer);
    expect(missing.status).toBe(404);
  });

  it('rejects a bad request with the field named, and a grid beyond a material’s range', async () => {
    const id = await design([{ material: 'TiO2', thicknessNm: 60 }], 'Bad grid');
    const bad = await http()
      .post(`/api/designs/${id}/versions/1/analysis`)
      .set('Cookie', engineer)
      .send({ ...small, toNm: 300 });
    expect(bad.status).toBe(400);
    expect(bad.body.message).toMatch(/toNm: must exceed fromNm/);
    const tooMany = await http()
      .post(`/api/designs/${id}/versions/1/analysis`)
      .set('Cookie', engineer)
      .send({ ...small, angleCount: 500 });
    expect(tooMany.body.message).toMatch(/angleCount: must be a whole number from 1 to 181/);
    // The demo TiO2 (the published film table of Sarkar et al.) covers 300–1690 nm, and N-BK7's
    // Sellmeier coefficients hold for 300–2500 nm (SCHOTT data sheet): both are named.
    const outside = await http()
      .post(`/api/designs/${id}/versions/1/analysis`)
      .set('Cookie', engineer)
      .send({ ...small, fromNm: 250 });
    expect(outside.status).toBe(400);
    expect(outside.body.details).toEqual([
      'N-BK7 is valid over 300–2500 nm; the analysis asks for 250–700 nm',
      'TiO2 is valid over 300–1690 nm; the analysis asks for 250–700 nm',
    ]);
  });

  it('cancels a running job: it stops between slices and never stores a result', async () => {
    const id = await design(slowLayers, 'Slow to cancel');
    const sub = await http()
      .post(`/api/designs/${id}/versions/1/analysis`)
      .set('Cookie', engineer)
      .send(slowGrid);
    await waitFor('progress', async () => {
      const c = await calc(sub.body.id);
      return c.status === 'running' && c.progress > 0;
    });
    const cancelled = await http().post(`/api/calculations/${sub.body.id}/cancel`).set('Cookie', engineer);
    expect(cancelled.status).toBe(201);
    expect(cancelled.body.status).toBe('cancelled');
    // Once the worker has let go of the job (nothing of the queue is active any more), nothing can
    // write to it later: check what it left.
    const queue = app.get<{ getActiveCount: () => Promise<number> }>('BullQueue_compute');
    await waitFor(
      'the worker to let go of the cancelled job',
      async () => (await queue.getActiveCount()) === 0,
    );
    const [row] = await db().query(
      'SELECT status, completed_count, values IS NULL AS empty FROM calculations WHERE id = $1',
      [sub.body.id],
    );
    expect(row).toEqual({ status: 'cancelled', completed_count: 0, empty: true });
    const again = await http().post(`/api/calculations/${sub.body.id}/cancel`).set('Cookie', engineer);
    expect(again.status).toBe(409);
  });

  it('records a failed job with its error', async () => {
    const user = (await http().get('/api/auth/me').set('Cookie', engineer)).body.user;
    const [row] = await db().query(
      `INSERT INTO calculations (kind, input_hash, input, status, created_by) VALUES ('analysis', $1, $2, 'queued', $3) RETURNING id`,
      [
        'f'.repeat(64),
        JSON.stringify({ stack: { substrate: { n: -2 }, layers: [] }, back: 'none', request: small }),
        user.id,
      ],
    );
    const queue = app.get<{ add: (n: string, d: object, o: object) => Promise<unknown> }>(
      'BullQueue_compute',
    );
    await queue.add('analysis', { calculationId: row.id }, { jobId: `calc-${row.id}`, attempts: 1 });
    const failed = await waitFor('failure', statusIs(row.id, 'failed'));
    expect(failed.error).toMatch(/substrate/);
  });

  it('a worker killed mid-job leaves the job to another worker, which completes it exactly once', async () => {
    await Promise.all(workers.splice(0).map((w) => w.stop()));
    const doomed = await startWorkerProcess();
    workers.push(doomed);
    const id = await design(slowLayers.slice(0, 30), 'Survives a crash');
    const sub = await http()
      .post(`/api/designs/${id}/versions/1/analysis`)
      .set('Cookie', engineer)
      .send(slowGrid);
    await waitFor('progress', async () => {
      const c = await calc(sub.body.id);
      return c.status === 'running' && c.progress > 0;
    });
    await doomed.stop('SIGKILL');
    const rescuer = await startWorkerProcess();
    workers.push(rescuer);
    const done = await waitFor('completion after the crash', statusIs(sub.body.id, 'completed'), 120_000);
    expect(done.processedBy).toBe(rescuer.id);
    expect(done.attempts).toBe(2);
    const [row] = await db().query('SELECT completed_count FROM calculations WHERE id = $1', [sub.body.id]);
    expect(row.completed_count).toBe(1);
  });

  it('two workers share the queue and process every job exactly once', async () => {
    await Promise.all(workers.splice(0).map((w) => w.stop()));
    workers.push(await startWorkerProcess(), await startWorkerProcess());
    const id = await design(slowLayers.slice(0, 20), 'Shared queue');
    const ids: number[] = [];
    for (let i = 0; i < 8; i++) {
      const res = await http()
        .post(`/api/designs/${id}/versions/1/analysis`)
        .set('Cookie', engineer)
        .send({ ...slowGrid, wavelengthCount: 600 + i, angleCount: 91 });
      expect(res.status).toBe(201);
      ids.push(res.body.id);
    }
    await waitFor(
      'all eight',
      async () => {
        const rows = await db().query(
          `SELECT count(*)::int AS n FROM calculations WHERE id = ANY($1) AND status = 'completed'`,
          [ids],
        );
        return rows[0].n === 8;
      },
      120_000,
    );
    const rows = (await db().query(
      'SELECT completed_count, attempts, processed_by FROM calculations WHERE id = ANY($1)',
      [ids],
    )) as {
      completed_count: number;
      attempts: number;
      processed_by: string;
    }[];
    expect(rows.every((r) => r.completed_count === 1 && r.attempts === 1)).toBe(true);
    expect(new Set(rows.map((r) => r.processed_by))).toEqual(new Set(workers.map((w) => w.id)));
  });
});
