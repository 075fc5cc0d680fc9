import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { expect } from 'vitest';

/**
 * An approved design for a customer with the customer's first spec mask: written and submitted by
 * `author`, approved by `reviewer` (four-eyes), optionally released.
 */
export async function approvedDesign(
  app: INestApplication,
  author: string,
  reviewer: string,
  body: Record<string, unknown>,
  release = false,
): Promise<number> {
  const http = () => request(app.getHttpServer());
  const created = await http().post('/api/designs').set('Cookie', author).send(body);
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  const id = created.body.id as number;
  const steps: [string, string, object][] = [
    [author, 'submit', { rowVersion: 1 }],
    [reviewer, 'approve', {}],
    ...(release ? ([[reviewer, 'release', {}]] as [string, string, object][]) : []),
  ];
  for (const [cookie, action, payload] of steps) {
    const res = await http()
      .post(`/api/designs/${id}/versions/1/${action}`)
      .set('Cookie', cookie)
      .send(payload);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
  }
  return id;
}
