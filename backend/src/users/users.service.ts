import { ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository } from 'typeorm';
import { User } from './user.entity.js';
import type { CreateUserDto } from './dto/create-user.dto.js';
import type { UpdateUserDto } from './dto/update-user.dto.js';
import { isUniqueViolation } from '../common/db-errors.js';
import { SessionsService } from '../sessions/sessions.service.js';
import { hashPassword } from './passwords.js';

@Injectable()
export class UsersService {
  constructor(
    @InjectRepository(User) private readonly users: Repository<User>,
    private readonly sessions: SessionsService,
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

  async create(dto: CreateUserDto): Promise<User> {
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
      return await this.users.save(user);
    } catch (err) {
      if (isUniqueViolation(err)) {
        throw new ConflictException(`A user with e-mail ${dto.email} already exists`);
      }
      throw err;
    }
  }

  /** Admin edit. An admin cannot change their own role or deactivate themselves (no lock-out). */
  async update(id: number, dto: UpdateUserDto, actorId: number): Promise<User> {
    const user = await this.get(id);
    if (id === actorId && dto.role !== undefined && dto.role !== user.role) {
      throw new ConflictException('You cannot change your own role; ask another admin');
    }
    if (id === actorId && dto.active === false) {
      throw new ConflictException('You cannot deactivate yourself; ask another admin');
    }
    const roleChanged = dto.role !== undefined && dto.role !== user.role;
    const deactivated = dto.active === false && user.active;
    if (dto.displayName !== undefined) user.displayName = dto.displayName;
    if (dto.role !== undefined) user.role = dto.role;
    if (dto.active !== undefined) user.active = dto.active;
    const saved = await this.users.save(user);
    // A session carries what its user could do when it began: a new role or a deactivation ends them.
    if (deactivated) await this.sessions.endAllOf(id, 'deactivated');
    else if (roleChanged) await this.sessions.endAllOf(id, 'role-changed');
    return saved;
  }

  /**
   * Sets a new password. By an admin (a reset): every session of the user ends and the user must
   * choose their own at next sign-in. By the user: their other sessions end, this one stays.
   */
  async setPassword(
    id: number,
    newPassword: string,
    by: { kind: 'admin' } | { kind: 'self'; keepSession?: string },
  ): Promise<void> {
    const user = await this.get(id);
    user.passwordHash = await hashPassword(newPassword);
    user.mustChangePassword = by.kind === 'admin';
    await this.users.save(user);
    if (by.kind === 'admin') await this.sessions.endAllOf(id, 'password-reset');
    else await this.sessions.endAllOf(id, 'password-changed', { keep: by.keepSession });
  }
}
