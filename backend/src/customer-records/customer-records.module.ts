import { Module } from '@nestjs/common';
import { CustomersModule } from '../customers/customers.module.js';
import { DesignsModule } from '../designs/designs.module.js';
import { QuotesModule } from '../quotes/quotes.module.js';
import { ReportsModule } from '../reports/reports.module.js';
import { SpecMasksModule } from '../spec-masks/spec-masks.module.js';
import { CustomerRecordsController } from './customer-records.controller.js';
import { CustomerRecordsService } from './customer-records.service.js';

/** Reads only: each kind of record comes from the service of the module that owns it. */
@Module({
  imports: [CustomersModule, SpecMasksModule, DesignsModule, ReportsModule, QuotesModule],
  controllers: [CustomerRecordsController],
  providers: [CustomerRecordsService],
})
export class CustomerRecordsModule {}
