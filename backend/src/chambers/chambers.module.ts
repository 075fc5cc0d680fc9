import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AuditModule } from '../audit/audit.module.js';
import { DesignsModule } from '../designs/designs.module.js';
import { MaterialsModule } from '../materials/materials.module.js';
import { Chamber } from './chamber.entity.js';
import { ChambersController } from './chambers.controller.js';
import { ChambersService } from './chambers.service.js';
import { ChamberProcessSettings } from './process-settings.entity.js';

@Module({
  imports: [
    TypeOrmModule.forFeature([Chamber, ChamberProcessSettings]),
    DesignsModule,
    MaterialsModule,
    AuditModule,
  ],
  controllers: [ChambersController],
  providers: [ChambersService],
  exports: [ChambersService],
})
export class ChambersModule {}
