import { Body, Controller, Get, Param, ParseIntPipe, Post, Put } from '@nestjs/common';
import { CurrentUser } from '../auth/current-user.decorator.js';
import { Roles } from '../auth/roles.decorator.js';
import type { User } from '../users/user.entity.js';
import { ImportMaterialCsvDto, MaterialDto, UpdateMaterialDto } from './dto/material.dto.js';
import {
  toMaterialRevisionView,
  toMaterialView,
  type MaterialRevisionView,
  type MaterialView,
} from './material.entity.js';
import { MaterialsService } from './materials.service.js';

/** Everyone reads the materials library; engineers and admins maintain it. */
@Controller('materials')
export class MaterialsController {
  constructor(private readonly materials: MaterialsService) {}

  @Get()
  async list(): Promise<MaterialView[]> {
    return (await this.materials.list()).map(toMaterialView);
  }

  @Get(':id')
  async get(@Param('id', ParseIntPipe) id: number): Promise<MaterialView> {
    return toMaterialView(await this.materials.get(id));
  }

  /** Earlier revisions, newest first: what versions frozen before an edit were built from. */
  @Get(':id/revisions')
  async revisions(@Param('id', ParseIntPipe) id: number): Promise<MaterialRevisionView[]> {
    return (await this.materials.revisions(id)).map(toMaterialRevisionView);
  }

  @Post()
  @Roles('admin', 'engineer')
  async create(@Body() dto: MaterialDto, @CurrentUser() user: User): Promise<MaterialView> {
    return toMaterialView(await this.materials.create(dto, user));
  }

  @Put(':id')
  @Roles('admin', 'engineer')
  async update(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: UpdateMaterialDto,
    @CurrentUser() user: User,
  ): Promise<MaterialView> {
    return toMaterialView(await this.materials.update(id, dto, user));
  }

  @Post('import-csv')
  @Roles('admin', 'engineer')
  async importCsv(@Body() dto: ImportMaterialCsvDto, @CurrentUser() user: User): Promise<MaterialView> {
    return toMaterialView(await this.materials.importCsv(dto, user));
  }
}
