import { Module } from '@nestjs/common';
import { ConfigModule } from '@nestjs/config';
import { TypeOrmModule } from '@nestjs/typeorm';
import { appConfig, type AppConfig } from '../config/configuration.js';
import { dataSourceOptions } from '../database/data-source.js';
import { QueueModule } from '../queue/queue.module.js';
import { CalculationStore } from '../calculations/calculation-store.js';
import { ComputeProcessor } from './compute.processor.js';
import { SystemProcessor } from './system.processor.js';

/** The worker process: consumes the queues; shares the API's codebase, not its HTTP server. */
@Module({
  imports: [
    ConfigModule.forRoot({ isGlobal: true, ignoreEnvFile: true, load: [appConfig] }),
    TypeOrmModule.forRootAsync({
      inject: [appConfig.KEY],
      useFactory: (config: AppConfig) => dataSourceOptions(config.databaseUrl),
    }),
    QueueModule,
  ],
  providers: [SystemProcessor, ComputeProcessor, CalculationStore],
})
export class WorkerModule {}
