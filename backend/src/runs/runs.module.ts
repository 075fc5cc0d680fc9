import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AuditModule } from '../audit/audit.module.js';
import { ChambersModule } from '../chambers/chambers.module.js';
import { DesignsModule } from '../designs/designs.module.js';
import { SpecMasksModule } from '../spec-masks/spec-masks.module.js';
import { ChamberRun, RunSpectrum } from './run.entity.js';
import { RunsController } from './runs.controller.js';
import { RunsService } from './runs.service.js';

@Module({
  imports: [
    TypeOrmModule.forFeature([ChamberRun, RunSpectrum]),
    DesignsModule,
    ChambersModule,
    SpecMasksModule,
    AuditModule,
  ],
  controllers: [RunsController],
  providers: [RunsService],
  exports: [RunsService],
})
export class RunsModule {}
