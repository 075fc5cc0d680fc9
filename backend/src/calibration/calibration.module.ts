import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AuditModule } from '../audit/audit.module.js';
import { CalculationsModule } from '../calculations/calculations.module.js';
import { ChambersModule } from '../chambers/chambers.module.js';
import { MaterialsModule } from '../materials/materials.module.js';
import { RunsModule } from '../runs/runs.module.js';
import { CalibrationDecision, CalibrationSettingsRecord } from './calibration.entity.js';
import { CalibrationController } from './calibration.controller.js';
import { CalibrationService } from './calibration.service.js';

@Module({
  imports: [
    TypeOrmModule.forFeature([CalibrationDecision, CalibrationSettingsRecord]),
    ChambersModule,
    RunsModule,
    CalculationsModule,
    MaterialsModule,
    AuditModule,
  ],
  controllers: [CalibrationController],
  providers: [CalibrationService],
  exports: [CalibrationService],
})
export class CalibrationModule {}
