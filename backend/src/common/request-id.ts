import { randomUUID } from 'node:crypto';
import type { NextFunction, Request, Response } from 'express';
import { withLogFields } from './log-context.js';

/** The response header (and accepted request header) that names one request in the logs. */
export const REQUEST_ID_HEADER = 'x-request-id';

/** An id a proxy or client may pass on: short, letters, digits and dashes only (no log injection). */
const ACCEPTED = /^[A-Za-z0-9-]{8,64}$/;

/** The id of a request, set by `requestId`; undefined outside a request. */
export function requestIdOf(req: Request): string | undefined {
  return (req as Request & { requestId?: string }).requestId;
}

/**
 * Gives every request an id (the caller's `X-Request-Id` when it is well formed, else a new
 * UUID), answers it in the same header, and makes it available to the error filter and to every
 * log line written while the request is handled, so an error a user reports can be found in the
 * server log.
 */
export function requestId(req: Request, res: Response, next: NextFunction): void {
  const given = req.header(REQUEST_ID_HEADER);
  const id = given && ACCEPTED.test(given) ? given : randomUUID();
  (req as Request & { requestId?: string }).requestId = id;
  res.setHeader(REQUEST_ID_HEADER, id);
  withLogFields({ requestId: id }, next);
}
