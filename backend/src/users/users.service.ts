import { ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository } from 'typeorm';
import { User } from './user.entity.js';
import type { CreateUserDto } from './dto/create-user.dto.js';
import type { UpdateUserDto } from './dto/update-user.dto.js';
import { isUniqueViolation } from '../common/db-errors.js';
import { hashPassword } from './passwords.js';

@Injectable()
export class UsersService {
  constructor(@InjectRepository(User) private readonly users: Repository<User>) {}

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
    if (dto.displayName !== undefined) user.displayName = dto.displayName;
    if (dto.role !== undefined) user.role = dto.role;
    if (dto.active !== undefined) user.active = dto.active;
    return this.users.save(user);
  }

  async setPassword(id: number, newPassword: string): Promise<void> {
    const user = await this.get(id);
    user.passwordHash = await hashPassword(newPassword);
    await this.users.save(user);
  }
}
