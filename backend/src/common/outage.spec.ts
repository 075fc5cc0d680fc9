import { QueryFailedError } from 'typeorm';
import { describe, expect, it } from 'vitest';
import { toErrorBody } from './http-exception.filter.js';
import { QueueUnavailableError, isDatabaseOutage, isOutage, withDeadline } from './outage.js';

// Error codes and messages as node-postgres and ioredis report them (their sources and the
// PostgreSQL manual, appendix A "PostgreSQL Error Codes": class 08 and 57P0x).
const refused = Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:5433'), { code: 'ECONNREFUSED' });
const shutdown = Object.assign(new Error('terminating connection due to administrator command'), {
  code: '57P01',
});

describe('outage classification', () => {
  it('treats refused connections, shutdown SQLSTATEs and dropped connections as a database outage', () => {
    expect(isDatabaseOutage(refused)).toBe(true);
    expect(isDatabaseOutage(shutdown)).toBe(true);
    expect(isDatabaseOutage(new Error('Connection terminated unexpectedly'))).toBe(true);
    expect(isDatabaseOutage(new QueryFailedError('SELECT 1', [], shutdown))).toBe(true);
  });

  it('does not treat constraint violations or bugs as an outage', () => {
    const unique = Object.assign(new Error('duplicate key value'), { code: '23505' });
    expect(isOutage(unique)).toBe(false);
    expect(isOutage(new TypeError('x is undefined'))).toBe(false);
  });

  it('answers 503 with a plain message for outages and keeps 500 for bugs', () => {
    expect(toErrorBody(refused)).toEqual({
      statusCode: 503,
      error: 'Service Unavailable',
      message: expect.stringMatching(/^The database is not reachable right now/),
    });
    expect(toErrorBody(new QueueUnavailableError('adding the job')).message).toMatch(/job queue \(Redis\)/);
    expect(toErrorBody(new TypeError('boom')).statusCode).toBe(500);
  });

  it('withDeadline rejects with a queue outage when the call hangs', async () => {
    const never = new Promise<never>(() => undefined);
    await expect(withDeadline(never, 20, 'adding the job')).rejects.toBeInstanceOf(QueueUnavailableError);
    await expect(withDeadline(Promise.resolve(7), 20, 'x')).resolves.toBe(7);
  });
});
