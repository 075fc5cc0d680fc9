import { Module } from '@nestjs/common';
import { BullModule } from '@nestjs/bullmq';
import { appConfig, redisConnection, type AppConfig } from '../config/configuration.js';
import { COMPUTE_QUEUE, SYSTEM_QUEUE } from './queue.constants.js';

/** BullMQ on the configured Redis, shared by the API (producer) and the worker (consumer). */
@Module({
  imports: [
    BullModule.forRootAsync({
      inject: [appConfig.KEY],
      useFactory: (config: AppConfig) => ({
        connection: redisConnection(config.redisUrl),
        prefix: 'qg',
      }),
    }),
    BullModule.registerQueue({ name: SYSTEM_QUEUE }, { name: COMPUTE_QUEUE }),
  ],
  exports: [BullModule],
})
export class QueueModule {}
