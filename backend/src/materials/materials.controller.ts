import {
  Body,
  Controller,
  Get,
  HttpCode,
  Param,
  ParseIntPipe,
  Post,
  Put,
  StreamableFile,
} from '@nestjs/common';
import { CurrentUser } from '../auth/current-user.decorator.js';
import { Roles } from '../auth/roles.decorator.js';
import type { User } from '../users/user.entity.js';
import {
  ImportConstantsFileDto,
  ImportMaterialCsvDto,
  MaterialDto,
  MaterialVersionDto,
  NkCsvDto,
  UpdateMaterialDto,
} from './dto/material.dto.js';
import {
  toMaterialRevisionView,
  toMaterialView,
  type MaterialRevisionView,
  type MaterialView,
} from './material.entity.js';
import { MaterialsService, type NkCsvPreview } from './materials.service.js';

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

  /** The file the material was imported from, as it was uploaded. */
  @Get(':id/source-file')
  async sourceFile(@Param('id', ParseIntPipe) id: number): Promise<StreamableFile> {
    const file = await this.materials.sourceFile(id);
    const safe = file.fileName.replace(/[^\w.\- ()]/g, '_');
    return new StreamableFile(file.content, {
      type: file.mediaType,
      disposition: `attachment; filename="${safe}"`,
      length: file.content.length,
    });
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

  /** What an n,k file reads as (rows in nm, the unit used), without saving anything. */
  @Post('import-csv/preview')
  @HttpCode(200)
  @Roles('admin', 'engineer')
  previewCsv(@Body() dto: NkCsvDto): NkCsvPreview {
    return this.materials.previewCsv(dto);
  }

  /** A material from a published optical-constants file, with its reference as provenance. */
  @Post('import-constants')
  @Roles('admin', 'engineer')
  async importConstants(
    @Body() dto: ImportConstantsFileDto,
    @CurrentUser() user: User,
  ): Promise<MaterialView> {
    return toMaterialView(await this.materials.importConstantsFile(dto, user));
  }

  /** Hidden from pickers; kept, and still shown, for the versions that use it. */
  @Post(':id/retire')
  @Roles('admin', 'engineer')
  async retire(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: MaterialVersionDto,
    @CurrentUser() user: User,
  ): Promise<MaterialView> {
    return toMaterialView(await this.materials.setRetired(id, true, dto.version, user));
  }

  @Post(':id/restore')
  @Roles('admin', 'engineer')
  async restore(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: MaterialVersionDto,
    @CurrentUser() user: User,
  ): Promise<MaterialView> {
    return toMaterialView(await this.materials.setRetired(id, false, dto.version, user));
  }
}
