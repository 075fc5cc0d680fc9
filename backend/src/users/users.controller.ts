import { Body, Controller, Get, HttpCode, Param, ParseIntPipe, Patch, Post } from '@nestjs/common';
import type { UserView } from '@quietglass/shared';
import { Roles } from '../auth/roles.decorator.js';
import { CurrentUser } from '../auth/current-user.decorator.js';
import {
  createUserSchema,
  setPasswordSchema,
  updateUserSchema,
  type CreateUserInput,
  type SetPasswordInput,
  type UpdateUserInput,
} from '@quietglass/shared/schemas/users';
import { ZodBody } from '../common/zod-body.js';
import type { User } from './user.entity.js';
import { toUserView } from './user-view.js';
import { UsersService } from './users.service.js';

@Controller('users')
@Roles('admin')
export class UsersController {
  constructor(private readonly users: UsersService) {}

  @Get()
  async list(): Promise<UserView[]> {
    return (await this.users.list()).map(toUserView);
  }

  @Post()
  @ZodBody(createUserSchema)
  async create(@Body() dto: CreateUserInput, @CurrentUser() actor: User): Promise<UserView> {
    return toUserView(await this.users.create(dto, actor));
  }

  @Patch(':id')
  @ZodBody(updateUserSchema)
  async update(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: UpdateUserInput,
    @CurrentUser() actor: User,
  ): Promise<UserView> {
    return toUserView(await this.users.update(id, dto, actor));
  }

  @Post(':id/password')
  @HttpCode(204)
  @ZodBody(setPasswordSchema)
  async resetPassword(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: SetPasswordInput,
    @CurrentUser() actor: User,
  ): Promise<void> {
    await this.users.setPassword(id, dto.newPassword, { kind: 'admin', actor });
  }
}
