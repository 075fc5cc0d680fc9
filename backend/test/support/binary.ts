import type { Test } from 'supertest';

/** Reads a response body as raw bytes (PDFs, attachments) instead of text. */
export function binary(req: Test): Test {
  return req.buffer(true).parse((res, cb) => {
    const chunks: Buffer[] = [];
    res.on('data', (c: Buffer) => chunks.push(c));
    res.on('end', () => cb(null, Buffer.concat(chunks)));
  });
}
