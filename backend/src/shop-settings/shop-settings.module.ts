import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AuditModule } from '../audit/audit.module.js';
import { ShopSettingsController } from './shop-settings.controller.js';
import { ShopSettings } from './shop-settings.entity.js';
import { ShopSettingsService } from './shop-settings.service.js';

/** The shop's name and logo, read by the modules that print documents. */
@Module({
  imports: [TypeOrmModule.forFeature([ShopSettings]), AuditModule],
  controllers: [ShopSettingsController],
  providers: [ShopSettingsService],
  exports: [ShopSettingsService],
})
export class ShopSettingsModule {}
