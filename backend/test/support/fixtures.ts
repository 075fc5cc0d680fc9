import type { INestApplication } from '@nestjs/common';
import request from 'supertest';

/** Material ids of the demo library by name. */
export async function materialIds(app: INestApplication, cookie: string): Promise<Record<string, number>> {
  const res = await request(app.getHttpServer()).get('/api/materials').set('Cookie', cookie);
  return Object.fromEntries((res.body as { id: number; name: string }[]).map((m) => [m.name, m.id]));
}

export async function customerId(app: INestApplication, cookie: string, name: string): Promise<number> {
  const res = await request(app.getHttpServer()).get('/api/customers').set('Cookie', cookie);
  const found = (res.body as { id: number; name: string }[]).find((c) => c.name === name);
  if (!found) throw new Error(`no customer ${name}`);
  return found.id;
}

/** A two-layer MgF2/ZrO2 AR draft on N-BK7 in air, the usual shape of a design request. */
export function twoLayerDesign(m: Record<string, number>, customer: number, name = 'V-coat 550') {
  return {
    name,
    customerId: customer,
    incidentMaterialId: m['Air'],
    substrateMaterialId: m['N-BK7'],
    substrateThicknessMm: 3,
    backSurface: 'bare',
    referenceWavelengthNm: 550,
    layers: [
      { materialId: m['MgF2'], thicknessNm: 99.6 },
      { materialId: m['ZrO2'], thicknessNm: 67.1, locked: true, notes: 'adhesion layer' },
    ],
  };
}

/** The version content of a design request (what a save of the Layer grid sends). */
export function versionContent(design: ReturnType<typeof twoLayerDesign>) {
  const { name: _name, customerId: _customer, ...content } = design;
  return content;
}

/** A spec mask of a customer by name (lists are sorted by name, and other tests add masks). */
export async function maskId(
  app: INestApplication,
  cookie: string,
  customer: number,
  name: string,
): Promise<number> {
  const res = await request(app.getHttpServer())
    .get(`/api/spec-masks?customerId=${customer}`)
    .set('Cookie', cookie);
  const found = (res.body as { id: number; name: string }[]).find((m) => m.name === name);
  if (!found) throw new Error(`customer ${customer} has no spec mask ${name}`);
  return found.id;
}
