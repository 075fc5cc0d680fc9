import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, demoSession } from './support/app.js';
import { requestBodies } from './support/openapi.js';
import { customerId, maskId, materialIds } from './support/fixtures.js';

let app: NestExpressApplication;
let mira: string;
let tomas: string;
let operator: string;
let recipeId: number;
let chamberId: number;

const http = () => request(app.getHttpServer());

beforeAll(async () => {
  app = await createTestApp();
  mira = await demoSession(app, 'engineer', 0);
  tomas = await demoSession(app, 'engineer', 1);
  operator = await demoSession(app, 'operator');
  const m = await materialIds(app, mira);
  const halden = await customerId(app, mira, 'Halden Vision Systems');
  const mask = { id: await maskId(app, mira, halden, 'HVS-2210 lens AR') };
  const design = await http()
    .post('/api/designs')
    .set('Cookie', mira)
    .send({
      name: 'Lens AR for runs',
      customerId: halden,
      specMaskId: mask.id,
      incidentMaterialId: m['Air'],
      substrateMaterialId: m['N-BK7'],
      substrateThicknessMm: 3,
      backSurface: 'front-only',
      referenceWavelengthNm: 550,
      layers: [
        { materialId: m['MgF2'], thicknessNm: 96 },
        { materialId: m['ZrO2'], thicknessNm: 120 },
        { materialId: m['Al2O3'], thicknessNm: 80 },
      ],
    });
  recipeId = design.body.id;
  for (const [cookie, action, body] of [
    [mira, 'submit', { rowVersion: 1 }],
    [tomas, 'approve', {}],
    [tomas, 'release', {}],
  ] as const) {
    await http().post(`/api/designs/${recipeId}/versions/1/${action}`).set('Cookie', cookie).send(body);
  }
  chamberId = (await http().get('/api/chambers').set('Cookie', operator)).body[0].id;
});
afterAll(async () => {
  await app.close();
});

async function startRun(): Promise<number> {
  const res = await http().post('/api/runs').set('Cookie', operator).send({
    designId: recipeId,
    versionNumber: 1,
    chamberId,
    lotNumber: 'L-2026-118',
    runDate: '2026-12-01',
  });
  expect(res.status).toBe(201);
  return res.body.id;
}

describe('chamber runs', () => {
  it('an operator starts a run of a released recipe and logs readings and durability results', async () => {
    const id = await startRun();
    const run = await http().get(`/api/runs/${id}`).set('Cookie', operator);
    expect(run.body).toMatchObject({
      lotNumber: 'L-2026-118',
      runDate: '2026-12-01',
      operator: { displayName: 'Jonah Pike' },
    });
    const updated = await http()
      .put(`/api/runs/${id}`)
      .set('Cookie', operator)
      .send({
        version: 1,
        layerReadings: [{ step: 1, monitorThicknessNm: 82.1, rateNmPerS: 0.5, notes: 'stable' }],
        durability: [{ test: 'adhesion', method: 'ISO 9211-4, tape adhesion', result: 'pass' }],
        notes: 'Pump-down 42 min',
      });
    expect(updated.status).toBe(200);
    expect(updated.body.version).toBe(2);
    expect(updated.body.durability).toEqual([
      { test: 'adhesion', method: 'ISO 9211-4, tape adhesion', result: 'pass' },
    ]);
    const tooFar = await http()
      .put(`/api/runs/${id}`)
      .set('Cookie', operator)
      .send({ version: 2, layerReadings: [{ step: 9 }] });
    expect(tooFar.status).toBe(400);
    expect(tooFar.body.details).toEqual(['layerReadings.0.step: the recipe has 3 layers']);
    const noMethod = await http()
      .put(`/api/runs/${id}`)
      .set('Cookie', operator)
      .send({ version: 2, durability: [{ test: 'humidity', method: ' ', result: 'pass' }] });
    expect(noMethod.status).toBe(400);
    expect(noMethod.body.details).toEqual([
      'durability.0.method: Name the test procedure followed (e.g. ISO 9211-4, tape adhesion)',
    ]);
    const noVersion = await http().put(`/api/runs/${id}`).set('Cookie', operator).send({ notes: 'x' });
    expect(noVersion.status).toBe(400);
    expect(noVersion.body.details).toEqual(['version: version must be the version number last read']);
    // The refused changes wrote nothing.
    const after = await http().get(`/api/runs/${id}`).set('Cookie', operator);
    expect(after.body).toMatchObject({ version: 2, notes: 'Pump-down 42 min' });
    expect(after.body.layerReadings).toEqual([
      { step: 1, monitorThicknessNm: 82.1, rateNmPerS: 0.5, notes: 'stable' },
    ]);
    // Saving the same readings again is recorded as a save without changes (whatever key order
    // the database hands the stored readings back in).
    const same = await http()
      .put(`/api/runs/${id}`)
      .set('Cookie', operator)
      .send({
        version: 2,
        layerReadings: [{ step: 1, monitorThicknessNm: 82.1, rateNmPerS: 0.5, notes: 'stable' }],
      });
    expect(same.status).toBe(200);
    const admin = await demoSession(app, 'admin');
    const audit = await http().get(`/api/audit?entity=run&entityId=${id}`).set('Cookie', admin);
    expect(audit.body[0].summary).toBe('run of lot L-2026-118 saved without changes');
  });

  it('refuses a run of a recipe that is not released', async () => {
    const res = await http()
      .post('/api/runs')
      .set('Cookie', operator)
      .send({ designId: 999999, versionNumber: 1, chamberId, lotNumber: 'X', runDate: '2026-12-01' });
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual(['design 999999 version 1 is not a released recipe']);
  });

  it.each([
    [{ lotNumber: '  ' }, 'lotNumber: Enter the lot number'],
    [{ runDate: '2026-02-30' }, 'runDate: Enter the date as YYYY-MM-DD'],
    [{ chamberId: 'B2' }, 'chamberId: Choose the chamber'],
    [{ operatorId: 1 }, 'Unrecognized key: "operatorId"'],
  ])('refuses to start a run from %j with 400 and writes nothing', async (patch, detail) => {
    const count = async () =>
      Number((await app.get(DataSource).query('SELECT count(*) AS n FROM chamber_runs'))[0].n);
    const before = await count();
    const res = await http()
      .post('/api/runs')
      .set('Cookie', operator)
      .send({
        designId: recipeId,
        versionNumber: 1,
        chamberId,
        lotNumber: 'L-9',
        runDate: '2026-12-01',
        ...patch,
      });
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual([detail]);
    expect(await count()).toBe(before);
  });

  it('publishes the shared run schemas as the request bodies in the OpenAPI description', async () => {
    const bodyOf = await requestBodies(app);
    const start = bodyOf('post', '/api/runs');
    expect(start.required?.sort()).toEqual([
      'chamberId',
      'designId',
      'lotNumber',
      'runDate',
      'versionNumber',
    ]);
    expect(start.properties.lotNumber!.maxLength).toBe(60);
    const update = bodyOf('put', '/api/runs/{id}');
    expect(update.required).toEqual(['version']);
    expect(update.properties.durability!.items!.properties.test!.enum).toEqual([
      'adhesion',
      'abrasion',
      'humidity',
      'other',
    ]);
    expect(bodyOf('post', '/api/runs/{id}/remarks').properties.text!.maxLength).toBe(2000);
    expect(bodyOf('post', '/api/runs/{id}/spectra').properties.angleDeg!.maximum).toBe(89);
  });

  it('stores an uploaded spectrum as uploaded and compares it with the design and the mask', async () => {
    const id = await startRun();
    // A made-up measurement: R 0.3 % flat, with a 0.7 % bump at 600–620 nm (over the 0.5 % limit).
    const rows = ['wavelength_nm,R_percent'];
    for (let wl = 400; wl <= 700; wl += 5) rows.push(`${wl},${wl >= 600 && wl <= 620 ? 0.7 : 0.3}`);
    const csv = rows.join('\n') + '\n';
    const up = await http()
      .post(`/api/runs/${id}/spectra`)
      .set('Cookie', operator)
      .send({ filename: 'witness-118.csv', csv, angleDeg: 8, sample: 'witness' });
    expect(up.status).toBe(201);
    expect(up.body).toMatchObject({
      quantity: 'R',
      angleDeg: 8,
      sample: 'witness',
      filename: 'witness-118.csv',
    });
    const original = await http()
      .get(`/api/runs/${id}/spectra/${up.body.id}/original`)
      .set('Cookie', operator);
    expect(original.text).toBe(csv);
    const cmp = await http().get(`/api/runs/${id}/spectra/${up.body.id}/comparison`).set('Cookie', mira);
    expect(cmp.status).toBe(200);
    expect(cmp.body.measured.wavelengthsNm).toHaveLength(61);
    expect(cmp.body.design.valuesPercent).toHaveLength(61);
    // The mask (R ≤ 0.5 % at 0, 15, 30°) is judged at the measured 8° (near-normal): fails by 0.2 points.
    expect(cmp.body.mask).toMatchObject({ name: 'HVS-2210 lens AR', pass: false });
    expect(cmp.body.mask.worstMargin).toBeCloseTo(-0.2, 9);
    expect(cmp.body.mask.bands[0].worstAt.wavelengthNm).toBeGreaterThanOrEqual(600);
    // The mask's own limits come along so the client can draw them (operators cannot read spec masks).
    expect(cmp.body.mask.limits[0]).toMatchObject({
      from_nm: 420,
      to_nm: 680,
      quantity: 'R',
      max_percent: 0.5,
    });
  });

  it.each([
    [
      {
        filename: 'bad.csv',
        csv: 'wavelength_nm,R_percent\n400,0.3\n405,x\n410,-2\n',
        angleDeg: 8,
        sample: 'part',
      },
      ['row 3: not a number: R "x"', 'row 4: R must lie between 0 and 100 percent (got -2)'],
    ],
    [
      { filename: 'w.csv', csv: 'wavelength_nm,R_percent\n400,0.3\n', angleDeg: 90, sample: 'lens' },
      ['angleDeg: Enter an angle from 0 to 89°', 'sample: Choose witness sample or part'],
    ],
  ])('rejects the spectrum upload %j with its messages and stores nothing', async (body, details) => {
    const id = await startRun();
    const count = async () =>
      Number(
        (await app.get(DataSource).query('SELECT count(*) AS n FROM run_spectra WHERE run_id = $1', [id]))[0]
          .n,
      );
    const res = await http().post(`/api/runs/${id}/spectra`).set('Cookie', operator).send(body);
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual(details);
    expect(await count()).toBe(0);
  });

  it("a run is its operator's: others are refused and add remarks, which never overwrite the record", async () => {
    const id = await startRun();
    const byEngineer = await http()
      .put(`/api/runs/${id}`)
      .set('Cookie', mira)
      .send({ version: 1, notes: 'overwritten by an engineer' });
    expect(byEngineer.status).toBe(403);
    expect(byEngineer.body.message).toBe(
      'Run L-2026-118 was logged by Jonah Pike; only they can change its readings, durability results and notes. Add a remark instead.',
    );
    const remark = await http()
      .post(`/api/runs/${id}/remarks`)
      .set('Cookie', mira)
      .send({ text: '  Witness looked hazy at the edge.  ' });
    expect(remark.status).toBe(201);
    expect(remark.body.remarks).toEqual([
      {
        at: expect.any(String),
        by: { id: expect.any(Number), displayName: 'Mira Castell' },
        text: 'Witness looked hazy at the edge.',
      },
    ]);
    // A remark does not move the run's version: the operator's edit based on version 1 still saves.
    expect(remark.body.version).toBe(1);
    const own = await http()
      .put(`/api/runs/${id}`)
      .set('Cookie', operator)
      .send({ version: 1, notes: 'Hazy edge noted' });
    expect(own.status).toBe(200);
    expect(own.body).toMatchObject({ version: 2, notes: 'Hazy edge noted' });
    expect(own.body.remarks).toHaveLength(1);
    const empty = await http().post(`/api/runs/${id}/remarks`).set('Cookie', mira).send({ text: '   ' });
    expect(empty.status).toBe(400);
    expect(empty.body.details).toEqual(['text: Enter the remark']);

    // Concurrent remarks are all kept (each is one appending UPDATE).
    const texts = Array.from({ length: 10 }, (_, i) => `remark ${i}`);
    const results = await Promise.all(
      texts.map((text, i) =>
        http()
          .post(`/api/runs/${id}/remarks`)
          .set('Cookie', i % 2 ? mira : tomas)
          .send({ text }),
      ),
    );
    expect(results.map((r) => r.status)).toEqual(texts.map(() => 201));
    const stored = await http().get(`/api/runs/${id}`).set('Cookie', operator);
    expect(stored.body.remarks.map((r: { text: string }) => r.text).sort()).toEqual(
      ['Witness looked hazy at the edge.', ...texts].sort(),
    );

    // Every change is on the record, attributed.
    const admin = await demoSession(app, 'admin');
    const audit = await http().get(`/api/audit?entity=run&entityId=${id}`).set('Cookie', admin);
    expect(audit.status).toBe(200);
    const entries = (audit.body as { action: string; actor: { displayName: string } }[])
      .map((e) => `${e.action} by ${e.actor.displayName}`)
      .reverse();
    expect(entries.slice(0, 3)).toEqual([
      'logged by Jonah Pike',
      'remark added by Mira Castell',
      'edited by Jonah Pike',
    ]);
    expect(entries.filter((e) => e.startsWith('remark added'))).toHaveLength(11);
  });

  it('of 30 rounds of two edits from one version, exactly one wins each time and nothing is mixed', async () => {
    const id = await startRun();
    let version = 1;
    for (let round = 0; round < 30; round++) {
      const a = {
        version,
        notes: `round ${round} A`,
        durability: [{ test: 'adhesion', method: `A${round}`, result: 'pass' }],
      };
      const b = {
        version,
        notes: `round ${round} B`,
        durability: [{ test: 'abrasion', method: `B${round}`, result: 'fail' }],
      };
      const [ra, rb] = await Promise.all([
        http().put(`/api/runs/${id}`).set('Cookie', operator).send(a),
        http().put(`/api/runs/${id}`).set('Cookie', operator).send(b),
      ]);
      expect([ra.status, rb.status].sort()).toEqual([200, 409]);
      const loser = ra.status === 409 ? ra : rb;
      expect(loser.body.message).toMatch(
        /^Run L-2026-118 was changed meanwhile \(now version \d+, you started from version \d+\); reload it/,
      );
      const winner = ra.status === 200 ? a : b;
      const now = await http().get(`/api/runs/${id}`).set('Cookie', operator);
      expect(now.body.notes).toBe(winner.notes);
      expect(now.body.durability).toEqual(winner.durability);
      expect(now.body.version).toBe(version + 1);
      version = now.body.version;
    }
  });

  it('sales have no access to chamber runs', async () => {
    const sales = await demoSession(app, 'sales');
    expect((await http().get('/api/runs').set('Cookie', sales)).status).toBe(403);
  });
});
