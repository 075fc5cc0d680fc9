import { stripVTControlCharacters } from 'node:util';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { ContextLogger, currentLogFields, logFormatFromEnv, withLogFields } from './log-context.js';

function captured(): { lines: () => string[]; restore: () => void } {
  const out: string[] = [];
  const spy = vi.spyOn(process.stdout, 'write').mockImplementation((chunk: string | Uint8Array) => {
    out.push(String(chunk));
    return true;
  });
  return { lines: () => out.join('').split('\n').filter(Boolean), restore: () => spy.mockRestore() };
}

describe('log lines carry the request and job ids of their context', () => {
  afterEach(() => vi.restoreAllMocks());

  it('JSON lines have requestId, jobId and calculationId fields while inside a context', async () => {
    const cap = captured();
    const logger = new ContextLogger('Worker', 'json', ['log', 'warn', 'error']);
    await withLogFields({ jobId: '42', calculationId: 7 }, async () => {
      await new Promise((r) => setTimeout(r, 1));
      logger.log('claimed', 'Compute');
    });
    logger.log('idle', 'Compute');
    cap.restore();
    const [inJob, outside] = cap.lines().map((l) => JSON.parse(l) as Record<string, unknown>);
    expect(inJob).toMatchObject({ message: 'claimed', context: 'Compute', jobId: '42', calculationId: 7 });
    expect(outside!.message).toBe('idle');
    expect(outside).not.toHaveProperty('jobId');
  });

  it('text lines name the ids after the context, nested contexts adding to the outer one', () => {
    const cap = captured();
    const logger = new ContextLogger('Api', 'text', ['log']);
    withLogFields({ requestId: 'abcd1234' }, () =>
      withLogFields({ calculationId: 3 }, () => logger.log('queued', 'Calculations')),
    );
    cap.restore();
    expect(stripVTControlCharacters(cap.lines()[0]!)).toContain('[Calculations] req=abcd1234 calc=3 queued');
    expect(currentLogFields()).toEqual({});
  });

  it('QG_LOG_FORMAT accepts text or json and refuses anything else', () => {
    expect(logFormatFromEnv({})).toBe('text');
    expect(logFormatFromEnv({ QG_LOG_FORMAT: 'json' })).toBe('json');
    expect(() => logFormatFromEnv({ QG_LOG_FORMAT: 'xml' })).toThrow(/text" or "json/);
  });
});
