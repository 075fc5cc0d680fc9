import { Inject, Injectable, OnModuleDestroy, OnModuleInit } from '@nestjs/common';
import { InjectQueue } from '@nestjs/bullmq';
import { InjectDataSource } from '@nestjs/typeorm';
import { Queue, QueueEvents } from 'bullmq';
import { Redis } from 'ioredis';
import { DataSource } from 'typeorm';
import { appConfig, redisConnection, type AppConfig } from '../config/configuration.js';
import { PING_JOB, SYSTEM_QUEUE, type PingResult } from '../queue/queue.constants.js';

export interface CheckResult {
  ok: boolean;
  latencyMs?: number;
  error?: string;
}

export interface HealthReport {
  status: 'ok' | 'degraded';
  database: CheckResult;
  redis: CheckResult;
  queue: CheckResult & { waiting?: number; active?: number; failed?: number };
  worker: CheckResult & { workers?: number; answeredBy?: PingResult };
}

function failure(err: unknown, started: number): CheckResult {
  return {
    ok: false,
    latencyMs: Date.now() - started,
    error: err instanceof Error ? err.message : String(err),
  };
}

async function timed<T>(fn: () => Promise<T>): Promise<{ value: T; latencyMs: number }> {
  const started = Date.now();
  const value = await fn();
  return { value, latencyMs: Date.now() - started };
}

function withTimeout<T>(p: Promise<T>, ms: number, what: string): Promise<T> {
  return Promise.race([
    p,
    new Promise<T>((_, reject) =>
      setTimeout(() => reject(new Error(`${what} timed out after ${ms} ms`)), ms),
    ),
  ]);
}

@Injectable()
export class HealthService implements OnModuleInit, OnModuleDestroy {
  private events: QueueEvents;
  private redis: Redis;

  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectQueue(SYSTEM_QUEUE) private readonly systemQueue: Queue,
    @Inject(appConfig.KEY) private readonly config: AppConfig,
  ) {}

  onModuleInit(): void {
    this.events = new QueueEvents(SYSTEM_QUEUE, {
      connection: redisConnection(this.config.redisUrl),
      prefix: 'qg',
    });
    // Connection errors surface through the checks; do not crash the API on a Redis outage.
    this.events.on('error', () => undefined);
    this.redis = new Redis({ ...redisConnection(this.config.redisUrl), maxRetriesPerRequest: 1 });
    this.redis.on('error', () => undefined);
  }

  async onModuleDestroy(): Promise<void> {
    await Promise.all([this.events.close(), this.redis.quit().catch(() => undefined)]);
  }

  async report(): Promise<HealthReport> {
    const [database, redis, queue, worker] = await Promise.all([
      this.checkDatabase(),
      this.checkRedis(),
      this.checkQueue(),
      this.checkWorker(),
    ]);
    const status = database.ok && redis.ok && queue.ok && worker.ok ? 'ok' : 'degraded';
    return { status, database, redis, queue, worker };
  }

  private async checkDatabase(): Promise<CheckResult> {
    const started = Date.now();
    try {
      const { latencyMs } = await timed(() => withTimeout(this.db.query('SELECT 1'), 2000, 'database'));
      return { ok: true, latencyMs };
    } catch (err) {
      return failure(err, started);
    }
  }

  private async checkRedis(): Promise<CheckResult> {
    const started = Date.now();
    try {
      const { value, latencyMs } = await timed(() => withTimeout(this.redis.ping(), 2000, 'redis ping'));
      return value === 'PONG' ? { ok: true, latencyMs } : { ok: false, error: `unexpected reply ${value}` };
    } catch (err) {
      return failure(err, started);
    }
  }

  private async checkQueue(): Promise<HealthReport['queue']> {
    const started = Date.now();
    try {
      const counts = await withTimeout(
        this.systemQueue.getJobCounts('waiting', 'active', 'failed'),
        2000,
        'queue counts',
      );
      return {
        ok: true,
        latencyMs: Date.now() - started,
        waiting: counts.waiting,
        active: counts.active,
        failed: counts.failed,
      };
    } catch (err) {
      return failure(err, started);
    }
  }

  /** A worker is alive when it answers a ping job through the queue within the timeout. */
  private async checkWorker(): Promise<HealthReport['worker']> {
    const started = Date.now();
    const timeoutMs = this.config.workerPingTimeoutMs;
    let jobId: string | undefined;
    try {
      const workers = (await withTimeout(this.systemQueue.getWorkers(), 2000, 'worker list')).length;
      const job = await this.systemQueue.add(
        PING_JOB,
        { askedAt: new Date().toISOString() },
        // Kept for a minute: removing at once would race with waitUntilFinished on a fast worker.
        { removeOnComplete: { age: 60 }, removeOnFail: { age: 60 }, attempts: 1 },
      );
      jobId = job.id;
      const answeredBy = (await job.waitUntilFinished(this.events, timeoutMs)) as PingResult;
      await job.remove().catch(() => undefined);
      return { ok: true, latencyMs: Date.now() - started, workers, answeredBy };
    } catch (err) {
      if (jobId) await this.systemQueue.remove(jobId).catch(() => undefined);
      const result = failure(err, started);
      return { ...result, error: `no worker answered: ${result.error}` };
    }
  }
}
