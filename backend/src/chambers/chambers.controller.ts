import { Body, Controller, Get, Param, ParseIntPipe, Post, Put } from '@nestjs/common';
import type { ChamberView, ProcessSettingsView } from '@quietglass/shared/chambers';
import {
  chamberInputSchema,
  chamberUpdateSchema,
  type ChamberInput,
  type ChamberUpdate,
} from '@quietglass/shared/schemas/chambers';
import {
  processSettingsSchema,
  type ProcessSettingsInput,
} from '@quietglass/shared/schemas/process-settings';
import { CurrentUser } from '../auth/current-user.decorator.js';
import { Roles } from '../auth/roles.decorator.js';
import { ZodBody } from '../common/zod-body.js';
import type { User } from '../users/user.entity.js';
import { toChamberView } from './chamber.entity.js';
import { ChambersService } from './chambers.service.js';

/** Chambers are kept by admins and engineers; operators read them. */
@Controller()
@Roles('admin', 'engineer', 'operator')
export class ChambersController {
  constructor(private readonly chambers: ChambersService) {}

  @Get('chambers')
  async list(): Promise<ChamberView[]> {
    return (await this.chambers.list()).map(toChamberView);
  }

  @Get('chambers/:id')
  async get(@Param('id', ParseIntPipe) id: number): Promise<ChamberView> {
    return toChamberView(await this.chambers.get(id));
  }

  @Post('chambers')
  @Roles('admin', 'engineer')
  @ZodBody(chamberInputSchema)
  async create(@Body() dto: ChamberInput, @CurrentUser() user: User): Promise<ChamberView> {
    return toChamberView(await this.chambers.create(dto, user));
  }

  @Put('chambers/:id')
  @Roles('admin', 'engineer')
  @ZodBody(chamberUpdateSchema)
  async update(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: ChamberUpdate,
    @CurrentUser() user: User,
  ): Promise<ChamberView> {
    return toChamberView(await this.chambers.update(id, dto, user));
  }

  @Get('chambers/:id/process-settings')
  processSettings(@Param('id', ParseIntPipe) id: number): Promise<ProcessSettingsView> {
    return this.chambers.getProcessSettings(id);
  }

  @Put('chambers/:id/process-settings')
  @Roles('admin', 'engineer')
  @ZodBody(processSettingsSchema)
  saveProcessSettings(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: ProcessSettingsInput,
    @CurrentUser() user: User,
  ): Promise<ProcessSettingsView> {
    return this.chambers.saveProcessSettings(id, dto, user);
  }
}
