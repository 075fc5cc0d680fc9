import { Body, Controller, Get, Header, Param, ParseIntPipe, Post, Put, Query } from '@nestjs/common';
import { CurrentUser } from '../auth/current-user.decorator.js';
import { Roles } from '../auth/roles.decorator.js';
import {
  specMaskCsvImportSchema,
  specMaskInputSchema,
  specMaskUpdateSchema,
  type SpecMaskCsvImport,
  type SpecMaskInput,
  type SpecMaskUpdate,
} from '@quietglass/shared/schemas/spec-masks';
import { ZodBody } from '../common/zod-body.js';
import type { User } from '../users/user.entity.js';
import { maskToCsv } from './mask-csv.js';
import { toSpecMaskView, type SpecMaskView } from './spec-mask.entity.js';
import { SpecMasksService } from './spec-masks.service.js';

/** Engineers and sales capture customers' spec masks; operators work from released recipes. */
@Controller('spec-masks')
@Roles('admin', 'engineer', 'sales')
export class SpecMasksController {
  constructor(private readonly masks: SpecMasksService) {}

  @Get()
  async list(
    @Query('customerId', new ParseIntPipe({ optional: true })) customerId?: number,
  ): Promise<SpecMaskView[]> {
    return (await this.masks.list(customerId)).map(toSpecMaskView);
  }

  @Get(':id')
  async get(@Param('id', ParseIntPipe) id: number): Promise<SpecMaskView> {
    return toSpecMaskView(await this.masks.get(id));
  }

  @Get(':id/csv')
  @Header('Content-Type', 'text/csv; charset=utf-8')
  async csv(@Param('id', ParseIntPipe) id: number): Promise<string> {
    return maskToCsv((await this.masks.get(id)).bands);
  }

  @Post()
  @ZodBody(specMaskInputSchema)
  async create(@Body() dto: SpecMaskInput, @CurrentUser() user: User): Promise<SpecMaskView> {
    return toSpecMaskView(await this.masks.create(dto, user));
  }

  @Put(':id')
  @ZodBody(specMaskUpdateSchema)
  async update(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: SpecMaskUpdate,
    @CurrentUser() user: User,
  ): Promise<SpecMaskView> {
    return toSpecMaskView(await this.masks.update(id, dto, user));
  }

  @Post('import-csv')
  @ZodBody(specMaskCsvImportSchema)
  async importCsv(@Body() dto: SpecMaskCsvImport, @CurrentUser() user: User): Promise<SpecMaskView> {
    return toSpecMaskView(await this.masks.importCsv(dto, user));
  }
}
