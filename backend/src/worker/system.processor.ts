import os from 'node:os';
import { Logger } from '@nestjs/common';
import { OnWorkerEvent, Processor, WorkerHost } from '@nestjs/bullmq';
import type { Job } from 'bullmq';
import { PING_JOB, SYSTEM_QUEUE, type PingResult } from '../queue/queue.constants.js';

/** Answers housekeeping jobs; a ping proves to the API's health check that a worker is alive. */
@Processor(SYSTEM_QUEUE)
export class SystemProcessor extends WorkerHost {
  private readonly logger = new Logger('System');

  process(job: Job): Promise<PingResult> {
    if (job.name !== PING_JOB) return Promise.reject(new Error(`Unknown system job "${job.name}"`));
    return Promise.resolve({
      workerPid: process.pid,
      host: os.hostname(),
      answeredAt: new Date().toISOString(),
    });
  }

  /** Redis connection trouble: BullMQ reconnects by itself; the process carries on. */
  @OnWorkerEvent('error')
  onWorkerError(err: Error): void {
    this.logger.warn(`queue connection: ${err.message}`);
  }
}
