import { randomUUID } from 'node:crypto';
import { Inject, Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { IsNull, type EntityManager, Repository } from 'typeorm';
import { appConfig, type AppConfig } from '../config/configuration.js';
import { Session } from './session.entity.js';

export type SessionEndReason =
  'sign-out' | 'password-changed' | 'password-reset' | 'role-changed' | 'deactivated';

/** Renewing on every request would write on every request; once a minute is enough for idling. */
const RENEW_AFTER_MS = 60_000;

@Injectable()
export class SessionsService {
  constructor(
    @InjectRepository(Session) private readonly sessions: Repository<Session>,
    @Inject(appConfig.KEY) private readonly config: AppConfig,
  ) {}

  async open(userId: number): Promise<Session> {
    const now = new Date();
    const session = this.sessions.create({
      id: randomUUID(),
      userId,
      lastSeenAt: now,
      expiresAt: new Date(now.getTime() + this.config.jwtTtlSeconds * 1000),
      endedAt: null,
      endReason: null,
    });
    return this.sessions.save(session);
  }

  /**
   * The open session with this id of this user, renewed (sliding idle timeout), or null when it
   * was ended, has idled out or reached its absolute end.
   */
  async touch(id: string, userId: number): Promise<Session | null> {
    const session = await this.sessions.findOneBy({ id, userId, endedAt: IsNull() });
    if (!session) return null;
    const now = Date.now();
    if (session.expiresAt.getTime() <= now) return null;
    if (session.lastSeenAt.getTime() + this.config.sessionIdleSeconds * 1000 <= now) {
      await this.end(id, 'idle');
      return null;
    }
    if (now - session.lastSeenAt.getTime() > RENEW_AFTER_MS) {
      session.lastSeenAt = new Date(now);
      await this.sessions.update({ id }, { lastSeenAt: session.lastSeenAt });
    }
    return session;
  }

  async end(id: string, reason: SessionEndReason | 'idle'): Promise<void> {
    await this.sessions.update({ id, endedAt: IsNull() }, { endedAt: new Date(), endReason: reason });
  }

  /** Ends every open session of the user (but `keep`), inside the caller's transaction if given. */
  async endAllOf(
    userId: number,
    reason: SessionEndReason,
    options: { keep?: string; tx?: EntityManager } = {},
  ): Promise<number> {
    const repo = options.tx ? options.tx.getRepository(Session) : this.sessions;
    const qb = repo
      .createQueryBuilder()
      .update(Session)
      .set({ endedAt: () => 'now()', endReason: reason })
      .where('user_id = :userId AND ended_at IS NULL', { userId });
    if (options.keep) qb.andWhere('id <> :keep', { keep: options.keep });
    const result = await qb.execute();
    return result.affected ?? 0;
  }
}
