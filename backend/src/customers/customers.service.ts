import { ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository } from 'typeorm';
import { isUniqueViolation } from '../common/db-errors.js';
import { Customer } from './customer.entity.js';
import type { CustomerDto } from './dto/customer.dto.js';

@Injectable()
export class CustomersService {
  constructor(@InjectRepository(Customer) private readonly customers: Repository<Customer>) {}

  list(): Promise<Customer[]> {
    return this.customers.find({ order: { name: 'ASC' } });
  }

  async get(id: number): Promise<Customer> {
    const customer = await this.customers.findOneBy({ id });
    if (!customer) throw new NotFoundException(`Customer ${id} does not exist`);
    return customer;
  }

  async create(dto: CustomerDto): Promise<Customer> {
    return this.save(
      this.customers.create({
        name: dto.name,
        contactEmail: dto.contactEmail ?? null,
        notes: dto.notes ?? '',
      }),
    );
  }

  async update(id: number, dto: CustomerDto): Promise<Customer> {
    const customer = await this.get(id);
    customer.name = dto.name;
    if (dto.contactEmail !== undefined) customer.contactEmail = dto.contactEmail;
    if (dto.notes !== undefined) customer.notes = dto.notes;
    return this.save(customer);
  }

  private async save(customer: Customer): Promise<Customer> {
    try {
      return await this.customers.save(customer);
    } catch (err) {
      if (isUniqueViolation(err))
        throw new ConflictException(`A customer named "${customer.name}" already exists`);
      throw err;
    }
  }
}
