import { Module } from '@nestjs/common';
import { CalculationsModule } from '../calculations/calculations.module.js';
import { RunDiagnosisController } from './run-diagnosis.controller.js';

/**
 * The Run diagnosis routes under /runs. A module of its own because the compute queue already
 * depends on RunsModule (a diagnosis reads the run's recipe and spectrum): RunsModule cannot
 * import CalculationsModule back.
 */
@Module({
  imports: [CalculationsModule],
  controllers: [RunDiagnosisController],
})
export class RunDiagnosisModule {}
