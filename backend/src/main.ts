import 'reflect-metadata';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { AppModule } from './app.module.js';
import { configureApp } from './app.setup.js';
import { ContextLogger, logFormatFromEnv } from './common/log-context.js';
import { installProcessGuards } from './common/process-guards.js';
import { loadConfig } from './config/configuration.js';

async function main(): Promise<void> {
  const config = loadConfig();
  // Outside development only warnings and errors: route-by-route start-up logs drown what matters.
  const quiet = process.env.NODE_ENV === 'production' || process.env.NODE_ENV === 'test';
  const app = await NestFactory.create<NestExpressApplication>(AppModule, {
    bodyParser: false,
    logger: new ContextLogger(
      'Api',
      logFormatFromEnv(),
      quiet ? ['error', 'warn'] : ['error', 'warn', 'log'],
    ),
  });
  configureApp(app, config.clientDist);
  installProcessGuards('Api', () => app.close());
  await app.listen(config.port, config.host);
  console.log(`API ${process.pid} listening on http://${config.host}:${config.port}/api`);
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
