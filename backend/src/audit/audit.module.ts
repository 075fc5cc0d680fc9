import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AuditEvent } from './audit-event.entity.js';
import { AuditController } from './audit.controller.js';
import { AuditService } from './audit.service.js';

/** Owns the audit trail; other modules record their changes through AuditService. */
@Module({
  imports: [TypeOrmModule.forFeature([AuditEvent])],
  controllers: [AuditController],
  providers: [AuditService],
  exports: [AuditService],
})
export class AuditModule {}
