import { ConflictException, ForbiddenException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository } from 'typeorm';
import { AuditService } from '../audit/audit.service.js';
import { User } from './user.entity.js';
import type { CreateUserInput, UpdateUserInput } from '@quietglass/shared/schemas/users';
import { isUniqueViolation } from '../common/db-errors.js';
import { SessionsService } from '../sessions/sessions.service.js';
import { hashPassword } from './passwords.js';

@Injectable()
export class UsersService {
  constructor(
    @InjectRepository(User) private readonly users: Repository<User>,
    private readonly sessions: SessionsService,
    private readonly audit: AuditService,
  ) {}

  list(): Promise<User[]> {
    return this.users.find({ order: { id: 'ASC' } });
  }

  async get(id: number): Promise<User> {
    const user = await this.users.findOneBy({ id });
    if (!user) throw new NotFoundException(`User ${id} does not exist`);
    return user;
  }

  findById(id: number): Promise<User | null> {
    return this.users.findOneBy({ id });
  }

  findByEmail(email: string): Promise<User | null> {
    return this.users.findOneBy({ email: email.trim().toLowerCase() });
  }

  async create(dto: CreateUserInput, actor?: User): Promise<User> {
    const user = this.users.create({
      email: dto.email,
      displayName: dto.displayName,
      role: dto.role,
      passwordHash: await hashPassword(dto.password),
      active: true,
      // The admin chose this password: the user picks their own at first sign-in.
      mustChangePassword: true,
    });
    try {
      return await this.users.manager.transaction(async (tx) => {
        const saved = await tx.getRepository(User).save(user);
        await this.audit.record(tx, {
          actor: actor ?? null,
          entity: 'user',
          entityId: saved.id,
          action: 'created',
          summary: `${saved.displayName} <${saved.email}> created as ${saved.role}`,
          details: { email: saved.email, role: saved.role },
        });
        return saved;
      });
    } catch (err) {
      if (isUniqueViolation(err)) {
        throw new ConflictException(`A user with e-mail ${dto.email} already exists`);
      }
      throw err;
    }
  }

  /**
   * Admin edit. An admin cannot change their own role or deactivate themselves (no lock-out). The
   * rows of the active admins are locked first, so concurrent edits that could take admins away
   * (two admins demoting each other) run one after the other: the second finds its actor no longer
   * an active admin and is refused, and the shop always keeps one.
   */
  async update(id: number, dto: UpdateUserInput, actor: User): Promise<User> {
    const actorId = actor.id;
    await this.get(id);
    return this.users.manager.transaction(async (tx) => {
      const admins = await tx.query<{ id: number }[]>(
        `SELECT id FROM users WHERE role = 'admin' AND active ORDER BY id FOR UPDATE`,
      );
      if (!admins.some((a) => a.id === actorId))
        throw new ForbiddenException('You are no longer an active admin; reload the page');
      const user = await tx
        .getRepository(User)
        .findOneOrFail({ where: { id }, lock: { mode: 'pessimistic_write' } });
      // The row is locked until the commit, so this check and the save below cannot be overtaken.
      if (user.version !== dto.version)
        throw new ConflictException(
          `${user.displayName} was changed by someone else (now version ${user.version}); reload the page and apply your change again`,
        );
      const before = { displayName: user.displayName, role: user.role, active: user.active };
      if (id === actorId && dto.role !== undefined && dto.role !== user.role) {
        throw new ConflictException('You cannot change your own role; ask another admin');
      }
      if (id === actorId && dto.active === false) {
        throw new ConflictException('You cannot deactivate yourself; ask another admin');
      }
      const roleChanged = dto.role !== undefined && dto.role !== user.role;
      const deactivated = dto.active === false && user.active;
      const losesAdmin =
        user.role === 'admin' && user.active && ((roleChanged && dto.role !== 'admin') || deactivated);
      if (losesAdmin && admins.length <= 1)
        throw new ConflictException(
          `${user.displayName} is the last active admin; make another user admin first`,
        );
      if (dto.displayName !== undefined) user.displayName = dto.displayName;
      if (dto.role !== undefined) user.role = dto.role;
      if (dto.active !== undefined) user.active = dto.active;
      const saved = await tx.getRepository(User).save(user);
      const changes: [string, string, unknown, unknown][] = [];
      if (before.role !== saved.role) changes.push(['role changed', 'role', before.role, saved.role]);
      if (before.active !== saved.active)
        changes.push([saved.active ? 'activated' : 'deactivated', 'active', before.active, saved.active]);
      if (before.displayName !== saved.displayName)
        changes.push(['renamed', 'displayName', before.displayName, saved.displayName]);
      for (const [action, field, from, to] of changes) {
        await this.audit.record(tx, {
          actor,
          entity: 'user',
          entityId: id,
          action,
          summary: `${saved.email}: ${field} ${String(from)} → ${String(to)}`,
          details: { field, from, to },
        });
      }
      // A session carries what its user could do when it began: a new role or a deactivation ends them.
      if (deactivated) await this.sessions.endAllOf(id, 'deactivated', { tx });
      else if (roleChanged) await this.sessions.endAllOf(id, 'role-changed', { tx });
      return saved;
    });
  }

  /**
   * Sets a new password, on the audit trail. By an admin (a reset): every session of the user ends
   * and the user must choose their own at next sign-in. By the user: their other sessions end, this
   * one stays.
   */
  async setPassword(
    id: number,
    newPassword: string,
    by: { kind: 'admin'; actor: User } | { kind: 'self'; keepSession?: string },
  ): Promise<void> {
    const user = await this.get(id);
    const reset = by.kind === 'admin';
    user.passwordHash = await hashPassword(newPassword);
    user.mustChangePassword = reset;
    await this.users.manager.transaction(async (tx) => {
      await tx.getRepository(User).save(user);
      await this.audit.record(tx, {
        actor: reset ? by.actor : user,
        entity: 'user',
        entityId: id,
        action: reset ? 'password reset' : 'password changed',
        summary: `${user.email}: password ${reset ? 'reset by an admin' : 'changed by its owner'}`,
      });
      if (reset) await this.sessions.endAllOf(id, 'password-reset', { tx });
      else await this.sessions.endAllOf(id, 'password-changed', { tx, keep: by.keepSession });
    });
  }
}
