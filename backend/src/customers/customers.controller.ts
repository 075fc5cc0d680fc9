import { Body, Controller, Get, Param, ParseBoolPipe, ParseIntPipe, Post, Put, Query } from '@nestjs/common';
import { ApiConflictResponse, ApiCreatedResponse, ApiOkResponse, ApiQuery, ApiTags } from '@nestjs/swagger';
import { Roles } from '../auth/roles.decorator.js';
import { CurrentUser } from '../auth/current-user.decorator.js';
import type { User } from '../users/user.entity.js';
import { CustomerDto, CustomerVersionDto, CustomerViewDto, UpdateCustomerDto } from './dto/customer.dto.js';
import { toCustomerView, type CustomerView } from './customer.entity.js';
import { CustomersService } from './customers.service.js';

/** Office roles keep the customer list; operators work from released recipes. */
@ApiTags('customers')
@Controller('customers')
@Roles('admin', 'engineer', 'sales')
export class CustomersController {
  constructor(private readonly customers: CustomersService) {}

  @Get()
  @ApiQuery({
    name: 'includeArchived',
    required: false,
    type: Boolean,
    description: 'Also archived customers',
  })
  @ApiOkResponse({ type: [CustomerViewDto] })
  async list(
    @Query('includeArchived', new ParseBoolPipe({ optional: true })) includeArchived?: boolean,
  ): Promise<CustomerView[]> {
    return (await this.customers.list(includeArchived ?? false)).map(toCustomerView);
  }

  @Get(':id')
  @ApiOkResponse({ type: CustomerViewDto })
  async get(@Param('id', ParseIntPipe) id: number): Promise<CustomerView> {
    return toCustomerView(await this.customers.get(id));
  }

  @Post()
  @ApiCreatedResponse({ type: CustomerViewDto })
  @ApiConflictResponse({ description: 'A customer of that name exists' })
  async create(@Body() dto: CustomerDto, @CurrentUser() user: User): Promise<CustomerView> {
    return toCustomerView(await this.customers.create(dto, user));
  }

  @Put(':id')
  @ApiOkResponse({ type: CustomerViewDto })
  @ApiConflictResponse({ description: 'Stale version, or the name is taken' })
  async update(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: UpdateCustomerDto,
    @CurrentUser() user: User,
  ): Promise<CustomerView> {
    return toCustomerView(await this.customers.update(id, dto, user));
  }

  @Post(':id/archive')
  @ApiCreatedResponse({ type: CustomerViewDto, description: 'Hidden from pickers; records kept' })
  @ApiConflictResponse({ description: 'Stale version, or already archived' })
  async archive(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: CustomerVersionDto,
    @CurrentUser() user: User,
  ): Promise<CustomerView> {
    return toCustomerView(await this.customers.setArchived(id, true, dto.version, user));
  }

  @Post(':id/restore')
  @ApiCreatedResponse({ type: CustomerViewDto })
  @ApiConflictResponse({ description: 'Stale version, or not archived' })
  async restore(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: CustomerVersionDto,
    @CurrentUser() user: User,
  ): Promise<CustomerView> {
    return toCustomerView(await this.customers.setArchived(id, false, dto.version, user));
  }
}
