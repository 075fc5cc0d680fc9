import { Body, Controller, Get, Param, ParseIntPipe, Post, Put } from '@nestjs/common';
import { Roles } from '../auth/roles.decorator.js';
import { CurrentUser } from '../auth/current-user.decorator.js';
import type { User } from '../users/user.entity.js';
import { CustomerDto, UpdateCustomerDto } from './dto/customer.dto.js';
import { toCustomerView, type CustomerView } from './customer.entity.js';
import { CustomersService } from './customers.service.js';

@Controller('customers')
@Roles('admin', 'engineer', 'sales')
export class CustomersController {
  constructor(private readonly customers: CustomersService) {}

  @Get()
  async list(): Promise<CustomerView[]> {
    return (await this.customers.list()).map(toCustomerView);
  }

  @Get(':id')
  async get(@Param('id', ParseIntPipe) id: number): Promise<CustomerView> {
    return toCustomerView(await this.customers.get(id));
  }

  @Post()
  async create(@Body() dto: CustomerDto, @CurrentUser() user: User): Promise<CustomerView> {
    return toCustomerView(await this.customers.create(dto, user));
  }

  @Put(':id')
  async update(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: UpdateCustomerDto,
    @CurrentUser() user: User,
  ): Promise<CustomerView> {
    return toCustomerView(await this.customers.update(id, dto, user));
  }
}
