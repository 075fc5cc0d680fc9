import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { DesignsModule } from '../designs/designs.module.js';
import { RunsModule } from '../runs/runs.module.js';
import { ShopSettingsModule } from '../shop-settings/shop-settings.module.js';
import { SpecMasksModule } from '../spec-masks/spec-masks.module.js';
import { ComplianceReport } from './report.entity.js';
import { ReportsController } from './reports.controller.js';
import { ReportsService } from './reports.service.js';

@Module({
  imports: [
    TypeOrmModule.forFeature([ComplianceReport]),
    DesignsModule,
    SpecMasksModule,
    RunsModule,
    ShopSettingsModule,
  ],
  controllers: [ReportsController],
  providers: [ReportsService],
  exports: [ReportsService],
})
export class ReportsModule {}
