import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';

/** A JSON Schema as the OpenAPI description publishes a request body (the parts the tests read). */
export interface PublishedSchema {
  properties: Record<
    string,
    PublishedSchema & { maximum?: number; maxLength?: number; items?: PublishedSchema; enum?: string[] }
  >;
  required?: string[];
}

/**
 * The request-body schemas of the OpenAPI description at /api/docs-json: `bodyOf('post',
 * '/api/chambers')` is the JSON body that route publishes.
 */
export async function publishedBodies(
  app: NestExpressApplication,
): Promise<(method: string, path: string) => PublishedSchema> {
  const doc = (await request(app.getHttpServer()).get('/api/docs-json')).body as {
    paths: Record<
      string,
      Record<string, { requestBody: { content: { 'application/json': { schema: PublishedSchema } } } }>
    >;
  };
  return (method, path) => doc.paths[path]![method]!.requestBody.content['application/json'].schema;
}
