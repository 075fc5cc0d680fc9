import type { NestExpressApplication } from '@nestjs/platform-express';
import { PDFParse } from 'pdf-parse';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { approvedDesign } from './support/approved.js';
import { binary } from './support/binary.js';
import { createTestApp, demoSession } from './support/app.js';
import { overlappingWords, pagePngs, pageTexts, wordBoxes } from './support/pdf-pages.js';
import { customerId, maskId, materialIds } from './support/fixtures.js';
import { requestBodies } from './support/openapi.js';

let app: NestExpressApplication;
let sales: string;
let mira: string;
let tomas: string;
let admin: string;
let designId: number;
let halden: number;
let haldenMask: number;

const http = () => request(app.getHttpServer());
/** How many quotes and reports are stored: a refused request writes neither. */
async function counts() {
  const [row] = await app
    .get(DataSource)
    .query('SELECT (SELECT count(*) FROM quotes) AS q, (SELECT count(*) FROM compliance_reports) AS r');
  return { quotes: Number(row.q), reports: Number(row.r) };
}
async function pdfText(buf: Buffer): Promise<string> {
  const parser = new PDFParse({ data: new Uint8Array(buf) });
  try {
    return (await parser.getText()).text;
  } finally {
    await parser.destroy();
  }
}
const inDays = (d: number) => new Date(Date.now() + d * 86_400_000).toISOString().slice(0, 10);

beforeAll(async () => {
  app = await createTestApp();
  sales = await demoSession(app, 'sales');
  mira = await demoSession(app, 'engineer', 0);
  tomas = await demoSession(app, 'engineer', 1);
  admin = await demoSession(app, 'admin');
  const m = await materialIds(app, mira);
  halden = await customerId(app, mira, 'Halden Vision Systems');
  haldenMask = await maskId(app, mira, halden, 'HVS-2210 lens AR');
  designId = await approvedDesign(app, mira, tomas, lensDesign(m, 'HVS lens AR', haldenMask));
});

/** Halden's single-layer MgF2 lens design aimed at `specMaskId`. */
function lensDesign(m: Record<string, number>, name: string, specMaskId: number) {
  return {
    name,
    customerId: halden,
    specMaskId,
    incidentMaterialId: m['Air'],
    substrateMaterialId: m['N-BK7'],
    substrateThicknessMm: 3,
    backSurface: 'front-only',
    referenceWavelengthNm: 550,
    layers: [{ materialId: m['MgF2'], thicknessNm: 99.6 }],
  };
}
afterAll(async () => {
  await app.close();
});

const quoteBody = () => ({
  customerId: halden,
  contactEmail: 'Buyer@Halden-Vision.example',
  designId,
  versionNumber: 1,
  partDescription: 'Ø25 mm N-BK7 lens, AR both sides',
  quantityBreaks: [
    { minQuantity: 10, unitPrice: 42.5 },
    { minQuantity: 100, unitPrice: 31 },
  ],
  currency: 'EUR',
  leadTimeDays: 21,
  validUntil: inDays(30),
  terms: 'Ex works. Payment 30 days net.',
});

describe('compliance reports', () => {
  it('a single MgF2 layer fails the 0.5 % mask: the PDF states each band’s worst margin and FAIL, and the layers', async () => {
    const res = await http().post('/api/reports').set('Cookie', sales).send({ designId, versionNumber: 1 });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    // A single quarter-wave MgF2 layer on N-BK7 reflects about 1.3 % at its design wavelength
    // (Macleod, Thin-Film Optical Filters, ch. 2: 1.26 % for ns = 1.52), so R ≤ 0.5 % cannot hold.
    expect(res.body.summary).toMatchObject({ source: 'designed', pass: false });
    const band = res.body.summary.bands[0];
    expect(band.worstMargin).toBeLessThan(-0.7);
    const pdf = await binary(http().get(`/api/reports/${res.body.id}/pdf`).set('Cookie', sales));
    expect(pdf.headers['content-type']).toBe('application/pdf');
    const text = await pdfText(pdf.body as Buffer);
    expect(text).toContain('Spec compliance report');
    // Negative margins print with a true minus sign (U+2212).
    expect(text).toContain(band.worstMargin.toFixed(3).replace('-', '−'));
    expect(text).toMatch(/FAIL/);
    expect(text).toContain('Designed values');
    expect(text).toContain('MgF2');

    // Read back as a person would (poppler-utils): the header, the symbols, page numbers, no overlaps.
    const pages = pageTexts(pdf.body as Buffer);
    const first = pages[0];
    const today = new Date().toISOString().slice(0, 10);
    expect(first).toContain('Larkspur Thin Film Works');
    expect(first).toMatch(/Customer\s+Halden Vision Systems/);
    expect(first).toMatch(new RegExp(`Document no\\.\\s+CR-${String(res.body.id).padStart(6, '0')}`));
    expect(first).toMatch(/Part \/ design\s+HVS lens AR/);
    expect(first).toMatch(/Design version\s+1/);
    expect(first).toMatch(/Spec mask\s+HVS-2210 lens AR/);
    expect(first).toMatch(/Mask revision\s+A/);
    // Approved by the reviewer of approvedDesign(), today.
    expect(first).toMatch(/Approved by\s+Tomas Reyes/);
    expect(first).toMatch(new RegExp(`Approved on\\s+${today}`));
    expect(first).toMatch(/Values\s+Designed values/);
    expect(pages.join('\n')).toContain(band.rule);
    expect(band.rule).toMatch(/^R ≤ 0\.5 % over \d+–\d+ nm$/);
    pages.forEach((p, i) => expect(p).toContain(`Page ${i + 1} of ${pages.length}`));
    expect(overlappingWords(wordBoxes(pdf.body as Buffer))).toEqual([]);
    const png = pagePngs(pdf.body as Buffer)[0];
    expect(png!.subarray(1, 4).toString('latin1')).toBe('PNG');
  });

  it('hides the layer table when asked', async () => {
    const res = await http()
      .post('/api/reports')
      .set('Cookie', sales)
      .send({ designId, versionNumber: 1, hideLayers: true });
    const pdf = await binary(http().get(`/api/reports/${res.body.id}/pdf`).set('Cookie', sales));
    const text = await pdfText(pdf.body as Buffer);
    expect(text).toContain('The layer design is not disclosed in this report.');
    expect(text).not.toContain('Layers (incident side first)');
    expect(text).not.toContain('99.60 nm');
  });

  it.each([
    [{ runId: 31 }, 'spectrumId: Give the run and its spectrum together'],
    [{ spectrumId: 2 }, 'runId: Give the run and its spectrum together'],
    [{ hideLayers: 'yes' }, 'hideLayers: hideLayers must be true or false'],
    [{ versionNumber: 'one' }, 'versionNumber: Choose an approved version'],
    [{ pages: 2 }, 'Unrecognized key: "pages"'],
  ])('refuses the report request %j with 400 and writes nothing', async (patch, detail) => {
    const before = await counts();
    const res = await http()
      .post('/api/reports')
      .set('Cookie', sales)
      .send({ designId, versionNumber: 1, ...patch });
    expect(res.status).toBe(400);
    expect(res.body.details).toContain(detail);
    expect(await counts()).toEqual(before);
  });

  it('publishes the shared report schema as the request body in the OpenAPI description', async () => {
    const create = (await requestBodies(app))('post', '/api/reports');
    expect(create.required?.sort()).toEqual(['designId', 'versionNumber']);
    expect(Object.keys(create.properties).sort()).toEqual([
      'designId',
      'hideLayers',
      'runId',
      'specMaskId',
      'spectrumId',
      'versionNumber',
    ]);
  });

  it('refuses a draft version', async () => {
    const m = await materialIds(app, mira);
    const draft = await http()
      .post('/api/designs')
      .set('Cookie', mira)
      .send({
        name: 'Draft only',
        customerId: halden,
        specMaskId: haldenMask,
        incidentMaterialId: m['Air'],
        substrateMaterialId: m['N-BK7'],
        substrateThicknessMm: 3,
        backSurface: 'front-only',
        referenceWavelengthNm: 550,
        layers: [{ materialId: m['MgF2'], thicknessNm: 99.6 }],
      });
    const res = await http()
      .post('/api/reports')
      .set('Cookie', sales)
      .send({ designId: draft.body.id, versionNumber: 1 });
    expect(res.status).toBe(400);
    expect(res.body.details[0]).toMatch(/is draft; compliance reports are for approved or released versions/);
  });
});

describe('quotes', () => {
  it.each([
    [
      { quantityBreaks: [{ minQuantity: 10, unitPrice: -1 }] },
      'quantityBreaks.0.unitPrice: The unit price must not be negative',
    ],
    [
      { quantityBreaks: [{ minQuantity: 10, unitPrice: 1.23456 }] },
      'quantityBreaks.0.unitPrice: At most 4 decimals',
    ],
    [
      { validUntil: '2020-01-01' },
      expect.stringMatching(
        /^validUntil: The validity date must be in the future \(after \d{4}-\d\d-\d\d\)$/,
      ),
    ],
    [{ currency: 'euro' }, 'currency: A three-letter ISO 4217 code such as EUR or USD'],
    [{ contactEmail: 'buyer at halden' }, 'contactEmail: Enter a valid e-mail address'],
    [{ partDescription: ' ' }, 'partDescription: Describe the part'],
    [{ discount: 5 }, 'Unrecognized key: "discount"'],
    [{ versionNumber: 9 }, `versionNumber: design ${0} has no version 9`],
    [
      {
        quantityBreaks: [
          { minQuantity: 100, unitPrice: 1 },
          { minQuantity: 10, unitPrice: 2 },
        ],
      },
      'quantityBreaks.1.minQuantity: Each break needs a larger quantity than the one before',
    ],
  ])('rejects %j with 400 and writes nothing', async (patch, detail) => {
    const before = await counts();
    const res = await http()
      .post('/api/quotes')
      .set('Cookie', sales)
      .send({ ...quoteBody(), ...patch });
    expect(res.status).toBe(400);
    const expected = typeof detail === 'string' ? detail.replace('design 0', `design ${designId}`) : detail;
    expect(res.body.details).toContainEqual(expected);
    expect(await counts()).toEqual(before);
  });

  it('publishes the shared quote schemas as the request bodies in the OpenAPI description', async () => {
    const bodyOf = await requestBodies(app);
    const create = bodyOf('post', '/api/quotes');
    expect(create.required).not.toContain('specMaskId');
    expect(create.required).toContain('quantityBreaks');
    expect(create.properties.quantityBreaks!.maxItems).toBe(20);
    expect(create.properties.quantityBreaks!.items!.properties.unitPrice!.maximum).toBe(1e9);
    expect(create.properties.quantityBreaks!.items!.required?.sort()).toEqual(['minQuantity', 'unitPrice']);
    expect(bodyOf('put', '/api/quotes/{id}').required).toContain('version');
    expect(bodyOf('post', '/api/quotes/{id}/reports').required).toEqual(['reportIds']);
    expect(bodyOf('post', '/api/quotes/{id}/decision').required).toEqual(['status']);
  });

  it('refuses a quote on a version that is not approved', async () => {
    const m = await materialIds(app, mira);
    const draft = await http()
      .post('/api/designs')
      .set('Cookie', mira)
      .send({
        name: 'Unapproved',
        customerId: halden,
        specMaskId: haldenMask,
        incidentMaterialId: m['Air'],
        substrateMaterialId: m['N-BK7'],
        substrateThicknessMm: 3,
        backSurface: 'front-only',
        referenceWavelengthNm: 550,
        layers: [{ materialId: m['MgF2'], thicknessNm: 99.6 }],
      });
    const res = await http()
      .post('/api/quotes')
      .set('Cookie', sales)
      .send({ ...quoteBody(), designId: draft.body.id });
    expect(res.status).toBe(400);
    expect(res.body.details).toContain('versionNumber: version 1 is draft; quotes need an approved version');
  });

  it('sales create a quote, attach a report and send it: the SMTP fake receives it with the PDF attached', async () => {
    const quote = await http().post('/api/quotes').set('Cookie', sales).send(quoteBody());
    expect(quote.status).toBe(201);
    expect(quote.body).toMatchObject({
      status: 'draft',
      contactEmail: 'buyer@halden-vision.example',
      currency: 'EUR',
    });
    const report = await http()
      .post('/api/reports')
      .set('Cookie', sales)
      .send({ designId, versionNumber: 1, hideLayers: true });
    const notIds = await http()
      .post(`/api/quotes/${quote.body.id}/reports`)
      .set('Cookie', sales)
      .send({ reportIds: ['R-1'] });
    expect(notIds.status).toBe(400);
    expect(notIds.body.details).toEqual(['reportIds.0: reportIds must hold report ids']);
    const attached = await http()
      .post(`/api/quotes/${quote.body.id}/reports`)
      .set('Cookie', sales)
      .send({ reportIds: [report.body.id] });
    expect(attached.body.reportIds).toEqual([report.body.id]);
    const sent = await http().post(`/api/quotes/${quote.body.id}/send`).set('Cookie', sales);
    expect(sent.status, JSON.stringify(sent.body)).toBe(201);
    expect(sent.body.status).toBe('sent');

    const outbox = await http().get('/api/outbox').set('Cookie', admin);
    const message = outbox.body.find((msg: { subject: string }) =>
      msg.subject.startsWith(`Quote Q-${quote.body.id}:`),
    );
    expect(message).toBeDefined();
    expect(message.to).toContain('buyer@halden-vision.example');
    expect(message.text).toContain('from 100 pcs: 31.00 EUR per part');
    expect(message.attachments).toEqual([
      expect.objectContaining({
        filename: `compliance-report-${report.body.id}.pdf`,
        contentType: 'application/pdf',
      }),
    ]);
    const file = await binary(
      http().get(`/api/outbox/${message.id}/attachments/${message.attachments[0].id}`).set('Cookie', admin),
    );
    expect((file.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
    expect(await pdfText(file.body as Buffer)).toContain('Spec compliance report');

    // Sent quotes are not edited and not sent twice; the customer's answer is recorded.
    expect((await http().post(`/api/quotes/${quote.body.id}/send`).set('Cookie', sales)).status).toBe(409);
    const unclear = await http()
      .post(`/api/quotes/${quote.body.id}/decision`)
      .set('Cookie', sales)
      .send({ status: 'maybe' });
    expect(unclear.status).toBe(400);
    expect(unclear.body.details).toEqual(['status: status must be accepted or declined']);
    const accepted = await http()
      .post(`/api/quotes/${quote.body.id}/decision`)
      .set('Cookie', sales)
      .send({ status: 'accepted' });
    expect(accepted.body.status).toBe('accepted');
    expect(accepted.body.history.map((h: { action: string }) => h.action)).toEqual([
      'created',
      'reports attached',
      'sent',
      'accepted',
    ]);
  });

  it('engineers read quotes; operators are refused prices; engineers cannot send', async () => {
    const quote = await http().post('/api/quotes').set('Cookie', sales).send(quoteBody());
    expect(
      (await http().get(`/api/quotes/${quote.body.id}`).set('Cookie', mira)).body.quantityBreaks,
    ).toHaveLength(2);
    expect((await http().post(`/api/quotes/${quote.body.id}/send`).set('Cookie', mira)).status).toBe(403);
    const operator = await demoSession(app, 'operator');
    expect((await http().get('/api/quotes').set('Cookie', operator)).status).toBe(403);
    expect((await http().get(`/api/quotes/${quote.body.id}`).set('Cookie', operator)).status).toBe(403);
  });
});

describe('a failed send', () => {
  it('leaves the quote a draft with the error shown, never "sent"', async () => {
    const quote = await http().post('/api/quotes').set('Cookie', sales).send(quoteBody());
    // A second API whose SMTP server is unreachable (nothing listens on port 9 of loopback).
    process.env.SMTP_URL = 'smtp://127.0.0.1:9';
    const broken = await createTestApp();
    delete process.env.SMTP_URL;
    try {
      const res = await request(broken.getHttpServer())
        .post(`/api/quotes/${quote.body.id}/send`)
        .set('Cookie', sales);
      expect(res.status).toBe(400);
      expect(res.body.message).toMatch(/^The e-mail could not be sent; the quote stays a draft: /);
      const after = await http().get(`/api/quotes/${quote.body.id}`).set('Cookie', sales);
      expect(after.body.status).toBe('draft');
      expect(after.body.lastSendError).toMatch(/ECONNREFUSED|connect/i);
      expect(after.body.history.at(-1).action).toBe('send failed');
    } finally {
      await broken.close();
    }
  });
});

describe('quotes under concurrency', () => {
  it('five concurrent sends deliver one e-mail and record one send', async () => {
    const quote = await http().post('/api/quotes').set('Cookie', sales).send(quoteBody());
    expect(quote.status).toBe(201);
    const results = await Promise.all(
      Array.from({ length: 5 }, () => http().post(`/api/quotes/${quote.body.id}/send`).set('Cookie', sales)),
    );
    expect(results.map((r) => r.status).sort()).toEqual([201, 409, 409, 409, 409]);
    const outbox = await http().get('/api/outbox').set('Cookie', admin);
    const messages = outbox.body.filter((msg: { subject: string }) =>
      msg.subject.startsWith(`Quote Q-${quote.body.id}:`),
    );
    expect(messages).toHaveLength(1);
    const now = await http().get(`/api/quotes/${quote.body.id}`).set('Cookie', sales);
    expect(now.body.history.filter((e: { action: string }) => e.action === 'sent')).toHaveLength(1);
    const audit = await http().get(`/api/audit?entity=quote&entityId=${quote.body.id}`).set('Cookie', admin);
    expect(audit.body.map((e: { action: string }) => e.action)).toEqual(['sent', 'created']);
  });

  it('in 30 rounds of two concurrent edits with one version token exactly one wins, whole', async () => {
    for (let round = 0; round < 30; round++) {
      const quote = await http().post('/api/quotes').set('Cookie', sales).send(quoteBody());
      const version = quote.body.version as number;
      const [a, b] = await Promise.all([
        http()
          .put(`/api/quotes/${quote.body.id}`)
          .set('Cookie', sales)
          .send({ ...quoteBody(), leadTimeDays: 10, terms: 'edit A', version }),
        http()
          .put(`/api/quotes/${quote.body.id}`)
          .set('Cookie', sales)
          .send({ ...quoteBody(), leadTimeDays: 20, terms: 'edit B', version }),
      ]);
      expect([a.status, b.status].sort(), `round ${round}`).toEqual([200, 409]);
      const winner =
        a.status === 200 ? { leadTimeDays: 10, terms: 'edit A' } : { leadTimeDays: 20, terms: 'edit B' };
      const now = await http().get(`/api/quotes/${quote.body.id}`).set('Cookie', sales);
      expect(now.body).toMatchObject({ ...winner, version: version + 1 });
      expect(now.body.history.filter((e: { action: string }) => e.action === 'edited')).toHaveLength(1);
    }
  });
});

describe('internal design targets and archived customers', () => {
  const internalTarget = async (revision: string) => {
    const res = await http()
      .post('/api/spec-masks')
      .set('Cookie', mira)
      .send({
        name: 'HVS lens AR design target',
        customerId: halden,
        revision,
        kind: 'internal',
        bands: [{ from_nm: 450, to_nm: 650, quantity: 'R', max_percent: 0.4, step_nm: 10 }],
      });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.kind).toBe('internal');
    return res.body.id as number;
  };

  it('a report or quote against an internal design target is refused with 400 and writes nothing', async () => {
    const target = await internalTarget('T1');
    const before = await counts();
    const report = await http()
      .post('/api/reports')
      .set('Cookie', sales)
      .send({ designId, versionNumber: 1, specMaskId: target });
    expect(report.status).toBe(400);
    expect(report.body.details[0]).toBe(
      `specMaskId: spec mask "HVS lens AR design target" rev T1 is an internal design target; reports and quotes use the customer's specification, choose a customer mask`,
    );
    const quote = await http()
      .post('/api/quotes')
      .set('Cookie', sales)
      .send({ ...quoteBody(), specMaskId: target });
    expect(quote.status).toBe(400);
    expect(quote.body.details).toContainEqual(expect.stringMatching(/is an internal design target/));
    expect(await counts()).toEqual(before);
  });

  it('a design aimed at an internal target does not lend it to the report by default', async () => {
    const target = await internalTarget('T2');
    const m = await materialIds(app, mira);
    const aimed = await approvedDesign(app, mira, tomas, lensDesign(m, 'HVS lens AR tight', target));
    const before = await counts();
    const res = await http()
      .post('/api/reports')
      .set('Cookie', sales)
      .send({ designId: aimed, versionNumber: 1 });
    expect(res.status).toBe(400);
    expect(res.body.details[0]).toMatch(/\(the design's mask\) is an internal design target/);
    expect(await counts()).toEqual(before);
    // Naming the customer's own mask works.
    const ok = await http()
      .post('/api/reports')
      .set('Cookie', sales)
      .send({ designId: aimed, versionNumber: 1, specMaskId: haldenMask });
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
  });

  it('an archived customer gets no new quote or mask (409) and keeps its quotes', async () => {
    const existing = await http().post('/api/quotes').set('Cookie', sales).send(quoteBody());
    expect(existing.status).toBe(201);
    const customer = (await http().get(`/api/customers/${halden}`).set('Cookie', sales)).body;
    const archived = await http()
      .post(`/api/customers/${halden}/archive`)
      .set('Cookie', sales)
      .send({ version: customer.version });
    expect(archived.status).toBe(201);
    try {
      const before = await counts();
      const quote = await http().post('/api/quotes').set('Cookie', sales).send(quoteBody());
      expect(quote.status).toBe(409);
      expect(quote.body.message).toBe(
        'Customer "Halden Vision Systems" is archived; restore it before adding new spec masks or quotes',
      );
      const mask = await http()
        .post('/api/spec-masks')
        .set('Cookie', mira)
        .send({
          name: 'After archive',
          customerId: halden,
          revision: 'A',
          bands: [{ from_nm: 450, to_nm: 650, quantity: 'R', max_percent: 1 }],
        });
      expect(mask.status).toBe(409);
      expect(await counts()).toEqual(before);
      expect((await http().get(`/api/quotes/${existing.body.id}`).set('Cookie', sales)).status).toBe(200);
    } finally {
      const restored = await http()
        .post(`/api/customers/${halden}/restore`)
        .set('Cookie', sales)
        .send({ version: archived.body.version });
      expect(restored.status).toBe(201);
    }
  });
});
