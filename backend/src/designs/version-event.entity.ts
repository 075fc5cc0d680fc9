import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { VersionEventView, VersionStatus } from '@quietglass/shared/designs';
import { User } from '../users/user.entity.js';

/** One step of a version's lifecycle: who moved it, when, from which status to which, and why. */
@Entity({ name: 'version_events' })
export class VersionEvent {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'design_id', type: 'integer' })
  designId: number;

  @Column({ name: 'version_number', type: 'integer' })
  versionNumber: number;

  @Column({ name: 'from_status', type: 'varchar', length: 16 })
  fromStatus: VersionStatus;

  @Column({ name: 'to_status', type: 'varchar', length: 16 })
  toStatus: VersionStatus;

  @ManyToOne(() => User, { nullable: false, eager: true })
  @JoinColumn({ name: 'actor_id' })
  actor: User;

  @Column({ type: 'text', default: '' })
  comment: string;

  /** A status change, or a save of the content (then from = to). */
  @Column({ type: 'varchar', length: 12, default: 'status' })
  kind: 'status' | 'saved';

  @CreateDateColumn({ name: 'at', type: 'timestamptz' })
  at: Date;
}

export function toEventView(e: VersionEvent): VersionEventView {
  return {
    id: e.id,
    designId: e.designId,
    versionNumber: e.versionNumber,
    from: e.fromStatus,
    to: e.toStatus,
    actor: { id: e.actor.id, displayName: e.actor.displayName, role: e.actor.role },
    comment: e.comment,
    at: e.at.toISOString(),
    kind: e.kind,
  };
}
