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
  /** When these checks ran (they run in the background, not per request). */
  checkedAt: string;
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

/** How often the checks run, ms (QG_HEALTH_INTERVAL_MS). */
const intervalMs = (() => {
  const v = Number(process.env.QG_HEALTH_INTERVAL_MS);
  return Number.isInteger(v) && v >= 200 ? v : 5000;
})();

/**
 * The service's health, checked in the background every few seconds (a ping job through the queue
 * among them) and answered from that cache, so a public health request costs nothing and cannot
 * flood the queue.
 */
@Injectable()
export class HealthService implements OnModuleInit, OnModuleDestroy {
  private events: QueueEvents;
  private redis: Redis;
  private latest: HealthReport | null = null;
  private running: Promise<HealthReport> | null = null;
  private timer: NodeJS.Timeout | null = null;

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
    this.systemQueue.on('error', () => undefined);
    const tick = () => {
      void this.refresh().finally(() => {
        if (this.timer !== null) this.timer = setTimeout(tick, intervalMs);
      });
    };
    this.timer = setTimeout(tick, 0);
  }

  async onModuleDestroy(): Promise<void> {
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    await this.running?.catch(() => undefined);
    await Promise.all([this.events.close(), this.redis.quit().catch(() => undefined)]);
  }

  /** The latest checks; waits for the first round when none has finished yet. */
  async report(): Promise<HealthReport> {
    return this.latest ?? (await this.refresh());
  }

  /** One round of checks; concurrent callers share it. */
  private refresh(): Promise<HealthReport> {
    this.running ??= this.check()
      .then((report) => (this.latest = report))
      .finally(() => (this.running = null));
    return this.running;
  }

  private async check(): Promise<HealthReport> {
    const checkedAt = new Date().toISOString();
    const [database, redis, queue, worker] = await Promise.all([
      this.checkDatabase(),
      this.checkRedis(),
      this.checkQueue(),
      this.checkWorker(),
    ]);
    const status = database.ok && redis.ok && queue.ok && worker.ok ? 'ok' : 'degraded';
    return { status, checkedAt, database, redis, queue, worker };
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
      return value === 'PONG'
        ? { ok: true, latencyMs }
        : { ok: false, error: `unexpected reply ${String(value)}` };
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
      const job = await withTimeout(
        this.systemQueue.add(
          PING_JOB,
          { askedAt: new Date().toISOString() },
          // Kept for a minute: removing at once would race with waitUntilFinished on a fast worker.
          { removeOnComplete: { age: 60 }, removeOnFail: { age: 60 }, attempts: 1 },
        ),
        2000,
        'queueing the ping',
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
