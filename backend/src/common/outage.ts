/*
 * Telling an outage of PostgreSQL or Redis from a bug: connection-level failures are reported as
 * 503 with a plain message by the API and retried by the worker, everything else is not.
 */

/** Socket-level error codes of a server that is down or went away. */
const SOCKET_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EPIPE',
  'EHOSTUNREACH',
  'ENOTFOUND',
]);

/** PostgreSQL SQLSTATEs of a server that is shutting down, starting up or dropped the connection. */
const PG_OUTAGE_STATES = new Set(['57P01', '57P02', '57P03', '53300']);

const PG_OUTAGE_MESSAGES = [
  'Connection terminated',
  'connection error',
  'timeout exceeded when trying to connect',
  'the database system is starting up',
  'the database system is shutting down',
  'Client was closed and is not queryable',
];

function fields(err: unknown): { code: string; message: string; cause: unknown } {
  if (typeof err !== 'object' || err === null) return { code: '', message: String(err), cause: undefined };
  const e = err as { code?: unknown; message?: unknown; cause?: unknown; driverError?: unknown };
  return {
    code: typeof e.code === 'string' ? e.code : '',
    message: typeof e.message === 'string' ? e.message : '',
    cause: e.driverError ?? e.cause,
  };
}

/** True when the error means PostgreSQL could not be reached or dropped the connection. */
export function isDatabaseOutage(err: unknown, depth = 0): boolean {
  const { code, message, cause } = fields(err);
  if (SOCKET_CODES.has(code) || PG_OUTAGE_STATES.has(code) || code.startsWith('08')) return true;
  if (PG_OUTAGE_MESSAGES.some((m) => message.includes(m))) return true;
  return depth < 3 && cause !== undefined && cause !== err ? isDatabaseOutage(cause, depth + 1) : false;
}

/** Raised where a Redis call did not answer in time or the connection is closed. */
export class QueueUnavailableError extends Error {
  constructor(what: string) {
    super(`The job queue (Redis) did not answer: ${what}`);
  }
}

/** True for Redis connection failures as ioredis reports them, and for QueueUnavailableError. */
export function isRedisOutage(err: unknown): boolean {
  if (err instanceof QueueUnavailableError) return true;
  const { message } = fields(err);
  return (
    message.includes('Connection is closed') || message.includes('Reached the max retries per request limit')
  );
}

/** An infrastructure outage (database or Redis) rather than a problem with the work itself. */
export function isOutage(err: unknown): boolean {
  return isDatabaseOutage(err) || isRedisOutage(err);
}

/** Rejects with QueueUnavailableError when `p` does not settle within `ms`. */
export function withDeadline<T>(p: Promise<T>, ms: number, what: string): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  return Promise.race([
    p,
    new Promise<T>((_, reject) => {
      timer = setTimeout(() => reject(new QueueUnavailableError(what)), ms);
    }),
  ]).finally(() => clearTimeout(timer));
}

/** The 503 messages users see. */
export const OUTAGE_MESSAGES = {
  database:
    'The database is not reachable right now, so nothing was read or saved. Try again in a minute; if it persists, tell the administrator.',
  redis:
    'The job queue (Redis) is not reachable right now, so nothing was queued. Try again in a minute; if it persists, tell the administrator.',
} as const;
