import { ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository } from 'typeorm';
import { AuditService } from '../audit/audit.service.js';
import { isUniqueViolation } from '../common/db-errors.js';
import { updateIfVersion } from '../common/optimistic-lock.js';
import type { User } from '../users/user.entity.js';
import { Customer } from './customer.entity.js';
import type { CustomerDto, UpdateCustomerDto } from './dto/customer.dto.js';

@Injectable()
export class CustomersService {
  constructor(
    @InjectRepository(Customer) private readonly customers: Repository<Customer>,
    private readonly audit: AuditService,
  ) {}

  list(): Promise<Customer[]> {
    return this.customers.find({ order: { name: 'ASC' } });
  }

  async get(id: number): Promise<Customer> {
    const customer = await this.customers.findOneBy({ id });
    if (!customer) throw new NotFoundException(`Customer ${id} does not exist`);
    return customer;
  }

  async create(dto: CustomerDto, user: User): Promise<Customer> {
    return this.unique(dto.name, () =>
      this.customers.manager.transaction(async (tx) => {
        const repo = tx.getRepository(Customer);
        const saved = await repo.save(
          repo.create({ name: dto.name, contactEmail: dto.contactEmail ?? null, notes: dto.notes ?? '' }),
        );
        await this.audit.record(tx, {
          actor: user,
          entity: 'customer',
          entityId: saved.id,
          action: 'created',
          summary: `customer "${saved.name}" created`,
          details: { name: saved.name, contactEmail: saved.contactEmail },
        });
        return saved;
      }),
    );
  }

  async update(id: number, dto: UpdateCustomerDto, user: User): Promise<Customer> {
    const before = await this.get(id);
    const set: Partial<Customer> = { name: dto.name };
    if (dto.contactEmail !== undefined) set.contactEmail = dto.contactEmail;
    if (dto.notes !== undefined) set.notes = dto.notes;
    await this.unique(dto.name, () =>
      this.customers.manager.transaction(async (tx) => {
        await updateIfVersion(tx, Customer, { id, expectedVersion: dto.version, set }, async () => {
          const now = await this.get(id);
          return new ConflictException(
            `Customer "${now.name}" was changed by someone else (now version ${now.version}); reload it and apply your edit again`,
          );
        });
        const changed = (Object.keys(set) as (keyof typeof set)[]).filter((k) => set[k] !== before[k]);
        await this.audit.record(tx, {
          actor: user,
          entity: 'customer',
          entityId: id,
          action: 'edited',
          summary: `customer "${dto.name}" edited${changed.length > 0 ? `: ${changed.join(', ')}` : ''}`,
          details: Object.fromEntries(changed.map((k) => [k, { from: before[k], to: set[k] }])),
        });
      }),
    );
    return this.get(id);
  }

  private async unique<T>(name: string, write: () => Promise<T>): Promise<T> {
    try {
      return await write();
    } catch (err) {
      if (isUniqueViolation(err)) throw new ConflictException(`A customer named "${name}" already exists`);
      throw err;
    }
  }
}
