import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';

/** A request body's JSON Schema as the OpenAPI description publishes it (the parts tests read). */
export interface BodySchema {
  type?: string | string[];
  properties: Record<string, BodySchema>;
  required?: string[];
  items?: BodySchema;
  maximum?: number;
  maxItems?: number;
  maxLength?: number;
  enum?: string[];
  format?: string;
}

type Description = {
  paths: Record<
    string,
    Record<string, { requestBody?: { content: Record<string, { schema: BodySchema } | undefined> } }>
  >;
};

/**
 * Reads the published OpenAPI description once and returns the JSON body schema of a route, e.g.
 * `bodyOf('put', '/api/chambers/{id}')`; a route without one fails the test by name.
 */
export async function requestBodies(
  app: NestExpressApplication,
): Promise<(method: string, path: string) => BodySchema> {
  const doc = (await request(app.getHttpServer()).get('/api/docs-json')).body as Description;
  return (method, path) => {
    const schema = doc.paths[path]?.[method]?.requestBody?.content['application/json']?.schema;
    if (!schema) throw new Error(`The OpenAPI description has no JSON body for ${method} ${path}`);
    return schema;
  };
}
