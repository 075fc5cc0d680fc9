import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { CustomersModule } from '../customers/customers.module.js';
import { SpecMaskRecord } from './spec-mask.entity.js';
import { SpecMasksController } from './spec-masks.controller.js';
import { SpecMasksService } from './spec-masks.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([SpecMaskRecord]), CustomersModule],
  controllers: [SpecMasksController],
  providers: [SpecMasksService],
  exports: [SpecMasksService],
})
export class SpecMasksModule {}
