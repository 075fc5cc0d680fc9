import 'reflect-metadata';
import { NestFactory } from '@nestjs/core';
import { ContextLogger, logFormatFromEnv } from '../common/log-context.js';
import { installProcessGuards } from '../common/process-guards.js';
import { WorkerModule } from './worker.module.js';

async function main(): Promise<void> {
  const app = await NestFactory.createApplicationContext(WorkerModule, {
    logger: new ContextLogger('Worker', logFormatFromEnv(), ['error', 'warn', 'log']),
  });
  app.enableShutdownHooks();
  installProcessGuards('Worker', () => app.close());
  console.log(`worker ${process.pid} consuming the compute queue`);
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
