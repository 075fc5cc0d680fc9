import { Controller, Get, Param, ParseIntPipe } from '@nestjs/common';
import { ApiOkResponse, ApiTags } from '@nestjs/swagger';
import type { CustomerRecords } from '@quietglass/shared/customers';
import { Roles } from '../auth/roles.decorator.js';
import { CustomerRecordsDto } from '../customers/dto/customer.dto.js';
import { CustomerRecordsService } from './customer-records.service.js';

/** What the shop holds for one customer, gathered from the modules that own each kind of record. */
@ApiTags('customers')
@Controller('customers')
@Roles('admin', 'engineer', 'sales')
export class CustomerRecordsController {
  constructor(private readonly records: CustomerRecordsService) {}

  @Get(':id/records')
  @ApiOkResponse({ type: CustomerRecordsDto, description: 'Spec masks, designs, reports and quotes' })
  get(@Param('id', ParseIntPipe) id: number): Promise<CustomerRecords> {
    return this.records.forCustomer(id);
  }
}
