import { Module } from '@nestjs/common';
import { AuditModule } from '../audit/audit.module.js';
import { TypeOrmModule } from '@nestjs/typeorm';
import { Material, MaterialRevision } from './material.entity.js';
import { MaterialsController } from './materials.controller.js';
import { MaterialsService } from './materials.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([Material, MaterialRevision]), AuditModule],
  controllers: [MaterialsController],
  providers: [MaterialsService],
  exports: [MaterialsService],
})
export class MaterialsModule {}
