import { Column, CreateDateColumn, Entity, PrimaryColumn } from 'typeorm';

/**
 * A signed-in session, kept on the server so it can be ended: sign-out ends one session; a password
 * change, an admin reset, a role change or a deactivation ends every session of that user at once.
 */
@Entity({ name: 'sessions' })
export class Session {
  /** Random id carried in the signed cookie (claim `sid`). */
  @PrimaryColumn({ type: 'uuid' })
  id: string;

  @Column({ name: 'user_id', type: 'integer' })
  userId: number;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  /** Last request seen; the session ends after the idle timeout without one (sliding renewal). */
  @Column({ name: 'last_seen_at', type: 'timestamptz' })
  lastSeenAt: Date;

  /** Absolute end, however active the session is. */
  @Column({ name: 'expires_at', type: 'timestamptz' })
  expiresAt: Date;

  @Column({ name: 'ended_at', type: 'timestamptz', nullable: true })
  endedAt: Date | null;

  /** Why it ended: sign-out, password-changed, password-reset, role-changed, deactivated. */
  @Column({ name: 'end_reason', type: 'varchar', length: 32, nullable: true })
  endReason: string | null;
}
