import { Body, Controller, Get, Param, ParseIntPipe, Post, Put } from '@nestjs/common';
import { Roles } from '../auth/roles.decorator.js';
import { ImportMaterialCsvDto, MaterialDto, UpdateMaterialDto } from './dto/material.dto.js';
import { toMaterialView, type MaterialView } from './material.entity.js';
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

  @Post()
  @Roles('admin', 'engineer')
  async create(@Body() dto: MaterialDto): Promise<MaterialView> {
    return toMaterialView(await this.materials.create(dto));
  }

  @Put(':id')
  @Roles('admin', 'engineer')
  async update(@Param('id', ParseIntPipe) id: number, @Body() dto: UpdateMaterialDto): Promise<MaterialView> {
    return toMaterialView(await this.materials.update(id, dto));
  }

  @Post('import-csv')
  @Roles('admin', 'engineer')
  async importCsv(@Body() dto: ImportMaterialCsvDto): Promise<MaterialView> {
    return toMaterialView(await this.materials.importCsv(dto));
  }
}
