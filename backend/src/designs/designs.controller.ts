import { Body, Controller, Get, Param, ParseIntPipe, Patch, Post, Put } from '@nestjs/common';
import type { DesignSummaryView, DesignVersionView, DesignView } from '@quietglass/shared/designs';
import { CurrentUser } from '../auth/current-user.decorator.js';
import { Roles } from '../auth/roles.decorator.js';
import {
  createDesignSchema,
  newVersionSchema,
  saveVersionSchema,
  updateDesignSchema,
  type CreateDesignInput,
  type NewVersionInput,
  type SaveVersionInput,
  type UpdateDesignInput,
} from '@quietglass/shared/schemas/designs';
import { ZodBody } from '../common/zod-body.js';
import type { User } from '../users/user.entity.js';
import { DesignsService } from './designs.service.js';

/** Engineers and admins write designs; sales read them (for quotes); operators see released recipes only. */
@Controller('designs')
@Roles('admin', 'engineer', 'sales')
export class DesignsController {
  constructor(private readonly designs: DesignsService) {}

  @Get()
  list(): Promise<DesignSummaryView[]> {
    return this.designs.list();
  }

  @Post()
  @Roles('admin', 'engineer')
  @ZodBody(createDesignSchema)
  create(@Body() dto: CreateDesignInput, @CurrentUser() user: User): Promise<DesignView> {
    return this.designs.create(dto, user);
  }

  @Get(':id')
  get(@Param('id', ParseIntPipe) id: number): Promise<DesignView> {
    return this.designs.get(id);
  }

  @Patch(':id')
  @Roles('admin', 'engineer')
  @ZodBody(updateDesignSchema)
  update(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: UpdateDesignInput,
    @CurrentUser() user: User,
  ): Promise<DesignView> {
    return this.designs.update(id, dto, user);
  }

  @Get(':id/versions/:number')
  getVersion(
    @Param('id', ParseIntPipe) id: number,
    @Param('number', ParseIntPipe) number: number,
  ): Promise<DesignVersionView> {
    return this.designs.getVersion(id, number);
  }

  @Put(':id/versions/:number')
  @Roles('admin', 'engineer')
  @ZodBody(saveVersionSchema)
  saveVersion(
    @Param('id', ParseIntPipe) id: number,
    @Param('number', ParseIntPipe) number: number,
    @Body() dto: SaveVersionInput,
    @CurrentUser() user: User,
  ): Promise<DesignVersionView> {
    return this.designs.saveVersion(id, number, dto, user);
  }

  @Post(':id/versions')
  @Roles('admin', 'engineer')
  @ZodBody(newVersionSchema)
  newVersion(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: NewVersionInput,
    @CurrentUser() user: User,
  ): Promise<DesignVersionView> {
    return this.designs.newVersion(id, dto, user);
  }
}
