import 'reflect-metadata';
import { NestFactory } from '@nestjs/core';
import { installProcessGuards } from '../common/process-guards.js';
import { WorkerModule } from './worker.module.js';

async function main(): Promise<void> {
  const app = await NestFactory.createApplicationContext(WorkerModule, { logger: ['error', 'warn', 'log'] });
  app.enableShutdownHooks();
  installProcessGuards('Worker', () => app.close());
  console.log(`worker ${process.pid} consuming the compute queue`);
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
