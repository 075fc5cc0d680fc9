import 'reflect-metadata';
import type { INestApplicationContext } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { WorkerModule } from '../src/worker/worker.module.js';
import { createTestApp } from './support/app.js';

let app: NestExpressApplication;
let worker: INestApplicationContext | null = null;

beforeAll(async () => {
  app = await createTestApp();
});
afterAll(async () => {
  await worker?.close();
  await app.close();
});

const health = () => request(app.getHttpServer()).get('/api/health');

/** The checks run in the background (QG_HEALTH_INTERVAL_MS): wait for a round that shows `status`. */
async function healthWith(status: 'ok' | 'degraded') {
  let last: request.Response | undefined;
  await vi.waitFor(
    async () => {
      last = await health();
      expect(last.body.status).toBe(status);
    },
    { timeout: 20_000, interval: 300 },
  );
  return last as request.Response;
}

describe('GET /api/health', () => {
  it('without a worker: database, Redis and queue are up, the worker check fails: 503, degraded', async () => {
    const res = await healthWith('degraded');
    expect(res.status).toBe(503);
    expect(res.body.database.ok).toBe(true);
    expect(res.body.redis.ok).toBe(true);
    expect(res.body.queue.ok).toBe(true);
    expect(res.body.worker.ok).toBe(false);
    expect(res.body.worker.error).toMatch(/no worker answered/);
  });

  it('with a worker: the worker answers the ping job through the queue: 200, ok', async () => {
    worker = await NestFactory.createApplicationContext(WorkerModule, { logger: ['error'] });
    await worker.init();
    const res = await healthWith('ok');
    expect(res.status).toBe(200);
    expect(res.body.worker.error).toBeUndefined();
    expect(res.body.worker.ok).toBe(true);
    expect(res.body.worker.workers).toBeGreaterThanOrEqual(1);
    expect(res.body.worker.answeredBy.workerPid).toBe(process.pid);
    // No ping job is left behind in the queue.
    expect(res.body.queue.waiting).toBe(0);
  });

  it('answers from the latest background round: many public calls share one check, no job each', async () => {
    const answers = await Promise.all(Array.from({ length: 20 }, () => health()));
    const rounds = new Set(answers.map((a) => a.body.checkedAt as string));
    // 20 calls at once see at most two rounds (one may finish while they arrive), never 20.
    expect(rounds.size).toBeLessThanOrEqual(2);
  });

  it('after the worker stops, the worker check fails again: 503', async () => {
    await worker?.close();
    worker = null;
    const res = await healthWith('degraded');
    expect(res.status).toBe(503);
    expect(res.body.worker.ok).toBe(false);
  });
});
