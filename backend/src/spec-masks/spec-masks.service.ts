import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository, type EntityManager } from 'typeorm';
import {
  limitBandsSchema,
  type SpecMaskCsvImport,
  type SpecMaskInput,
  type SpecMaskUpdate,
} from '@quietglass/shared/schemas/spec-masks';
import { nextRevision } from '@quietglass/shared/revisions';
import { AuditService } from '../audit/audit.service.js';
import { isUniqueViolation } from '../common/db-errors.js';
import { missingAsBadRequest } from '../common/not-found.js';
import { updateIfVersion } from '../common/optimistic-lock.js';
import type { User } from '../users/user.entity.js';
import { CustomersService } from '../customers/customers.service.js';
import { parseMaskCsv } from './mask-csv.js';
import { SpecMaskRecord } from './spec-mask.entity.js';

@Injectable()
export class SpecMasksService {
  constructor(
    @InjectRepository(SpecMaskRecord) private readonly masks: Repository<SpecMaskRecord>,
    private readonly customers: CustomersService,
    private readonly audit: AuditService,
  ) {}

  list(customerId?: number): Promise<SpecMaskRecord[]> {
    return this.masks.find({
      where: customerId === undefined ? {} : { customer: { id: customerId } },
      order: { name: 'ASC', revision: 'ASC' },
    });
  }

  async get(id: number): Promise<SpecMaskRecord> {
    const mask = await this.masks.findOneBy({ id });
    if (!mask) throw new NotFoundException(`Spec mask ${id} does not exist`);
    return mask;
  }

  /** `dto.bands` come checked and normalised by the engine (the shared schema ran it). */
  async create(dto: SpecMaskInput, user: User): Promise<SpecMaskRecord> {
    const bands = dto.bands;
    const customer = await this.customer(dto.customerId);
    const kind = dto.kind ?? 'customer';
    return this.unique(dto, () =>
      this.masks.manager.transaction(async (tx) => {
        const repo = tx.getRepository(SpecMaskRecord);
        const saved = await repo.save(
          repo.create({
            name: dto.name,
            customer,
            revision: dto.revision,
            kind,
            bands,
            notes: dto.notes ?? '',
          }),
        );
        await this.audit.record(tx, {
          actor: user,
          entity: 'spec-mask',
          entityId: saved.id,
          action: 'created',
          summary: `${kind === 'internal' ? 'internal design target' : 'spec mask'} "${saved.name}" rev ${saved.revision} created for ${customer.name}`,
          details: { revision: saved.revision, kind, bands },
        });
        return saved;
      }),
    );
  }

  /**
   * Edits a mask. A mask that a submitted version (whatever became of it since), a compliance
   * report or a quote has referred to is a customer-visible fact (`markInUse` recorded it): it is
   * never changed in place; the edit
   * becomes its next revision (A → B, or the revision the editor named) and the old one stays
   * readable, pointing at its successor. Either way the edit carries the version it started from.
   */
  async update(id: number, dto: SpecMaskUpdate, user: User): Promise<SpecMaskRecord> {
    const mask = await this.get(id);
    if (mask.supersededById !== null) {
      throw new ConflictException(
        `Spec mask "${mask.name}" rev ${mask.revision} was revised (see spec mask ${mask.supersededById}); edit the newest revision`,
      );
    }
    const bands = dto.bands;
    const customer = await this.customer(dto.customerId);
    const kind = dto.kind ?? mask.kind;
    const staleError = async () => stale(await this.get(id));
    return this.unique(dto, () =>
      this.masks.manager.transaction(async (tx) => {
        // The row lock orders this edit with a record starting to use the mask (markInUse).
        const row = await tx.getRepository(SpecMaskRecord).findOne({
          where: { id },
          select: { id: true, inUseSince: true },
          lock: { mode: 'pessimistic_write' },
        });
        const used = row?.inUseSince !== null && row?.inUseSince !== undefined;
        if (!used) {
          await updateIfVersion(
            tx,
            SpecMaskRecord,
            {
              id,
              expectedVersion: dto.version,
              set: {
                name: dto.name,
                customer,
                revision: dto.revision,
                kind,
                bands,
                notes: dto.notes ?? mask.notes,
              },
              where: 'superseded_by_id IS NULL',
            },
            staleError,
          );
          await this.audit.record(tx, {
            actor: user,
            entity: 'spec-mask',
            entityId: id,
            action: 'edited',
            summary: `spec mask "${dto.name}" rev ${dto.revision} edited in place (not yet used by a submitted version, report or quote)`,
            details: {
              before: { revision: mask.revision, kind: mask.kind, bands: mask.bands },
              after: { revision: dto.revision, kind, bands },
            },
          });
          return tx.getRepository(SpecMaskRecord).findOneByOrFail({ id });
        }
        const revision = dto.revision.trim() !== mask.revision ? dto.revision : nextRevision(mask.revision);
        const repo = tx.getRepository(SpecMaskRecord);
        const next = await repo.save(
          repo.create({ name: dto.name, customer, revision, kind, bands, notes: dto.notes ?? mask.notes }),
        );
        await updateIfVersion(
          tx,
          SpecMaskRecord,
          {
            id,
            expectedVersion: dto.version,
            set: { supersededById: next.id },
            where: 'superseded_by_id IS NULL',
          },
          staleError,
        );
        await this.audit.record(tx, {
          actor: user,
          entity: 'spec-mask',
          entityId: id,
          action: 'revised',
          summary: `spec mask "${mask.name}" rev ${mask.revision} → rev ${revision} (new spec mask ${next.id}); rev ${mask.revision} stays as it was`,
          details: {
            nextId: next.id,
            from: { revision: mask.revision, kind: mask.kind, bands: mask.bands },
            to: { revision, kind, bands },
          },
        });
        return next;
      }),
    );
  }

  /**
   * Records that a customer-visible record (a submitted version of a design with this mask, a
   * compliance report, a quote) refers to the mask, inside that record's transaction: from then on
   * an edit makes the mask's next revision instead of changing it in place.
   */
  async markInUse(id: number, tx: EntityManager): Promise<void> {
    await tx.query('UPDATE spec_masks SET in_use_since = coalesce(in_use_since, now()) WHERE id = $1', [id]);
  }

  /** A new mask from CSV; a bad row or band rejects the whole file. */
  async importCsv(dto: SpecMaskCsvImport, user: User): Promise<SpecMaskRecord> {
    const parsed = parseMaskCsv(dto.csv);
    if (!parsed.ok) {
      throw new BadRequestException({
        message: parsed.problems.map((p) => (p.row > 0 ? `row ${p.row}: ${p.reason}` : p.reason)),
      });
    }
    // The bands' rules are the API's own (the shared schema); the CSV's data rows start on line 2,
    // so a problem names the row, not the array index.
    const checked = limitBandsSchema.safeParse(parsed.bands);
    if (!checked.success) {
      throw new BadRequestException({
        message: checked.error.issues.map((issue) => {
          const [index, ...field] = issue.path;
          if (typeof index !== 'number') return `mask: ${issue.message}`;
          return `row ${index + 2}${field.length > 0 ? ` ${field.join('.')}` : ''}: ${issue.message}`;
        }),
      });
    }
    return this.create({ ...dto, bands: checked.data }, user);
  }

  /** The customer a mask is written for: it must exist (400) and not be archived (409). */
  private async customer(id: number) {
    return missingAsBadRequest(this.customers.active(id), `customerId: customer ${id} does not exist`);
  }

  private async unique<T>(m: { name: string; revision: string }, write: () => Promise<T>): Promise<T> {
    try {
      return await write();
    } catch (err) {
      throw isUniqueViolation(err) ? duplicate(m) : err;
    }
  }
}

/**
 * Why an internal design target cannot stand in a report or quote: these judge against, and go
 * to, the customer. `byDefault`: the mask came from the design, not from the request.
 */
export function internalMaskProblem(mask: SpecMaskRecord, byDefault: boolean): string {
  return `specMaskId: spec mask "${mask.name}" rev ${mask.revision} ${byDefault ? "(the design's mask) " : ''}is an internal design target; reports and quotes use the customer's specification, choose a customer mask`;
}

function stale(mask: SpecMaskRecord): ConflictException {
  return new ConflictException(
    `Spec mask "${mask.name}" rev ${mask.revision} was changed by someone else (now version ${mask.version}); reload it and apply your edit again`,
  );
}

function duplicate(m: { name: string; revision: string }): ConflictException {
  return new ConflictException(`This customer already has a spec mask "${m.name}" rev ${m.revision}`);
}
