import { ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { IsNull, Repository, type EntityManager } from 'typeorm';
import type { CustomerInput, CustomerUpdate } from '@quietglass/shared/schemas/customers';
import { AuditService } from '../audit/audit.service.js';
import { isUniqueViolation } from '../common/db-errors.js';
import { updateIfVersion } from '../common/optimistic-lock.js';
import { stableStringify } from '../common/stable-json.js';
import type { User } from '../users/user.entity.js';
import { Customer } from './customer.entity.js';

@Injectable()
export class CustomersService {
  constructor(
    @InjectRepository(Customer) private readonly customers: Repository<Customer>,
    private readonly audit: AuditService,
  ) {}

  /** Customers by name; archived ones only when asked for (pickers never show them). */
  list(includeArchived = false): Promise<Customer[]> {
    return this.customers.find({
      where: includeArchived ? {} : { archivedAt: IsNull() },
      order: { name: 'ASC' },
    });
  }

  async get(id: number): Promise<Customer> {
    const customer = await this.customers.findOneBy({ id });
    if (!customer) throw new NotFoundException(`Customer ${id} does not exist`);
    return customer;
  }

  /**
   * A customer that may get a new record (mask, quote): it exists and is not archived. An archived
   * customer is a 409: the request is well formed, the customer's state forbids it.
   */
  async active(id: number): Promise<Customer> {
    const customer = await this.get(id);
    if (customer.archivedAt) {
      throw new ConflictException(
        `Customer "${customer.name}" is archived; restore it before adding new spec masks or quotes`,
      );
    }
    return customer;
  }

  async create(dto: CustomerInput, user: User): Promise<Customer> {
    return this.unique(dto.name, () =>
      this.customers.manager.transaction(async (tx) => {
        const repo = tx.getRepository(Customer);
        const saved = await repo.save(
          repo.create({
            name: dto.name,
            contactEmail: dto.contactEmail,
            notes: dto.notes,
            contacts: dto.contacts,
          }),
        );
        await this.audit.record(tx, {
          actor: user,
          entity: 'customer',
          entityId: saved.id,
          action: 'created',
          summary: `customer "${saved.name}" created`,
          details: { name: saved.name, contactEmail: saved.contactEmail, contacts: dto.contacts },
        });
        return saved;
      }),
    );
  }

  async update(id: number, dto: CustomerUpdate, user: User): Promise<Customer> {
    const before = await this.get(id);
    const set: Partial<Customer> = { name: dto.name };
    if (dto.contactEmail !== undefined) set.contactEmail = dto.contactEmail;
    if (dto.notes !== undefined) set.notes = dto.notes;
    if (dto.contacts !== undefined) set.contacts = dto.contacts;
    await this.unique(dto.name, () =>
      this.customers.manager.transaction(async (tx) => {
        await this.locked(tx, id, dto.version, set);
        const changed = (Object.keys(set) as (keyof typeof set)[]).filter(
          (k) => stableStringify(set[k]) !== stableStringify(before[k]),
        );
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

  /**
   * Archives (or restores) a customer: hidden from pickers, its masks, designs, reports and quotes
   * kept as they are. Archiving an archived customer (or restoring an active one) is a 409.
   */
  async setArchived(id: number, archived: boolean, version: number, user: User): Promise<Customer> {
    const before = await this.get(id);
    if (Boolean(before.archivedAt) === archived) {
      throw new ConflictException(
        `Customer "${before.name}" is ${archived ? 'already archived' : 'not archived'}`,
      );
    }
    await this.customers.manager.transaction(async (tx) => {
      await this.locked(tx, id, version, { archivedAt: archived ? new Date() : null });
      await this.audit.record(tx, {
        actor: user,
        entity: 'customer',
        entityId: id,
        action: archived ? 'archived' : 'restored',
        summary: `customer "${before.name}" ${archived ? 'archived: hidden from pickers, records kept' : 'restored'}`,
        details: {},
      });
    });
    return this.get(id);
  }

  private async locked(tx: EntityManager, id: number, version: number, set: Partial<Customer>) {
    await updateIfVersion(tx, Customer, { id, expectedVersion: version, set }, async () => {
      const now = await this.get(id);
      return new ConflictException(
        `Customer "${now.name}" was changed by someone else (now version ${now.version}); reload it and apply your edit again`,
      );
    });
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
