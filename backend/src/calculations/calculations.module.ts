import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { DesignsModule } from '../designs/designs.module.js';
import { MaterialsModule } from '../materials/materials.module.js';
import { QueueModule } from '../queue/queue.module.js';
import { RunsModule } from '../runs/runs.module.js';
import { ShopSettingsModule } from '../shop-settings/shop-settings.module.js';
import { SpecMasksModule } from '../spec-masks/spec-masks.module.js';
import { Calculation } from './calculation.entity.js';
import { CalculationsController } from './calculations.controller.js';
import { CalculationsService } from './calculations.service.js';
import { OptimiseService } from './optimise.service.js';

@Module({
  imports: [
    TypeOrmModule.forFeature([Calculation]),
    QueueModule,
    DesignsModule,
    MaterialsModule,
    RunsModule,
    SpecMasksModule,
    ShopSettingsModule,
  ],
  controllers: [CalculationsController],
  providers: [CalculationsService, OptimiseService],
  exports: [CalculationsService, OptimiseService],
})
export class CalculationsModule {}
