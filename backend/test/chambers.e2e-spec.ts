import { writeFileSync } from 'node:fs';
import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, demoSession } from './support/app.js';
import { binary } from './support/binary.js';
import { customerId, materialIds } from './support/fixtures.js';
import { pagePngs, pageTexts, wordBoxes } from './support/pdf-pages.js';
import { requestBodies } from './support/openapi.js';

let app: NestExpressApplication;
let mira: string;
let tomas: string;
let operator: string;
let m: Record<string, number>;
let chamberId: number;
let recipeId: number;

const http = () => request(app.getHttpServer());
const constantMaterial = (name: string, n: number) => ({
  name,
  model: { model: 'constant', n, k: 0 },
  rangeNm: { from: 300, to: 1200 },
  typical: true,
  provenance: { source: 'test value' },
});

beforeAll(async () => {
  app = await createTestApp();
  mira = await demoSession(app, 'engineer', 0);
  tomas = await demoSession(app, 'engineer', 1);
  operator = await demoSession(app, 'operator');
  for (const [name, n] of [
    ['Sheet L 1.5', 1.5],
    ['Sheet H 2.0', 2.0],
  ] as const) {
    expect(
      (await http().post('/api/materials').set('Cookie', mira).send(constantMaterial(name, n))).status,
    ).toBe(201);
  }
  m = await materialIds(app, mira);
  const chamber = await http()
    .post('/api/chambers')
    .set('Cookie', mira)
    .send({
      name: 'Test chamber',
      monitorWavelengthsNm: [600],
      monitorChipMaterialId: m['N-BK7'],
      materials: [
        { materialId: m['Sheet L 1.5'], toolingFactor: 1.2, rateNmPerS: 0.5 },
        { materialId: m['Sheet H 2.0'], toolingFactor: 0.75, rateNmPerS: 0.25 },
      ],
    });
  expect(chamber.status).toBe(201);
  chamberId = chamber.body.id;
  // The 4-layer recipe of the hand calculation, released through four-eyes approval.
  const design = await http()
    .post('/api/designs')
    .set('Cookie', mira)
    .send({
      name: 'Sheet check',
      customerId: await customerId(app, mira, 'Brightwater Instruments'),
      incidentMaterialId: m['Air'],
      substrateMaterialId: m['N-BK7'],
      substrateThicknessMm: 2,
      backSurface: 'bare',
      referenceWavelengthNm: 550,
      layers: [
        { materialId: m['Sheet L 1.5'], thicknessNm: 120 },
        { materialId: m['Sheet H 2.0'], thicknessNm: 60 },
        { materialId: m['Sheet L 1.5'], thicknessNm: 30 },
        { materialId: m['Sheet H 2.0'], thicknessNm: 15 },
      ],
    });
  recipeId = design.body.id;
  for (const [cookie, action, body] of [
    [mira, 'submit', { rowVersion: 1 }],
    [tomas, 'approve', {}],
    [tomas, 'release', {}],
  ] as const) {
    expect(
      (await http().post(`/api/designs/${recipeId}/versions/1/${action}`).set('Cookie', cookie).send(body))
        .status,
    ).toBe(201);
  }
});
afterAll(async () => {
  await app.close();
});

describe('chambers', () => {
  it('lists the demo chamber with its tooling factors', async () => {
    const res = await http().get('/api/chambers').set('Cookie', operator);
    expect(res.status).toBe(200);
    const b2 = res.body.find((c: { name: string }) => c.name === 'Box coater B2');
    expect(b2.monitorWavelengthsNm).toEqual([550, 632.8]);
    expect(b2.materials).toContainEqual({ materialId: m['MgF2'], toolingFactor: 1.08, rateNmPerS: 0.8 });
    // Its demo process settings: one per material, marked as demo values.
    const process = await http().get(`/api/chambers/${b2.id}/process-settings`).set('Cookie', operator);
    expect(process.body.version).toBe(1);
    expect(process.body.settings.map((s: { materialId: number }) => s.materialId).sort()).toEqual(
      b2.materials.map((x: { materialId: number }) => x.materialId).sort(),
    );
    const mgf2 = process.body.settings.find((s: { materialId: number }) => s.materialId === m['MgF2']);
    expect(mgf2).toMatchObject({
      substrateTemperatureC: 280,
      o2FlowSccm: null,
      ionVoltageV: null,
      notes: 'demo value',
    });
  });

  it.each([
    [
      { materials: [{ materialId: 1, toolingFactor: -1, rateNmPerS: 1 }] },
      'materials.0.toolingFactor: Tooling factor must be greater than 0',
    ],
    [
      { materials: [{ materialId: 1, toolingFactor: 1, rateNmPerS: 'fast' }] },
      'materials.0.rateNmPerS: Enter the rate in nm/s as a number, e.g. 0.8',
    ],
    [
      {
        materials: [
          { materialId: 1, toolingFactor: 1, rateNmPerS: 1 },
          { materialId: 1, toolingFactor: 1.1, rateNmPerS: 1 },
        ],
      },
      'materials.1.materialId: This material is already listed in row 1',
    ],
    [{ monitorWavelengthsNm: [] }, 'monitorWavelengthsNm: Enter at least one monitor wavelength'],
    [{ name: '  ' }, 'name: Enter a chamber name'],
    [{ colour: 'red' }, 'Unrecognized key: "colour"'],
    [{ monitorChipMaterialId: 99999 }, 'monitorChipMaterialId: material 99999 does not exist'],
  ])('rejects a bad chamber %j with 400', async (patch, detail) => {
    const body = {
      name: 'Bad chamber',
      monitorWavelengthsNm: [550],
      monitorChipMaterialId: m['N-BK7'],
      materials: [],
      ...patch,
    };
    const res = await http().post('/api/chambers').set('Cookie', mira).send(body);
    expect(res.status).toBe(400);
    expect(res.body.details).toContain(detail);
  });

  it('publishes the shared chamber schema as the body of create and edit in the OpenAPI description', async () => {
    const bodyOf = await requestBodies(app);
    const create = bodyOf('post', '/api/chambers');
    expect(create.required?.sort()).toEqual([
      'materials',
      'monitorChipMaterialId',
      'monitorWavelengthsNm',
      'name',
    ]);
    expect(create.properties.materials!.items!.properties.toolingFactor!.maximum).toBe(10);
    expect(bodyOf('put', '/api/chambers/{id}').required).toContain('version');
  });

  it('operators cannot change chambers', async () => {
    const res = await http()
      .post('/api/chambers')
      .set('Cookie', operator)
      .send({ name: 'Mine', monitorWavelengthsNm: [550], monitorChipMaterialId: m['N-BK7'], materials: [] });
    expect(res.status).toBe(403);
  });
});

describe('process settings per material', () => {
  const setting = (materialId: number, patch: object = {}) => ({
    materialId,
    substrateTemperatureC: 250,
    basePressureMbar: 2e-5,
    o2FlowSccm: 12,
    o2PartialPressureMbar: null,
    ionVoltageV: 120,
    ionCurrentA: 2.5,
    ionGasFlowSccm: 8,
    notes: 'hold the rate within ± 0.05 nm/s',
    ...patch,
  });
  const stored = async () =>
    (await app
      .get(DataSource)
      .query('SELECT settings, version FROM chamber_process_settings WHERE chamber_id = $1', [
        chamberId,
      ])) as {
      settings: object[];
      version: number;
    }[];

  it('is empty at version 0 before the first save, and operators may read it', async () => {
    const res = await http().get(`/api/chambers/${chamberId}/process-settings`).set('Cookie', operator);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ chamberId, settings: [], version: 0, updatedAt: null });
    expect((await http().get('/api/chambers/99999/process-settings').set('Cookie', operator)).status).toBe(
      404,
    );
  });

  it.each([
    [{ substrateTemperatureC: 'hot' }, 'settings.0.substrateTemperatureC: A number in °C'],
    [{ substrateTemperatureC: 900 }, 'settings.0.substrateTemperatureC: At most 400 °C'],
    [{ basePressureMbar: 0 }, 'settings.0.basePressureMbar: At least 1e-9 mbar'],
    [{ basePressureMbar: 2 }, 'settings.0.basePressureMbar: At most 0.001 mbar'],
    [{ basePressureMbar: undefined }, 'settings.0.basePressureMbar: Needed once the material has a setting'],
    [{ o2FlowSccm: -3 }, 'settings.0.o2FlowSccm: At least 0 sccm'],
    [{ ionCurrentA: 'high' }, 'settings.0.ionCurrentA: A number in A'],
    [{ notes: 'n'.repeat(301) }, 'settings.0.notes: At most 300 characters'],
    [{ colour: 'red' }, 'settings.0: Unrecognized key: "colour"'],
    [
      { materialId: 99999 },
      'settings.0.materialId: material 99999 is not in the material list of chamber "Test chamber"',
    ],
  ])('refuses %j with 400 and writes nothing', async (patch, detail) => {
    const res = await http()
      .put(`/api/chambers/${chamberId}/process-settings`)
      .set('Cookie', mira)
      .send({ settings: [setting(m['Sheet L 1.5']!, patch)], version: 0 });
    expect(res.status).toBe(400);
    expect(res.body.details).toContain(detail);
    expect(await stored()).toEqual([]);
  });

  it('refuses a material listed twice and an operator edit', async () => {
    const twice = await http()
      .put(`/api/chambers/${chamberId}/process-settings`)
      .set('Cookie', mira)
      .send({ settings: [setting(m['Sheet L 1.5']!), setting(m['Sheet L 1.5']!)], version: 0 });
    expect(twice.status).toBe(400);
    expect(twice.body.details).toEqual(['settings.1.materialId: This material is already listed in row 1']);
    const op = await http()
      .put(`/api/chambers/${chamberId}/process-settings`)
      .set('Cookie', operator)
      .send({ settings: [setting(m['Sheet L 1.5']!)], version: 0 });
    expect(op.status).toBe(403);
    expect(await stored()).toEqual([]);
  });

  it('publishes the shared process settings schema as the body of the edit in the OpenAPI description', async () => {
    type Item = { properties: Record<string, { maximum?: number; default?: unknown }>; required: string[] };
    const doc = (await http().get('/api/docs-json')).body as {
      paths: Record<
        string,
        Record<
          string,
          {
            requestBody: {
              content: { 'application/json': { schema: { properties: { settings: { items: Item } } } } };
            };
          }
        >
      >;
    };
    const body =
      doc.paths['/api/chambers/{id}/process-settings']!['put']!.requestBody.content['application/json'];
    const item = body.schema.properties.settings.items;
    expect(item.required.sort()).toEqual(['basePressureMbar', 'materialId', 'substrateTemperatureC']);
    expect(item.properties.substrateTemperatureC!.maximum).toBe(400);
    expect(item.properties.ionVoltageV!.default).toBeNull();
  });

  it('saves the set under a version lock and puts before and after on the audit trail', async () => {
    const first = await http()
      .put(`/api/chambers/${chamberId}/process-settings`)
      .set('Cookie', mira)
      .send({
        settings: [
          setting(m['Sheet L 1.5']!, {
            ionVoltageV: undefined,
            ionCurrentA: undefined,
            ionGasFlowSccm: undefined,
          }),
          setting(m['Sheet H 2.0']!, { o2FlowSccm: null, o2PartialPressureMbar: 1.5e-4 }),
        ],
        version: 0,
      });
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    expect(first.body.version).toBe(1);
    expect(first.body.settings[0]).toEqual({
      materialId: m['Sheet L 1.5'],
      substrateTemperatureC: 250,
      basePressureMbar: 2e-5,
      o2FlowSccm: 12,
      o2PartialPressureMbar: null,
      arFlowSccm: null,
      ionVoltageV: null,
      ionCurrentA: null,
      ionGasFlowSccm: null,
      notes: 'hold the rate within ± 0.05 nm/s',
    });
    expect(first.body.settings[1]).toMatchObject({ o2FlowSccm: null, o2PartialPressureMbar: 1.5e-4 });
    const stale = await http()
      .put(`/api/chambers/${chamberId}/process-settings`)
      .set('Cookie', tomas)
      .send({ settings: [], version: 0 });
    expect(stale.status).toBe(409);
    expect(stale.body.message).toMatch(/now version 1/);
    const second = await http()
      .put(`/api/chambers/${chamberId}/process-settings`)
      .set('Cookie', tomas)
      .send({ settings: [setting(m['Sheet H 2.0']!, { substrateTemperatureC: 300 })], version: 1 });
    expect(second.status).toBe(200);
    expect((await stored())[0]!.version).toBe(2);
    const [entry] = (await app
      .get(DataSource)
      .query(
        `SELECT action, details FROM audit_events WHERE entity = 'chamber' AND entity_id = $1 ORDER BY id DESC LIMIT 1`,
        [chamberId],
      )) as {
      action: string;
      details: { before: { substrateTemperatureC: number }[]; after: { substrateTemperatureC: number }[] };
    }[];
    expect(entry!.action).toBe('process settings edited');
    expect(entry!.details.before.map((s) => s.substrateTemperatureC)).toEqual([250, 250]);
    expect(entry!.details.after.map((s) => s.substrateTemperatureC)).toEqual([300]);
  });
});

describe('run sheet of a released recipe', () => {
  it('matches the hand calculation with the tooling factor (part ÷ TF), QWOT at 600 nm and times', async () => {
    const res = await http()
      .get(`/api/recipes/${recipeId}/1/run-sheet?chamberId=${chamberId}`)
      .set('Cookie', operator);
    expect(res.status).toBe(200);
    const rows = res.body.layers.map((l: Record<string, number | string>) => [
      l.step,
      l.material,
      l.partThicknessNm,
      Number((l.monitorThicknessNm as number).toFixed(6)),
      Number((l.qwotAtMonitor as number).toFixed(6)),
      Number((l.timeS as number).toFixed(6)),
    ]);
    // Hand calculation: monitor = part / TF (H: TF 0.75, L: TF 1.2); QWOT = 4·n·d/600; time = d / rate.
    expect(rows).toEqual([
      [1, 'Sheet H 2.0', 15, 20, 0.266667, 80],
      [2, 'Sheet L 1.5', 30, 25, 0.25, 50],
      [3, 'Sheet H 2.0', 60, 80, 1.066667, 320],
      [4, 'Sheet L 1.5', 120, 100, 1, 200],
    ]);
    expect(res.body.totals.timeS).toBeCloseTo(650, 9);
    expect(res.body.recipe).toMatchObject({ name: 'Sheet check', number: 1 });
    expect(res.body.cautions.join(' ')).toMatch(/high voltage/);
  });

  it('prints as a PDF', async () => {
    const res = await binary(
      http().get(`/api/recipes/${recipeId}/1/run-sheet.pdf?chamberId=${chamberId}`).set('Cookie', operator),
    );
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect((res.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
  });

  it('names the substrate, part, quantity and sides, and carries each layer’s process setting', async () => {
    const res = await http()
      .get(
        `/api/recipes/${recipeId}/1/run-sheet?chamberId=${chamberId}&part=${encodeURIComponent('  BW-7 window ')}&quantity=24&substrateThicknessMm=2.2&sides=front`,
      )
      .set('Cookie', operator);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.substrate).toEqual({ material: 'N-BK7', thicknessMm: 2.2, designThicknessMm: 2 });
    expect(res.body.job).toEqual({ part: 'BW-7 window', quantity: 24, sides: 'front' });
    expect(res.body.shop).toEqual({ name: 'Larkspur Thin Film Works', hasLogo: false });
    // The set saved above keeps only Sheet H 2.0 (300 °C): steps 1 and 3 are H, 2 and 4 are L.
    expect(
      res.body.layers.map(
        (l: { process: { substrateTemperatureC: number } | null }) =>
          l.process?.substrateTemperatureC ?? null,
      ),
    ).toEqual([300, null, 300, null]);
    const plain = await http()
      .get(`/api/recipes/${recipeId}/1/run-sheet?chamberId=${chamberId}`)
      .set('Cookie', operator);
    expect(plain.body.job).toEqual({ part: '', quantity: null, sides: 'front' });
    expect(plain.body.substrate.thicknessMm).toBe(2);
  });

  it.each([
    ['quantity=0', 'quantity: At least 1'],
    ['quantity=2.5', 'quantity: A whole number of parts'],
    ['substrateThicknessMm=-1', 'substrateThicknessMm: Must be more than 0 mm'],
    ['substrateThicknessMm=abc', 'substrateThicknessMm: A number in mm'],
    [`part=${'p'.repeat(81)}`, 'part: At most 80 characters'],
    ['sides=back', 'sides: sides must be one of front, both'],
    ['colour=red', 'Unrecognized key: "colour"'],
    [
      'sides=both',
      'sides: this design leaves the back surface uncoated; coating both sides would not be the approved design',
    ],
  ])('refuses a run sheet with %s (400)', async (q, detail) => {
    for (const suffix of ['run-sheet', 'run-sheet.pdf']) {
      const res = await http()
        .get(`/api/recipes/${recipeId}/1/${suffix}?chamberId=${chamberId}&${q}`)
        .set('Cookie', operator);
      expect(res.status).toBe(400);
      expect(res.body.details).toContain(detail);
    }
  });

  it('refuses a run sheet without a chamber, and publishes its query parameters in the OpenAPI description', async () => {
    const res = await http().get(`/api/recipes/${recipeId}/1/run-sheet`).set('Cookie', operator);
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual(['chamberId: Choose a chamber']);
    type Parameter = { name: string; in: string; required: boolean; schema: { maximum?: number } };
    const doc = (await http().get('/api/docs-json')).body as {
      paths: Record<string, Record<string, { parameters: Parameter[] }>>;
    };
    for (const p of ['/api/recipes/{id}/{number}/run-sheet', '/api/recipes/{id}/{number}/run-sheet.pdf']) {
      const query = doc.paths[p]!['get']!.parameters.filter((x) => x.in === 'query');
      expect(query.map((x) => x.name).sort()).toEqual([
        'chamberId',
        'monitorWavelengthNm',
        'part',
        'quantity',
        'sides',
        'substrateThicknessMm',
      ]);
      expect(query.find((x) => x.name === 'chamberId')!.required).toBe(true);
      expect(query.find((x) => x.name === 'quantity')).toMatchObject({
        required: false,
        schema: { maximum: 100000 },
      });
    }
  });

  it('prints the shop name and job on the PDF, page-numbered', async () => {
    const res = await binary(
      http()
        .get(`/api/recipes/${recipeId}/1/run-sheet.pdf?chamberId=${chamberId}&part=BW-7&quantity=24`)
        .set('Cookie', operator),
    );
    expect(res.status).toBe(200);
    const pages = pageTexts(res.body as Buffer);
    expect(pages[0]).toContain('Larkspur Thin Film Works');
    expect(pages[0]).toMatch(/Quantity\s+24 pcs/);
    const words = wordBoxes(res.body as Buffer)
      .filter((w) => w.page === 1)
      .map((w) => w.text)
      .join(' ');
    expect(words).toContain('Monitor QWOT at 600 nm');
    expect(pages[0]).toContain('Substrate at 300 °C');
    pages.forEach((p, i) => expect(p).toContain(`Page ${i + 1} of ${pages.length}`));
  });

  it('writes page 1 of the demo recipe on the demo chamber for the README when asked', async () => {
    const out = process.env.QG_RUN_SHEET_PNG;
    if (!out) return;
    const recipes = (await http().get('/api/recipes').set('Cookie', operator)).body as {
      designId: number;
      number: number;
      name: string;
    }[];
    const demo = recipes.find((r) => r.name === 'HVS-2210 four-layer AR')!;
    const b2 = (await http().get('/api/chambers').set('Cookie', operator)).body.find(
      (c: { name: string }) => c.name === 'Box coater B2',
    );
    const res = await binary(
      http()
        .get(
          `/api/recipes/${demo.designId}/${demo.number}/run-sheet.pdf?chamberId=${b2.id}&part=HVS-2210-L3&quantity=48`,
        )
        .set('Cookie', operator),
    );
    expect(res.status).toBe(200);
    pagePngs(res.body as Buffer, 110).forEach((png, i) =>
      writeFileSync(out.replace('.png', `-${i + 1}.png`), png),
    );
  });

  it('has no run sheet for a draft, and names a material the chamber lacks', async () => {
    const draft = await http()
      .post('/api/designs')
      .set('Cookie', mira)
      .send({
        name: 'Not released',
        customerId: await customerId(app, mira, 'Brightwater Instruments'),
        incidentMaterialId: m['Air'],
        substrateMaterialId: m['N-BK7'],
        substrateThicknessMm: 2,
        backSurface: 'bare',
        referenceWavelengthNm: 550,
        layers: [{ materialId: m['MgF2'], thicknessNm: 99 }],
      });
    const none = await http()
      .get(`/api/recipes/${draft.body.id}/1/run-sheet?chamberId=${chamberId}`)
      .set('Cookie', operator);
    expect(none.status).toBe(404);
    const b2 = (await http().get('/api/chambers').set('Cookie', operator)).body.find(
      (c: { name: string }) => c.name === 'Box coater B2',
    );
    const lacking = await http()
      .get(`/api/recipes/${recipeId}/1/run-sheet?chamberId=${b2.id}`)
      .set('Cookie', operator);
    expect(lacking.status).toBe(400);
    expect(lacking.body.details[0]).toMatch(/the chamber has no tooling factor and rate for Sheet H 2.0/);
  });
});
