import 'reflect-metadata';
import type { INestApplicationContext } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
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

describe('GET /api/health', () => {
  it('without a worker: database, Redis and queue are up, the worker check fails, status degraded', async () => {
    const res = await health();
    expect(res.status).toBe(200);
    expect(res.body.status).toBe('degraded');
    expect(res.body.database.ok).toBe(true);
    expect(res.body.redis.ok).toBe(true);
    expect(res.body.queue.ok).toBe(true);
    expect(res.body.worker.ok).toBe(false);
    expect(res.body.worker.error).toMatch(/no worker answered/);
  });

  it('with a worker: the worker answers the ping job through the queue, status ok', async () => {
    worker = await NestFactory.createApplicationContext(WorkerModule, { logger: ['error'] });
    await worker.init();
    const res = await health();
    expect(res.body.worker.error).toBeUndefined();
    expect(res.body.status).toBe('ok');
    expect(res.body.worker.ok).toBe(true);
    expect(res.body.worker.workers).toBeGreaterThanOrEqual(1);
    expect(res.body.worker.answeredBy.workerPid).toBe(process.pid);
    // No ping job is left behind in the queue.
    expect(res.body.queue.waiting).toBe(0);
  });

  it('after the worker stops, the worker check fails again', async () => {
    await worker?.close();
    worker = null;
    const res = await health();
    expect(res.body.worker.ok).toBe(false);
    expect(res.body.status).toBe('degraded');
  });
});
