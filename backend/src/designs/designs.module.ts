import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AuditModule } from '../audit/audit.module.js';
import { CustomersModule } from '../customers/customers.module.js';
import { MaterialsModule } from '../materials/materials.module.js';
import { SpecMasksModule } from '../spec-masks/spec-masks.module.js';
import { Design } from './design.entity.js';
import { DesignVersion } from './design-version.entity.js';
import { VersionEvent } from './version-event.entity.js';
import { ApprovalsController } from './approvals.controller.js';
import { ApprovalsService } from './approvals.service.js';
import { DesignsController } from './designs.controller.js';
import { DesignsService } from './designs.service.js';
import { RecipesService } from './recipes.service.js';

@Module({
  imports: [
    TypeOrmModule.forFeature([Design, DesignVersion, VersionEvent]),
    CustomersModule,
    SpecMasksModule,
    MaterialsModule,
    AuditModule,
  ],
  controllers: [DesignsController, ApprovalsController],
  providers: [DesignsService, ApprovalsService, RecipesService],
  exports: [DesignsService, ApprovalsService, RecipesService],
})
export class DesignsModule {}
