import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { CustomersModule } from '../customers/customers.module.js';
import { SpecMasksModule } from '../spec-masks/spec-masks.module.js';
import { Design } from './design.entity.js';
import { DesignVersion } from './design-version.entity.js';
import { DesignsController } from './designs.controller.js';
import { DesignsService } from './designs.service.js';

@Module({
  imports: [TypeOrmModule.forFeature([Design, DesignVersion]), CustomersModule, SpecMasksModule],
  controllers: [DesignsController],
  providers: [DesignsService],
  exports: [DesignsService],
})
export class DesignsModule {}
