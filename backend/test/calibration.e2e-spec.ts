/*
 * Chamber calibration end to end: diagnosed runs (real worker, real Run diagnosis) of a chamber
 * whose ZrO2 layers come out 3 % thick, the suggestion that follows, rejection and acceptance by
 * engineers with comments (audited), and run sheets before and after. Invented chamber, lots and
 * comments; demo materials.
 */
import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { designStackDescription, engineBackSurface } from '@quietglass/shared/designs';
import { calculateSpectrum } from '@quietglass/shared/optics/batch';
import { parseStack } from '@quietglass/shared/optics/stack';
import { dataSourceOptions } from '../src/database/data-source.js';
import { seedCalibrationDemo } from '../src/database/demo-calibration.js';
import { approvedDesign } from './support/approved.js';
import { requireE2eEnv } from './support/env.js';
import { createTestApp, demoSession } from './support/app.js';
import { binary } from './support/binary.js';
import { customerId, materialIds } from './support/fixtures.js';
import { pageTexts } from './support/pdf-pages.js';
import { startWorkerProcess, type WorkerProcess } from './support/worker-process.js';

let app: NestExpressApplication;
let mira: string;
let tomas: string;
let operator: string;
let admin: string;
let m: Record<string, number>;
let worker: WorkerProcess;
let chamberId: number;
let designId: number;

const http = () => request(app.getHttpServer());
const ZRO2_TF = 0.97;
const WAVELENGTHS = Array.from({ length: 151 }, (_, i) => 400 + 3 * i);
/** Incident side first: SiO2 / ZrO2 / SiO2 / ZrO2. */
const LAYERS: [string, number][] = [
  ['SiO2', 95],
  ['ZrO2', 120],
  ['SiO2', 35],
  ['ZrO2', 30],
];

async function finished(id: number, timeoutMs = 90_000) {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const c = (await http().get(`/api/calculations/${id}`).set('Cookie', mira)).body;
    if (['completed', 'failed', 'cancelled'].includes(c.status)) return c;
    if (Date.now() > until) throw new Error(`calculation ${id} still ${c.status}`);
    await new Promise((r) => setTimeout(r, 150));
  }
}

/** A run whose ZrO2 layers came out 3 % thick (SiO2 on target), diagnosed; returns the run id. */
async function diagnosedRun(lot: string, runDate: string, seed: number): Promise<number> {
  const run = await http()
    .post('/api/runs')
    .set('Cookie', operator)
    .send({ designId, versionNumber: 1, chamberId, lotNumber: lot, runDate });
  expect(run.status, JSON.stringify(run.body)).toBe(201);
  const v = (await http().get(`/api/designs/${designId}/versions/1`).set('Cookie', mira)).body;
  const mats = (await http().get('/api/materials').set('Cookie', mira)).body as {
    id: number;
    name: string;
    model: never;
  }[];
  const stack = parseStack(
    designStackDescription(v, new Map(mats.map((x) => [x.id, { name: x.name, model: x.model }]))),
  );
  const built = {
    ...stack,
    layers: stack.layers.map((l, i) => ({
      ...l,
      thicknessNm: l.thicknessNm * (LAYERS[i]![0] === 'ZrO2' ? 1.03 : 1),
    })),
  };
  const R = calculateSpectrum(
    built,
    { wavelengthsNm: WAVELENGTHS, anglesDeg: [8], polarisations: ['avg'] },
    { back: engineBackSurface(v.backSurface) },
  ).R;
  let s = seed;
  const noise = () => ((s = (s * 1103515245 + 12345) % 2 ** 31) / 2 ** 31 - 0.5) * 0.02;
  const csv = [
    'wavelength_nm,R_percent',
    ...WAVELENGTHS.map((wl, i) => `${wl},${Math.max(0, R[i]! * 100 + noise()).toFixed(5)}`),
  ].join('\n');
  const up = await http()
    .post(`/api/runs/${run.body.id}/spectra`)
    .set('Cookie', operator)
    .send({ filename: `${lot}.csv`, csv, angleDeg: 8, sample: 'witness' });
  expect(up.status).toBe(201);
  const sub = await http()
    .post(`/api/runs/${run.body.id}/spectra/${up.body.id}/diagnosis`)
    .set('Cookie', mira)
    .send({});
  expect(sub.status, JSON.stringify(sub.body)).toBe(201);
  const done = await finished(sub.body.id);
  expect(done.status, done.error).toBe('completed');
  return run.body.id as number;
}

const calibration = async (cookie = mira) => {
  const res = await http().get(`/api/chambers/${chamberId}/calibration`).set('Cookie', cookie);
  expect(res.status).toBe(200);
  return res.body;
};
const runSheet = async () => {
  const res = await http()
    .get(`/api/recipes/${designId}/1/run-sheet?chamberId=${chamberId}`)
    .set('Cookie', operator);
  expect(res.status).toBe(200);
  return res.body;
};

beforeAll(async () => {
  app = await createTestApp();
  mira = await demoSession(app, 'engineer', 0);
  tomas = await demoSession(app, 'engineer', 1);
  operator = await demoSession(app, 'operator');
  admin = await demoSession(app, 'admin');
  m = await materialIds(app, mira);
  const customer = await customerId(app, mira, 'Brightwater Instruments');
  const mask = await http()
    .post('/api/spec-masks')
    .set('Cookie', mira)
    .send({
      name: 'Calibration check',
      customerId: customer,
      revision: 'A',
      bands: [{ from_nm: 420, to_nm: 680, quantity: 'R', max_percent: 5, step_nm: 10 }],
    });
  expect(mask.status).toBe(201);
  const chamber = await http()
    .post('/api/chambers')
    .set('Cookie', mira)
    .send({
      name: 'Calibration test chamber',
      monitorWavelengthsNm: [550],
      monitorChipMaterialId: m['Fused silica'],
      materials: [
        { materialId: m['SiO2'], toolingFactor: 1.04, rateNmPerS: 0.8 },
        { materialId: m['ZrO2'], toolingFactor: ZRO2_TF, rateNmPerS: 0.4 },
      ],
    });
  expect(chamber.status, JSON.stringify(chamber.body)).toBe(201);
  chamberId = chamber.body.id;
  designId = await approvedDesign(
    app,
    mira,
    tomas,
    {
      name: 'Calibration AR',
      customerId: customer,
      specMaskId: mask.body.id,
      incidentMaterialId: m['Air'],
      substrateMaterialId: m['N-BK7'],
      substrateThicknessMm: 2,
      backSurface: 'front-only',
      referenceWavelengthNm: 550,
      layers: LAYERS.map(([name, thicknessNm]) => ({ materialId: m[name], thicknessNm })),
    },
    true,
  );
  worker = await startWorkerProcess({ QG_COMPUTE_THREADS: '2' });
  for (let k = 0; k < 5; k++) await diagnosedRun(`CAL-${k + 1}`, `2026-11-0${k + 1}`, 100 + k);
}, 240_000);

afterAll(async () => {
  await worker?.stop('SIGKILL');
  await app.close();
});

describe('chamber calibration', () => {
  let sheetBefore: { layers: { material: string; toolingFactor: number }[]; calibration: unknown };
  let firstKey: string;

  it('learns from the diagnosed runs that ZrO2 comes out 3 % thick and suggests a new factor', async () => {
    const view = await calibration(operator);
    const zr = view.series.find((s: { materialId: number }) => s.materialId === m['ZrO2']);
    const si = view.series.find((s: { materialId: number }) => s.materialId === m['SiO2']);
    expect(zr.runs).toHaveLength(5);
    expect(zr.runs[0].layers.map((l: { step: number }) => l.step)).toEqual([1, 3]);
    const est = zr.estimate.correction;
    expect(Math.abs(est.value - 1.03)).toBeLessThan(Math.max(3 * est.sigma, 0.003));
    expect(Math.abs(si.estimate.correction.value - 1)).toBeLessThan(0.005);
    expect(zr.runs.every((r: { cause: string }) => r.cause === 'material')).toBe(true);
    expect(view.suggestions).toHaveLength(1);
    const s = view.suggestions[0];
    expect(s).toMatchObject({ kind: 'material', materialIds: [m['ZrO2']], currentToolingFactor: ZRO2_TF });
    expect(s.proposedToolingFactor).toBeCloseTo(Math.round(ZRO2_TF * est.value * 1e4) / 1e4, 10);
    expect(s.message).toMatch(/ZrO2 layers come out thick/);
    firstKey = s.key;
    sheetBefore = await runSheet();
    expect(sheetBefore.layers.filter((l) => l.material === 'ZrO2').map((l) => l.toolingFactor)).toEqual([
      ZRO2_TF,
      ZRO2_TF,
    ]);
  });

  it('lets only engineers and admins decide, needs a comment, and writes nothing on a bad request', async () => {
    const url = `/api/chambers/${chamberId}/calibration/decisions`;
    const byOperator = await http()
      .post(url)
      .set('Cookie', operator)
      .send({ key: firstKey, decision: 'accepted', comment: 'looks right' });
    expect(byOperator.status).toBe(403);
    const noComment = await http()
      .post(url)
      .set('Cookie', mira)
      .send({ key: firstKey, decision: 'accepted', comment: ' ' });
    expect(noComment.status).toBe(400);
    expect(noComment.body.details).toEqual(['comment: Say why']);
    const badDecision = await http()
      .post(url)
      .set('Cookie', mira)
      .send({ key: firstKey, decision: 'maybe', comment: 'x' });
    expect(badDecision.status).toBe(400);
    const unknown = await http()
      .post(url)
      .set('Cookie', mira)
      .send({ key: `${firstKey}x`, decision: 'accepted', comment: 'x' });
    expect(unknown.status).toBe(409);
    expect(unknown.body.message).toMatch(/no longer current/);
    const view = await calibration();
    expect(view.decisions).toEqual([]);
    expect(view.suggestions.map((s: { key: string }) => s.key)).toEqual([firstKey]);
  });

  it('records a rejection with its comment, audited, and hides that suggestion', async () => {
    const res = await http()
      .post(`/api/chambers/${chamberId}/calibration/decisions`)
      .set('Cookie', mira)
      .send({
        key: firstKey,
        decision: 'rejected',
        comment: 'Source crucible was changed before CAL-1; wait for more runs',
      });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({
      decision: 'rejected',
      decidedBy: 'Mira Castell',
      previousToolingFactor: ZRO2_TF,
      newToolingFactor: null,
      comment: 'Source crucible was changed before CAL-1; wait for more runs',
    });
    const view = await calibration();
    expect(view.suggestions).toEqual([]);
    expect(view.decisions).toHaveLength(1);
    const chamber = (await http().get(`/api/chambers/${chamberId}`).set('Cookie', mira)).body;
    expect(
      chamber.materials.find((x: { materialId: number }) => x.materialId === m['ZrO2']).toolingFactor,
    ).toBe(ZRO2_TF);
    const audit = await http()
      .get(`/api/audit?entity=chamber-calibration&entityId=${res.body.id}`)
      .set('Cookie', admin);
    expect(audit.status).toBe(200);
    expect(audit.body).toHaveLength(1);
    expect(audit.body[0].action).toBe('rejected');
    expect(audit.body[0].summary).toMatch(/wait for more runs/);
    const again = await http()
      .post(`/api/chambers/${chamberId}/calibration/decisions`)
      .set('Cookie', tomas)
      .send({ key: firstKey, decision: 'accepted', comment: 'x' });
    expect(again.status).toBe(409);
    expect(again.body.message).toMatch(/already rejected by Mira Castell/);
  });

  it('suggests again after a new run; an accepted factor changes new run sheets only', async () => {
    await diagnosedRun('CAL-6', '2026-11-06', 106);
    const view = await calibration();
    expect(view.suggestions).toHaveLength(1);
    const s = view.suggestions[0];
    expect(s.key).not.toBe(firstKey);
    const res = await http()
      .post(`/api/chambers/${chamberId}/calibration/decisions`)
      .set('Cookie', tomas)
      .send({ key: s.key, decision: 'accepted', comment: 'Six runs agree; witness thickness checked' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({
      decision: 'accepted',
      previousToolingFactor: ZRO2_TF,
      newToolingFactor: s.proposedToolingFactor,
    });
    const chamber = (await http().get(`/api/chambers/${chamberId}`).set('Cookie', mira)).body;
    expect(
      chamber.materials.find((x: { materialId: number }) => x.materialId === m['ZrO2']).toolingFactor,
    ).toBe(s.proposedToolingFactor);
    expect(
      chamber.materials.find((x: { materialId: number }) => x.materialId === m['SiO2']).toolingFactor,
    ).toBe(1.04);
    // The sheet fetched before keeps its numbers; a new sheet uses the accepted factor and says so.
    expect(sheetBefore.layers.filter((l) => l.material === 'ZrO2')[0]!.toolingFactor).toBe(ZRO2_TF);
    const after = await runSheet();
    expect(
      after.layers
        .filter((l: { material: string }) => l.material === 'ZrO2')
        .map((l: { toolingFactor: number }) => l.toolingFactor),
    ).toEqual([s.proposedToolingFactor, s.proposedToolingFactor]);
    expect(after.calibration.chamberVersion).toBe(chamber.version);
    expect(after.calibration.materials).toEqual(
      expect.arrayContaining([
        { material: 'SiO2', toolingFactor: 1.04, decision: null },
        {
          material: 'ZrO2',
          toolingFactor: s.proposedToolingFactor,
          decision: { id: res.body.id, decidedAt: res.body.decidedAt, decidedBy: 'Tomas Reyes' },
        },
      ]),
    );
    const pdf = await binary(
      http().get(`/api/recipes/${designId}/1/run-sheet.pdf?chamberId=${chamberId}`).set('Cookie', operator),
    );
    const text = pageTexts(pdf.body as Buffer)
      .join('\n')
      .replace(/\s+/g, ' ');
    expect(text).toContain(`ZrO2 ${s.proposedToolingFactor} (calibration #${res.body.id}`);
    expect(text).toContain('SiO2 1.04 (chamber setting)');
    // Measured against the factors they were made with, the runs now agree with the new factor.
    const now = await calibration();
    const zr = now.series.find((x: { materialId: number }) => x.materialId === m['ZrO2']);
    expect(zr.runs.every((r: { toolingFactorInEffect: number }) => r.toolingFactorInEffect === ZRO2_TF)).toBe(
      true,
    );
    expect(Math.abs(zr.estimate.correction.value - 1)).toBeLessThan(0.004);
    expect(now.suggestions).toEqual([]);
    const audit = await http().get(`/api/audit?entity=chamber&entityId=${chamberId}`).set('Cookie', admin);
    expect(audit.body[0].summary).toMatch(/calibration accepted: Six runs agree/);
  });

  it('reads past runs against the factor they kept when a tooling factor is edited by hand', async () => {
    const chamber = (await http().get(`/api/chambers/${chamberId}`).set('Cookie', mira)).body;
    const edit = await http()
      .put(`/api/chambers/${chamberId}`)
      .set('Cookie', mira)
      .send({
        name: chamber.name,
        monitorWavelengthsNm: chamber.monitorWavelengthsNm,
        monitorChipMaterialId: chamber.monitorChipMaterialId,
        notes: chamber.notes,
        version: chamber.version,
        materials: chamber.materials.map((x: { materialId: number; toolingFactor: number }) =>
          x.materialId === m['SiO2'] ? { ...x, toolingFactor: 1.1 } : x,
        ),
      });
    expect(edit.status, JSON.stringify(edit.body)).toBe(200);
    const view = await calibration();
    const si = view.series.find((x: { materialId: number }) => x.materialId === m['SiO2']);
    expect(si.currentToolingFactor).toBe(1.1);
    // Every SiO2 run was made at 1.04 and came out right: read against the factor each run kept,
    // the history says 1.10 is 5.5 % high and proposes 1.04 again (read against 1.10, it would
    // have called 1.10 right).
    expect(si.runs.map((r: { toolingFactorInEffect: number }) => r.toolingFactorInEffect)).toEqual(
      Array<number>(si.runs.length).fill(1.04),
    );
    expect(Math.abs(si.estimate.correction.value - 1.04 / 1.1)).toBeLessThan(0.004);
    const back = view.suggestions.filter(
      (x: { kind: string; materialIds: number[] }) => x.kind === 'material' && x.materialIds[0] === m['SiO2'],
    );
    expect(back).toHaveLength(1);
    expect(back[0].currentToolingFactor).toBe(1.1);
    expect(Math.abs(back[0].proposedToolingFactor - 1.04)).toBeLessThan(0.005);
  });

  it('keeps the threshold as an admin setting, audited, and refuses a bad one', async () => {
    const current = (await http().get('/api/calibration/settings').set('Cookie', operator)).body;
    expect(current).toMatchObject({ thresholdPercent: 1, minRuns: 4 });
    const bad = await http()
      .put('/api/calibration/settings')
      .set('Cookie', admin)
      .send({ thresholdPercent: Number.NaN, minRuns: 1, version: current.version });
    expect(bad.status).toBe(400);
    // JSON carries NaN as null.
    expect(bad.body.details).toEqual([
      'thresholdPercent: Enter the threshold in percent as a number',
      'minRuns: At least 2 runs',
    ]);
    const byEngineer = await http()
      .put('/api/calibration/settings')
      .set('Cookie', mira)
      .send({ thresholdPercent: 2, minRuns: 4, version: current.version });
    expect(byEngineer.status).toBe(403);
    const ok = await http()
      .put('/api/calibration/settings')
      .set('Cookie', admin)
      .send({ thresholdPercent: 1, minRuns: 4, version: current.version });
    expect(ok.status).toBe(200);
    expect(ok.body.version).toBe(current.version + 1);
    const stale = await http()
      .put('/api/calibration/settings')
      .set('Cookie', admin)
      .send({ thresholdPercent: 1, minRuns: 4, version: current.version });
    expect(stale.status).toBe(409);
  });

  it('seeds the demo chamber with twelve diagnosed runs, a ZrO2 drift and its suggestion, once', async () => {
    const db = new DataSource(dataSourceOptions(requireE2eEnv().databaseUrl));
    await db.initialize();
    try {
      expect(await seedCalibrationDemo(db)).toBe(12);
      expect(await seedCalibrationDemo(db)).toBe(0);
    } finally {
      await db.destroy();
    }
    const b2 = (await http().get('/api/chambers').set('Cookie', mira)).body.find(
      (c: { name: string }) => c.name === 'Box coater B2',
    );
    const view = (await http().get(`/api/chambers/${b2.id}/calibration`).set('Cookie', mira)).body;
    const zr = view.series.find((x: { materialName: string }) => x.materialName === 'ZrO2');
    expect(zr.runs).toHaveLength(12);
    expect(zr.runs.map((r: { runDate: string }) => r.runDate)[0]).toBe('2026-10-02');
    // The invented drift ends at +2 % (plus the last runs' own 0.3 % scatter): within 3σ of it.
    expect(Math.abs(zr.estimate.correction.value - 1.02)).toBeLessThan(3 * zr.estimate.correction.sigma);
    // The ZrO2 drift is suggested. (Al2O3, next to the poorly identified SiO2 on the glass, can read
    // about 2 % thin in this history although it was built true: the diagnosis trades thickness
    // between the two; until that is resolved the demo may show that second suggestion too.)
    expect(
      view.suggestions.map((x: { kind: string; materialIds: number[] }) => [x.kind, x.materialIds]),
    ).toContainEqual(['material', [m['ZrO2']]]);
  });
});
