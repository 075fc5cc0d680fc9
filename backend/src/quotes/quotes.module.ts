import { Module } from '@nestjs/common';
import { AuditModule } from '../audit/audit.module.js';
import { TypeOrmModule } from '@nestjs/typeorm';
import { CustomersModule } from '../customers/customers.module.js';
import { DesignsModule } from '../designs/designs.module.js';
import { SpecMasksModule } from '../spec-masks/spec-masks.module.js';
import { MailModule } from '../mail/mail.module.js';
import { ReportsModule } from '../reports/reports.module.js';
import { Quote } from './quote.entity.js';
import { QuotesController } from './quotes.controller.js';
import { QuotesService } from './quotes.service.js';

@Module({
  imports: [
    TypeOrmModule.forFeature([Quote]),
    CustomersModule,
    DesignsModule,
    SpecMasksModule,
    ReportsModule,
    MailModule,
    AuditModule,
  ],
  controllers: [QuotesController],
  providers: [QuotesService],
  exports: [QuotesService],
})
export class QuotesModule {}
