import {
  BadRequestException,
  ForbiddenException,
  Injectable,
  type ArgumentMetadata,
  type PipeTransform,
} from '@nestjs/common';
import type { NextFunction, Request, Response } from 'express';
import { CSRF_HEADER } from '@quietglass/shared';

/** Deepest nesting of arrays and objects a JSON body may have (the deepest real body is ~6). */
export const MAX_JSON_DEPTH = 32;
/** Largest id PostgreSQL's `integer` holds. */
export const MAX_ID = 2 ** 31 - 1;

const STATE_CHANGING = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/** Raised by checkJsonDepth; the exception filter answers it with 400. */
export class JsonTooDeepError extends Error {
  constructor() {
    super(`The request body nests deeper than ${MAX_JSON_DEPTH} levels`);
  }
}

/**
 * Throws before JSON.parse runs when the raw body nests deeper than MAX_JSON_DEPTH: one pass over
 * the bytes, skipping string contents. Used as body-parser's `verify`.
 */
export function checkJsonDepth(_req: unknown, _res: unknown, buf: Buffer): void {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < buf.length; i += 1) {
    const c = buf[i];
    if (inString) {
      if (c === 0x5c)
        i += 1; // backslash: skip the escaped byte
      else if (c === 0x22) inString = false;
    } else if (c === 0x22) inString = true;
    else if (c === 0x7b || c === 0x5b) {
      depth += 1;
      if (depth > MAX_JSON_DEPTH) {
        throw new JsonTooDeepError();
      }
    } else if (c === 0x7d || c === 0x5d) depth -= 1;
  }
}

/** Path of the first string holding a NUL character, or null. */
function nulPath(value: unknown, path: string, depth = 0): string | null {
  if (typeof value === 'string') return value.includes('\u0000') ? path : null;
  if (depth > MAX_JSON_DEPTH || value === null || typeof value !== 'object') return null;
  if (Buffer.isBuffer(value)) return null;
  for (const [key, inner] of Object.entries(value)) {
    if (key.includes('\u0000')) return path;
    const found = nulPath(inner, path ? `${path}.${key}` : key, depth + 1);
    if (found !== null) return found;
  }
  return null;
}

/**
 * Global pipe, run before every other pipe: refuses NUL characters in any body, query or route
 * parameter (PostgreSQL text cannot hold them), and route ids beyond PostgreSQL's integer range.
 */
@Injectable()
export class RequestHygienePipe implements PipeTransform {
  transform(value: unknown, meta: ArgumentMetadata): unknown {
    if (meta.type === 'custom') return value;
    const where = nulPath(value, meta.data ?? '');
    if (where !== null)
      throw new BadRequestException(`${where || meta.type} must not contain NUL characters`);
    if (meta.type === 'param' && typeof value === 'string' && /^\d+$/.test(value) && Number(value) > MAX_ID) {
      throw new BadRequestException(`${meta.data ?? 'id'} ${value} is out of range (at most ${MAX_ID})`);
    }
    return value;
  }
}

function sameOrigin(origin: string, req: Request): boolean {
  try {
    return new URL(origin).host === req.headers.host;
  } catch {
    return false;
  }
}

/**
 * Cross-site request forgery guard for every state-changing API request made with the session
 * cookie: it must carry the CSRF header (only the Quietglass client sets it; a cross-site form
 * cannot) and, when the browser names an origin, come from this one. Bearer-token requests carry
 * no ambient credential and are exempt.
 */
export function csrfGuard(req: Request, _res: Response, next: NextFunction): void {
  if (!STATE_CHANGING.has(req.method) || !req.path.startsWith('/api/')) return next();
  if (req.headers.authorization?.startsWith('Bearer ')) return next();
  const origin = req.headers.origin;
  const fetchSite = req.headers['sec-fetch-site'];
  if ((origin && !sameOrigin(origin, req)) || fetchSite === 'cross-site') {
    return next(new ForbiddenException('Cross-site requests are not accepted'));
  }
  if (req.headers[CSRF_HEADER] !== '1') {
    return next(new ForbiddenException(`State-changing requests must carry the ${CSRF_HEADER}: 1 header`));
  }
  next();
}
