import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { AuditEntity, AuditEventView } from '@quietglass/shared/audit';
import { User } from '../users/user.entity.js';

/** One entry of the audit trail: who did what to which record, when. Never edited or deleted. */
@Entity({ name: 'audit_events' })
export class AuditEvent {
  @PrimaryGeneratedColumn()
  id: number;

  @CreateDateColumn({ name: 'at', type: 'timestamptz' })
  at: Date;

  @ManyToOne(() => User, { nullable: true, eager: true })
  @JoinColumn({ name: 'actor_id' })
  actor: User | null;

  @Column({ type: 'varchar', length: 32 })
  entity: AuditEntity;

  @Column({ name: 'entity_id', type: 'integer' })
  entityId: number;

  @Column({ type: 'varchar', length: 40 })
  action: string;

  @Column({ type: 'text', default: '' })
  summary: string;

  @Column({ type: 'jsonb', default: () => "'{}'" })
  details: Record<string, unknown>;
}

export function toAuditEventView(e: AuditEvent): AuditEventView {
  return {
    id: e.id,
    at: e.at.toISOString(),
    actor: e.actor ? { id: e.actor.id, displayName: e.actor.displayName, role: e.actor.role } : null,
    entity: e.entity,
    entityId: e.entityId,
    action: e.action,
    summary: e.summary,
    details: e.details,
  };
}
