import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { designStackDescription, engineBackSurface } from '@quietglass/shared/designs';
import { calculateSpectrum } from '@quietglass/shared/optics/batch';
import { evaluateMask } from '@quietglass/shared/optics/mask';
import { parseStack } from '@quietglass/shared/optics/stack';
import { approvedDesign } from './support/approved.js';
import { createTestApp, demoSession } from './support/app.js';
import { customerId, materialIds } from './support/fixtures.js';
import { startWorkerProcess, type WorkerProcess } from './support/worker-process.js';
import { DEFAULT_TARGET_MARGIN_PERCENT } from '@quietglass/shared/optimise/fit';
import { RESULT_FORECAST } from '@quietglass/shared/optimise/result-forecast';

let app: NestExpressApplication;
let mira: string;
let tomas: string;
let operator: string;
let m: Record<string, number>;
let customer: number;
let broadbandMaskId: number;
let worker: WorkerProcess;

const http = () => request(app.getHttpServer());

beforeAll(async () => {
  app = await createTestApp();
  mira = await demoSession(app, 'engineer', 0);
  tomas = await demoSession(app, 'engineer', 1);
  operator = await demoSession(app, 'operator');
  m = await materialIds(app, mira);
  customer = await customerId(app, mira, 'Brightwater Instruments');
  // The usual visible broadband AR requirement at normal incidence (common practice, no source).
  const mask = await http()
    .post('/api/spec-masks')
    .set('Cookie', mira)
    .send({
      name: 'BWI broadband',
      customerId: customer,
      revision: 'A',
      bands: [{ from_nm: 420, to_nm: 680, quantity: 'R', max_percent: 0.5, step_nm: 5 }],
    });
  broadbandMaskId = mask.body.id;
  worker = await startWorkerProcess({ QG_COMPUTE_THREADS: '2' });
});
afterAll(async () => {
  await worker?.stop('SIGKILL');
  await app.close();
});

const design = (name: string, layers: [string, number][]) => ({
  name,
  customerId: customer,
  specMaskId: broadbandMaskId,
  incidentMaterialId: m['Air'],
  substrateMaterialId: m['N-BK7'],
  substrateThicknessMm: 2,
  backSurface: 'front-only',
  referenceWavelengthNm: 550,
  layers: layers.map(([material, thicknessNm]) => ({ materialId: m[material], thicknessNm })),
});

async function create(body: ReturnType<typeof design>): Promise<number> {
  const res = await http().post('/api/designs').set('Cookie', mira).send(body);
  expect(res.status).toBe(201);
  return res.body.id;
}

async function finished(id: number, timeoutMs = 90_000) {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const c = (await http().get(`/api/calculations/${id}`).set('Cookie', mira)).body;
    if (['completed', 'failed', 'cancelled'].includes(c.status)) return c;
    if (Date.now() > until) throw new Error(`calculation ${id} still ${c.status}`);
    await new Promise((r) => setTimeout(r, 150));
  }
}

async function stackOf(id: number, n: number) {
  const v = (await http().get(`/api/designs/${id}/versions/${n}`).set('Cookie', mira)).body;
  const mats = (await http().get('/api/materials').set('Cookie', mira)).body as {
    id: number;
    name: string;
    model: never;
  }[];
  return {
    version: v,
    stack: parseStack(
      designStackDescription(v, new Map(mats.map((x) => [x.id, { name: x.name, model: x.model }]))),
    ),
  };
}

describe('Fit to mask', () => {
  it('lowers the merit, streams it per iteration, is reused for an identical request, and becomes a new draft', async () => {
    const id = await create(
      design('Fit me', [
        ['MgF2', 90],
        ['ZrO2', 110],
        ['Al2O3', 70],
        ['MgF2', 30],
      ]),
    );
    const sub = await http()
      .post(`/api/designs/${id}/versions/1/fit`)
      .set('Cookie', mira)
      .send({ maxIterations: 60 });
    expect(sub.status, JSON.stringify(sub.body)).toBe(201);
    const done = await finished(sub.body.id);
    expect(done.status, done.error).toBe('completed');
    expect(done.summary.merit.after).toBeLessThan(done.summary.merit.before);
    expect(done.live.history.length).toBeGreaterThan(1);
    expect(done.live.history.at(-1).merit).toBeCloseTo(done.summary.merit.after, 6);
    // No target margin asked: the shop's default (the engine's until an admin sets one), reported
    // with the result, and a yield forecast of the fitted stack beside it.
    expect(done.summary.targetMarginPercent).toBe(DEFAULT_TARGET_MARGIN_PERCENT);
    expect(done.summary.forecast).toMatchObject({ trials: RESULT_FORECAST.trials, relativePercent: 1 });
    expect(done.summary.forecast.yieldFraction).toBeGreaterThanOrEqual(0);
    expect(done.summary.forecast.yieldFraction).toBeLessThanOrEqual(1);
    for (const d of done.summary.thicknessesNm) expect(d).toBeGreaterThanOrEqual(10 - 1e-9);
    const again = await http()
      .post(`/api/designs/${id}/versions/1/fit`)
      .set('Cookie', mira)
      .send({ maxIterations: 60 });
    expect(again.status).toBe(200);
    expect(again.body.id).toBe(sub.body.id);

    const v2 = await http().post(`/api/calculations/${sub.body.id}/accept`).set('Cookie', mira).send({});
    expect(v2.status, JSON.stringify(v2.body)).toBe(201);
    expect(v2.body).toMatchObject({ number: 2, status: 'draft' });
    v2.body.layers.forEach((l: { thicknessNm: number }, i: number) =>
      expect(l.thicknessNm).toBeCloseTo(done.summary.thicknessesNm[i], 9),
    );
  });

  it('refuses a version whose layers are all locked, and bounds that cross', async () => {
    const body = design('Locked', [['MgF2', 99]]);
    body.layers[0] = { ...body.layers[0], locked: true } as (typeof body.layers)[0];
    const id = await create(body);
    const locked = await http().post(`/api/designs/${id}/versions/1/fit`).set('Cookie', mira).send({});
    expect(locked.status).toBe(400);
    expect(locked.body.details).toEqual(['every layer is locked: unlock at least one layer to fit']);
    const crossed = await http()
      .post(`/api/designs/${id}/versions/1/fit`)
      .set('Cookie', mira)
      .send({ minThicknessNm: 50, maxThicknessNm: 20 });
    expect(crossed.status).toBe(400);
    expect(crossed.body.details).toEqual([
      'maxThicknessNm: Max thickness must not be below min thickness (50 nm)',
    ]);
    const margin = await http()
      .post(`/api/designs/${id}/versions/1/fit`)
      .set('Cookie', mira)
      .send({ targetMarginPercent: 9 });
    expect(margin.status).toBe(400);
    expect(margin.body.details).toEqual(['targetMarginPercent: A number from 0 to 5 percentage points']);
    expect(
      (await http().post(`/api/designs/${id}/versions/1/fit`).set('Cookie', operator).send({})).status,
    ).toBe(403);
  });
});

describe('Grow layers', () => {
  it('from a single MgF2 quarter wave on N-BK7 reaches R ≤ 0.5 % over 420–680 nm with at most 10 layers', async () => {
    const id = await create(design('Grow me', [['MgF2', 99.6]]));
    const sub = await http()
      .post(`/api/designs/${id}/versions/1/grow`)
      .set('Cookie', mira)
      .send({ allowedMaterialIds: [m['MgF2'], m['SiO2'], m['TiO2']], maxLayers: 10 });
    expect(sub.status, JSON.stringify(sub.body)).toBe(201);
    const done = await finished(sub.body.id, 120_000);
    expect(done.status, done.error).toBe('completed');
    expect(done.summary.final.pass).toBe(true);
    expect(done.summary.final.layerCount).toBeLessThanOrEqual(10);
    expect(done.summary.steps.length).toBeGreaterThan(1);
    const v2 = await http().post(`/api/calculations/${sub.body.id}/accept`).set('Cookie', mira).send({});
    expect(v2.status).toBe(201);
    // Independent check: the engine's own mask evaluation of the accepted version.
    const { stack } = await stackOf(id, v2.body.number);
    const mask = (await http().get(`/api/spec-masks/${broadbandMaskId}`).set('Cookie', mira)).body;
    expect(evaluateMask({ bands: mask.bands }, stack).pass).toBe(true);
  });

  it('needs at least one allowed material that exists', async () => {
    const id = await create(design('No materials', [['MgF2', 99.6]]));
    const none = await http()
      .post(`/api/designs/${id}/versions/1/grow`)
      .set('Cookie', mira)
      .send({ allowedMaterialIds: [] });
    expect(none.body.details).toEqual(['allowedMaterialIds: Choose at least one material']);
    const ghost = await http()
      .post(`/api/designs/${id}/versions/1/grow`)
      .set('Cookie', mira)
      .send({ allowedMaterialIds: [987654] });
    expect(ghost.body.details).toEqual(['allowedMaterialIds: material 987654 does not exist']);
    const stray = await http()
      .post(`/api/designs/${id}/versions/1/grow`)
      .set('Cookie', mira)
      .send({ allowedMaterialIds: [m['MgF2']], outermostOnlyMaterialIds: [m['ZrO2']] });
    expect(stray.status).toBe(400);
    expect(stray.body.details).toEqual([
      'outermostOnlyMaterialIds.0: This material is not among the allowed materials',
    ]);
  });

  it('grows on the mask merit when asked, on the smooth one by default, and refuses a merit it does not know', async () => {
    const id = await create(design('Grow smooth', [['MgF2', 99.6]]));
    const sub = await http()
      .post(`/api/designs/${id}/versions/1/grow`)
      .set('Cookie', mira)
      .send({
        allowedMaterialIds: [m['SiO2'], m['TiO2']],
        maxSteps: 2,
        growthMerit: 'mask',
        needlesPerStep: 2,
      });
    expect(sub.status, JSON.stringify(sub.body)).toBe(201);
    expect(sub.body.request).toMatchObject({ growthMerit: 'mask', needlesPerStep: 2 });
    const byDefault = await http()
      .post(`/api/designs/${id}/versions/1/grow`)
      .set('Cookie', mira)
      .send({ allowedMaterialIds: [m['SiO2'], m['TiO2']], maxSteps: 2 });
    expect(byDefault.body.request).toMatchObject({ growthMerit: 'smooth', needlesPerStep: 3 });
    const unknown = await http()
      .post(`/api/designs/${id}/versions/1/grow`)
      .set('Cookie', mira)
      .send({ allowedMaterialIds: [m['SiO2']], growthMerit: 'flat' });
    expect(unknown.status).toBe(400);
    expect(unknown.body.details).toEqual(['growthMerit: Grow on must be smooth or mask']);
    expect((await finished(sub.body.id, 120_000)).status).toBe('completed');
  });
});

describe('Yield forecast', () => {
  it('gives 100 % with zero error when the nominal passes, less with errors, and can be cancelled', async () => {
    // A 4-layer broadband AR that passes the mask nominally (fitted once here).
    const id = await create(
      design('Yield base', [
        ['MgF2', 94],
        ['ZrO2', 130],
        ['Al2O3', 80],
        ['MgF2', 20],
      ]),
    );
    const fit = await http()
      .post(`/api/designs/${id}/versions/1/fit`)
      .set('Cookie', mira)
      .send({ maxIterations: 80 });
    const fitted = await finished(fit.body.id);
    const v2 = (await http().post(`/api/calculations/${fit.body.id}/accept`).set('Cookie', mira).send({}))
      .body.number;
    const ask = (body: object) =>
      http().post(`/api/designs/${id}/versions/${v2}/yield`).set('Cookie', mira).send(body);
    const zero = await finished((await ask({ trials: 200, thickness: { relativePercent: 0 } })).body.id);
    expect(zero.status, zero.error).toBe('completed');
    expect(zero.summary.yieldFraction).toBe(fitted.summary.pass ? 1 : 0);
    const noisy = await finished(
      (await ask({ trials: 400, seed: 7, thickness: { relativePercent: 3 } })).body.id,
    );
    expect(noisy.summary.yieldFraction).toBeLessThanOrEqual(zero.summary.yieldFraction);
    expect(noisy.summary.sensitivity.length).toBe(4);

    const big = await ask({ trials: 100000, seed: 3, thickness: { relativePercent: 1 } });
    const until = Date.now() + 30_000;
    while (
      (await http().get(`/api/calculations/${big.body.id}`).set('Cookie', mira)).body.status !== 'running'
    ) {
      if (Date.now() > until) throw new Error('never started');
      await new Promise((r) => setTimeout(r, 100));
    }
    expect((await http().post(`/api/calculations/${big.body.id}/cancel`).set('Cookie', mira)).status).toBe(
      201,
    );
    const stopped = await finished(big.body.id);
    expect(stopped.status).toBe('cancelled');
    expect(stopped.summary).toBeNull();
  }, 180_000);

  it('checks the number of trials', async () => {
    const id = await create(design('Trials', [['MgF2', 99.6]]));
    const res = await http()
      .post(`/api/designs/${id}/versions/1/yield`)
      .set('Cookie', mira)
      .send({ trials: 0, thickness: {} });
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual(['trials: Trials must be a whole number from 1 to 100000']);
  });
});

describe('Run diagnosis', () => {
  it('recovers a layer deposited 8 % thick from a noisy measured spectrum, within 1 %', async () => {
    const layers: [string, number][] = [
      ['MgF2', 92],
      ['ZrO2', 125],
      ['Al2O3', 78],
      ['MgF2', 24],
    ];
    const id = await approvedDesign(app, mira, tomas, design('Diagnose me', layers), true);
    const chamberId = (await http().get('/api/chambers').set('Cookie', operator)).body[0].id;
    const run = await http()
      .post('/api/runs')
      .set('Cookie', operator)
      .send({ designId: id, versionNumber: 1, chamberId, lotNumber: 'D-8', runDate: '2026-12-01' });
    // The "measured" part: layer 2 (ZrO2) 8 % thick, plus ±0.005 % noise (a fixed pseudo-random sequence).
    const { version, stack } = await stackOf(id, 1);
    const built = {
      ...stack,
      layers: stack.layers.map((l, i) => (i === 1 ? { ...l, thicknessNm: l.thicknessNm * 1.08 } : l)),
    };
    const wavelengthsNm = Array.from({ length: 301 }, (_, i) => 400 + i);
    const R = calculateSpectrum(
      built,
      { wavelengthsNm, anglesDeg: [8], polarisations: ['avg'] },
      { back: engineBackSurface(version.backSurface) },
    ).R;
    let seed = 12345;
    const noise = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31 - 0.5) * 0.01;
    const csv = [
      'wavelength_nm,R_percent',
      ...wavelengthsNm.map((wl, i) => `${wl},${(R[i]! * 100 + noise()).toFixed(5)}`),
    ].join('\n');
    const up = await http()
      .post(`/api/runs/${run.body.id}/spectra`)
      .set('Cookie', operator)
      .send({ filename: 'lot-D-8.csv', csv, angleDeg: 8, sample: 'witness' });
    expect(up.status).toBe(201);
    const sub = await http()
      .post(`/api/runs/${run.body.id}/spectra/${up.body.id}/diagnosis`)
      .set('Cookie', mira)
      .send({});
    expect(sub.status, JSON.stringify(sub.body)).toBe(201);
    const done = await finished(sub.body.id);
    expect(done.status, done.error).toBe('completed');
    const top = done.summary.layers[0];
    expect(top.layer).toBe(2);
    expect(top.deviationPercent).toBeGreaterThan(7);
    expect(top.deviationPercent).toBeLessThan(9);
    for (const other of done.summary.layers.slice(1))
      expect(Math.abs(other.deviationPercent)).toBeLessThan(1);
  });
});

describe('optimisation requests', () => {
  it('refuses a bad factor range or step before looking up the run or the result', async () => {
    const range = await http()
      .post('/api/runs/987654/spectra/1/diagnosis')
      .set('Cookie', mira)
      .send({ factorRange: [1.2, 1.1] });
    expect(range.status).toBe(400);
    expect(range.body.details).toEqual(['factorRange.1: The highest factor must exceed the lowest factor']);
    const step = await http().post('/api/calculations/987654/accept').set('Cookie', mira).send({ step: -1 });
    expect(step.status).toBe(400);
    expect(step.body.details).toEqual(["step: step must be the number of one of the result's steps"]);
  });

  it('publishes the shared request schemas, with their defaults and limits, in the OpenAPI description', async () => {
    type Prop = { default?: unknown; maximum?: number; exclusiveMinimum?: number; maxItems?: number };
    type Body = {
      properties: Record<string, Prop & { properties?: Record<string, Prop> }>;
      required?: string[];
    };
    const doc = (await http().get('/api/docs-json')).body as {
      paths: Record<
        string,
        Record<string, { requestBody: { content: { 'application/json': { schema: Body } } } }>
      >;
    };
    const bodyOf = (p: string) => doc.paths[p]!['post']!.requestBody.content['application/json'].schema;
    const fit = bodyOf('/api/designs/{id}/versions/{number}/fit');
    expect(fit.required ?? []).toEqual([]);
    expect(fit.properties.maxIterations).toMatchObject({ default: 100, maximum: 1000 });
    expect(fit.properties.targetMarginPercent!.maximum).toBe(5);
    const grow = bodyOf('/api/designs/{id}/versions/{number}/grow');
    expect(grow.required).toEqual(['allowedMaterialIds']);
    expect(grow.properties.allowedMaterialIds!.maxItems).toBe(8);
    expect(grow.properties.growthMerit).toMatchObject({ enum: ['smooth', 'mask'], default: 'smooth' });
    expect(grow.properties.needlesPerStep).toMatchObject({ default: 3, maximum: 10 });
    const forecast = bodyOf('/api/designs/{id}/versions/{number}/yield');
    expect(forecast.required).toEqual(['thickness']);
    expect(forecast.properties.trials).toMatchObject({ default: 2000, maximum: 100000 });
    expect(forecast.properties.thickness!.properties!.relativePercent!.maximum).toBe(50);
    const diagnosis = bodyOf('/api/runs/{id}/spectra/{sid}/diagnosis');
    expect(diagnosis.properties.factorRange!.default).toEqual([0.7, 1.3]);
    expect(bodyOf('/api/calculations/{id}/accept').properties).toHaveProperty('step');
  });
});
