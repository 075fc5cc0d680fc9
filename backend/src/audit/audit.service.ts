import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import Papa from 'papaparse';
import { DataSource, type EntityManager } from 'typeorm';
import {
  AUDIT_ENTITY_LABELS,
  AUDIT_PAGE_LIMIT,
  type AuditEntity,
  type AuditFilter,
} from '@quietglass/shared/audit';
import type { User } from '../users/user.entity.js';
import { AuditEvent } from './audit-event.entity.js';

/** What a module tells the audit trail about one change. */
export interface AuditEntry {
  /** Who made the change; null only for the system itself. */
  actor: Pick<User, 'id'> | null;
  entity: AuditEntity;
  entityId: number;
  action: string;
  summary?: string;
  details?: Record<string, unknown>;
}

/**
 * The shop's record of who changed what. Modules call `record(tx, entry)` with the EntityManager of
 * the transaction that makes the change, so the change and its entry are written together or not
 * at all.
 */
@Injectable()
export class AuditService {
  constructor(@InjectDataSource() private readonly db: DataSource) {}

  async record(tx: EntityManager, entry: AuditEntry): Promise<void> {
    const repo = tx.getRepository(AuditEvent);
    await repo.save(
      repo.create({
        actor: entry.actor ? { id: entry.actor.id } : null,
        entity: entry.entity,
        entityId: entry.entityId,
        action: entry.action,
        summary: entry.summary ?? '',
        details: entry.details ?? {},
      }),
    );
  }

  /** Entries matching the filter, newest first; at most `limit`. */
  find(filter: AuditFilter, limit: number | null = AUDIT_PAGE_LIMIT): Promise<AuditEvent[]> {
    const q = this.db
      .getRepository(AuditEvent)
      .createQueryBuilder('e')
      .leftJoinAndSelect('e.actor', 'actor')
      .orderBy('e.at', 'DESC')
      .addOrderBy('e.id', 'DESC');
    if (filter.entity !== undefined) q.andWhere('e.entity = :entity', { entity: filter.entity });
    if (filter.entityId !== undefined) q.andWhere('e.entity_id = :entityId', { entityId: filter.entityId });
    if (filter.actorId !== undefined) q.andWhere('e.actor_id = :actorId', { actorId: filter.actorId });
    if (filter.from !== undefined) q.andWhere('e.at >= :from::date', { from: filter.from });
    // "to" includes the whole day.
    if (filter.to !== undefined) q.andWhere(`e.at < (:to::date + interval '1 day')`, { to: filter.to });
    if (limit !== null) q.take(limit);
    return q.getMany();
  }

  /** Every matching entry as CSV, one line per entry; cells that spreadsheets would run are escaped. */
  async csv(filter: AuditFilter): Promise<string> {
    const rows = (await this.find(filter, null)).map((e) => [
      e.at.toISOString(),
      e.actor?.displayName ?? 'system',
      e.actor?.role ?? '',
      AUDIT_ENTITY_LABELS[e.entity] ?? e.entity,
      String(e.entityId),
      e.action,
      e.summary,
      JSON.stringify(e.details),
    ]);
    return `${Papa.unparse(
      {
        fields: ['at_utc', 'who', 'role', 'record', 'record_id', 'action', 'summary', 'details_json'],
        data: rows,
      },
      { escapeFormulae: true, newline: '\r\n' },
    )}\r\n`;
  }
}
