import { Module } from '@nestjs/common';
import { ConfigModule } from '@nestjs/config';
import { appConfig } from '../config/configuration.js';
import { QueueModule } from '../queue/queue.module.js';
import { SystemProcessor } from './system.processor.js';

/** The worker process: consumes the queues; shares the API's codebase, not its HTTP server. */
@Module({
  imports: [ConfigModule.forRoot({ isGlobal: true, ignoreEnvFile: true, load: [appConfig] }), QueueModule],
  providers: [SystemProcessor],
})
export class WorkerModule {}
