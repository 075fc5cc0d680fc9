import type { INestApplication } from '@nestjs/common';
import request from 'supertest';

/** A JSON schema as the OpenAPI description publishes a request body (the parts the specs read). */
export interface PublishedSchema {
  type?: string;
  properties: Record<string, PublishedSchema & { maximum?: number; maxLength?: number }>;
  items?: PublishedSchema;
  required?: string[];
}

/** The request body schema the OpenAPI description gives for `method path` (path as documented). */
export async function requestBodySchema(
  app: INestApplication,
  method: 'post' | 'put' | 'patch',
  path: string,
): Promise<PublishedSchema> {
  const doc = (await request(app.getHttpServer()).get('/api/docs-json')).body as {
    paths: Record<
      string,
      Record<string, { requestBody: { content: { 'application/json': { schema: PublishedSchema } } } }>
    >;
  };
  const operation = doc.paths[path]?.[method];
  if (!operation) throw new Error(`the OpenAPI description has no ${method.toUpperCase()} ${path}`);
  return operation.requestBody.content['application/json'].schema;
}
