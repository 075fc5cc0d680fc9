import { Body, Controller, Get, Param, ParseIntPipe, Patch, Post, Put } from '@nestjs/common';
import type { DesignSummaryView, DesignVersionView, DesignView } from '@quietglass/shared/designs';
import { CurrentUser } from '../auth/current-user.decorator.js';
import { Roles } from '../auth/roles.decorator.js';
import type { User } from '../users/user.entity.js';
import { CreateDesignDto, NewVersionDto, SaveVersionDto, UpdateDesignDto } from './dto/design.dto.js';
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
  create(@Body() dto: CreateDesignDto, @CurrentUser() user: User): Promise<DesignView> {
    return this.designs.create(dto, user);
  }

  @Get(':id')
  get(@Param('id', ParseIntPipe) id: number): Promise<DesignView> {
    return this.designs.get(id);
  }

  @Patch(':id')
  @Roles('admin', 'engineer')
  update(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: UpdateDesignDto,
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
  saveVersion(
    @Param('id', ParseIntPipe) id: number,
    @Param('number', ParseIntPipe) number: number,
    @Body() dto: SaveVersionDto,
    @CurrentUser() user: User,
  ): Promise<DesignVersionView> {
    return this.designs.saveVersion(id, number, dto, user);
  }

  @Post(':id/versions')
  @Roles('admin', 'engineer')
  newVersion(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: NewVersionDto,
    @CurrentUser() user: User,
  ): Promise<DesignVersionView> {
    return this.designs.newVersion(id, dto, user);
  }
}
