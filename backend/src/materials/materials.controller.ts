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
import {
  importConstantsFileSchema,
  importMaterialCsvSchema,
  materialInputSchema,
  materialUpdateSchema,
  materialVersionSchema,
  nkCsvSchema,
  type ImportConstantsFileInput,
  type ImportMaterialCsvInput,
  type MaterialInput,
  type MaterialUpdate,
  type MaterialVersionInput,
  type NkCsvInput,
} from '@quietglass/shared/schemas/materials';
import { CurrentUser } from '../auth/current-user.decorator.js';
import { Roles } from '../auth/roles.decorator.js';
import { ZodBody } from '../common/zod-body.js';
import type { User } from '../users/user.entity.js';
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
  @ZodBody(materialInputSchema)
  async create(@Body() dto: MaterialInput, @CurrentUser() user: User): Promise<MaterialView> {
    return toMaterialView(await this.materials.create(dto, user));
  }

  @Put(':id')
  @Roles('admin', 'engineer')
  @ZodBody(materialUpdateSchema)
  async update(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: MaterialUpdate,
    @CurrentUser() user: User,
  ): Promise<MaterialView> {
    return toMaterialView(await this.materials.update(id, dto, user));
  }

  @Post('import-csv')
  @Roles('admin', 'engineer')
  @ZodBody(importMaterialCsvSchema)
  async importCsv(@Body() dto: ImportMaterialCsvInput, @CurrentUser() user: User): Promise<MaterialView> {
    return toMaterialView(await this.materials.importCsv(dto, user));
  }

  /** What an n,k file reads as (rows in nm, the unit used), without saving anything. */
  @Post('import-csv/preview')
  @HttpCode(200)
  @Roles('admin', 'engineer')
  @ZodBody(nkCsvSchema)
  previewCsv(@Body() dto: NkCsvInput): NkCsvPreview {
    return this.materials.previewCsv(dto);
  }

  /** A material from a published optical-constants file, with its reference as provenance. */
  @Post('import-constants')
  @Roles('admin', 'engineer')
  @ZodBody(importConstantsFileSchema)
  async importConstants(
    @Body() dto: ImportConstantsFileInput,
    @CurrentUser() user: User,
  ): Promise<MaterialView> {
    return toMaterialView(await this.materials.importConstantsFile(dto, user));
  }

  /** Hidden from pickers; kept, and still shown, for the versions that use it. */
  @Post(':id/retire')
  @Roles('admin', 'engineer')
  @ZodBody(materialVersionSchema)
  async retire(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: MaterialVersionInput,
    @CurrentUser() user: User,
  ): Promise<MaterialView> {
    return toMaterialView(await this.materials.setRetired(id, true, dto.version, user));
  }

  @Post(':id/restore')
  @Roles('admin', 'engineer')
  @ZodBody(materialVersionSchema)
  async restore(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: MaterialVersionInput,
    @CurrentUser() user: User,
  ): Promise<MaterialView> {
    return toMaterialView(await this.materials.setRetired(id, false, dto.version, user));
  }
}
