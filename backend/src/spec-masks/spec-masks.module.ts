import { Module } from '@nestjs/common';
import { AuditModule } from '../audit/audit.module.js';
import { TypeOrmModule } from '@nestjs/typeorm';
import { CustomersModule } from '../customers/customers.module.js';
import { SpecMaskRecord } from './spec-mask.entity.js';
import { SpecMasksController } from './spec-masks.controller.js';
import { SpecMasksService } from './spec-masks.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([SpecMaskRecord]), CustomersModule, AuditModule],
  controllers: [SpecMasksController],
  providers: [SpecMasksService],
  exports: [SpecMasksService],
})
export class SpecMasksModule {}
