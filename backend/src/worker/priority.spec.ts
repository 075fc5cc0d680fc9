import { getPriority } from 'node:os';
import { Worker } from 'node:worker_threads';
import { describe, expect, it } from 'vitest';
import { lowerWorkerPriority } from './priority.js';

/** The niceness a freshly started thread of this process gets (Linux: inherited from its creator). */
function threadNiceness(): Promise<number> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(
      "const { parentPort } = require('node:worker_threads'); parentPort.postMessage(require('node:os').getPriority());",
      { eval: true },
    );
    worker.once('message', (n: number) => {
      void worker.terminate();
      resolve(n);
    });
    worker.once('error', reject);
  });
}

describe('worker priority', () => {
  it('refuses a niceness outside 0–19 by name', () => {
    expect(() => lowerWorkerPriority({ QG_WORKER_NICE: '25' })).toThrow(
      'QG_WORKER_NICE must be a whole number from 0 to 19 (got "25")',
    );
    expect(() => lowerWorkerPriority({ QG_WORKER_NICE: 'low' })).toThrow(/got "low"/);
  });

  it('raises the niceness to 10 by default, and threads started afterwards inherit it', async () => {
    // This test process's own priority goes down: harmless for the tests that follow.
    const before = getPriority();
    const now = lowerWorkerPriority({});
    expect(now).toBe(Math.max(before, 10));
    expect(getPriority()).toBe(now);
    expect(await threadNiceness()).toBe(now);
    // A lower value than the current one is not taken back (that would need privileges).
    expect(lowerWorkerPriority({ QG_WORKER_NICE: '0' })).toBe(now);
  });
});
