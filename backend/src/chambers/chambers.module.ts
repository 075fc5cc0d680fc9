import { Module } from '@nestjs/common';
import { AuditModule } from '../audit/audit.module.js';
import { TypeOrmModule } from '@nestjs/typeorm';
import { DesignsModule } from '../designs/designs.module.js';
import { Material } from '../materials/material.entity.js';
import { Chamber } from './chamber.entity.js';
import { ChambersController } from './chambers.controller.js';
import { ChambersService } from './chambers.service.js';
import { RunSheetService } from './run-sheet.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([Chamber, Material]), DesignsModule, AuditModule],
  controllers: [ChambersController],
  providers: [ChambersService, RunSheetService],
  exports: [ChambersService],
})
export class ChambersModule {}
