import { Body, Controller, Get, Param, ParseBoolPipe, ParseIntPipe, Post, Put, Query } from '@nestjs/common';
import { ApiConflictResponse, ApiCreatedResponse, ApiOkResponse, ApiQuery, ApiTags } from '@nestjs/swagger';
import { Roles } from '../auth/roles.decorator.js';
import { CurrentUser } from '../auth/current-user.decorator.js';
import type { User } from '../users/user.entity.js';
import {
  customerInputSchema,
  customerUpdateSchema,
  customerVersionSchema,
  type CustomerInput,
  type CustomerUpdate,
  type CustomerVersionInput,
} from '@quietglass/shared/schemas/customers';
import { ZodBody } from '../common/zod-body.js';
import { CustomerViewDto } from './dto/customer.dto.js';
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
  @ZodBody(customerInputSchema)
  async create(@Body() dto: CustomerInput, @CurrentUser() user: User): Promise<CustomerView> {
    return toCustomerView(await this.customers.create(dto, user));
  }

  @Put(':id')
  @ApiOkResponse({ type: CustomerViewDto })
  @ApiConflictResponse({ description: 'Stale version, or the name is taken' })
  @ZodBody(customerUpdateSchema)
  async update(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: CustomerUpdate,
    @CurrentUser() user: User,
  ): Promise<CustomerView> {
    return toCustomerView(await this.customers.update(id, dto, user));
  }

  @Post(':id/archive')
  @ApiCreatedResponse({ type: CustomerViewDto, description: 'Hidden from pickers; records kept' })
  @ApiConflictResponse({ description: 'Stale version, or already archived' })
  @ZodBody(customerVersionSchema)
  async archive(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: CustomerVersionInput,
    @CurrentUser() user: User,
  ): Promise<CustomerView> {
    return toCustomerView(await this.customers.setArchived(id, true, dto.version, user));
  }

  @Post(':id/restore')
  @ApiCreatedResponse({ type: CustomerViewDto })
  @ApiConflictResponse({ description: 'Stale version, or not archived' })
  @ZodBody(customerVersionSchema)
  async restore(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: CustomerVersionInput,
    @CurrentUser() user: User,
  ): Promise<CustomerView> {
    return toCustomerView(await this.customers.setArchived(id, false, dto.version, user));
  }
}
