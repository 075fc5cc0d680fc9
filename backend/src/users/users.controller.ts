import { Body, Controller, Get, HttpCode, Param, ParseIntPipe, Patch, Post } from '@nestjs/common';
import type { UserView } from '@quietglass/shared';
import { Roles } from '../auth/roles.decorator.js';
import { CurrentUser } from '../auth/current-user.decorator.js';
import { CreateUserDto } from './dto/create-user.dto.js';
import { UpdateUserDto } from './dto/update-user.dto.js';
import { SetPasswordDto } from './dto/set-password.dto.js';
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
  async create(@Body() dto: CreateUserDto, @CurrentUser() actor: User): Promise<UserView> {
    return toUserView(await this.users.create(dto, actor));
  }

  @Patch(':id')
  async update(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: UpdateUserDto,
    @CurrentUser() actor: User,
  ): Promise<UserView> {
    return toUserView(await this.users.update(id, dto, actor));
  }

  @Post(':id/password')
  @HttpCode(204)
  async resetPassword(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: SetPasswordDto,
    @CurrentUser() actor: User,
  ): Promise<void> {
    await this.users.setPassword(id, dto.newPassword, { kind: 'admin', actor });
  }
}
