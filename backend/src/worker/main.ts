import 'reflect-metadata';
import { NestFactory } from '@nestjs/core';
import { ContextLogger, logFormatFromEnv } from '../common/log-context.js';
import { installProcessGuards } from '../common/process-guards.js';
import { lowerWorkerPriority } from './priority.js';
import { WorkerModule } from './worker.module.js';

async function main(): Promise<void> {
  // Before any thread starts, so the compute threads inherit it.
  const nice = lowerWorkerPriority();
  const app = await NestFactory.createApplicationContext(WorkerModule, {
    logger: new ContextLogger('Worker', logFormatFromEnv(), ['error', 'warn', 'log']),
  });
  app.enableShutdownHooks();
  installProcessGuards('Worker', () => app.close());
  console.log(`worker ${process.pid} consuming the compute queue (niceness ${nice})`);
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
