import {
  Body,
  Controller,
  Get,
  Param,
  ParseFloatPipe,
  ParseIntPipe,
  Post,
  Put,
  Query,
  Res,
  StreamableFile,
} from '@nestjs/common';
import type { Response } from 'express';
import type { ChamberView } from '@quietglass/shared/chambers';
import type { RunSheetView } from '@quietglass/shared/runsheet';
import { CurrentUser } from '../auth/current-user.decorator.js';
import { Roles } from '../auth/roles.decorator.js';
import type { User } from '../users/user.entity.js';
import { toChamberView } from './chamber.entity.js';
import { ChambersService } from './chambers.service.js';
import { ChamberDto, UpdateChamberDto } from './dto/chamber.dto.js';
import { RunSheetService } from './run-sheet.service.js';

/** Chambers are kept by admins and engineers; operators read them and print run sheets. */
@Controller()
@Roles('admin', 'engineer', 'operator')
export class ChambersController {
  constructor(
    private readonly chambers: ChambersService,
    private readonly runSheets: RunSheetService,
  ) {}

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
  async create(@Body() dto: ChamberDto, @CurrentUser() user: User): Promise<ChamberView> {
    return toChamberView(await this.chambers.create(dto, user));
  }

  @Put('chambers/:id')
  @Roles('admin', 'engineer')
  async update(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: UpdateChamberDto,
    @CurrentUser() user: User,
  ): Promise<ChamberView> {
    return toChamberView(await this.chambers.update(id, dto, user));
  }

  @Get('recipes/:id/:number/run-sheet')
  runSheet(
    @Param('id', ParseIntPipe) id: number,
    @Param('number', ParseIntPipe) number: number,
    @Query('chamberId', ParseIntPipe) chamberId: number,
    @Query('monitorWavelengthNm', new ParseFloatPipe({ optional: true })) monitorWavelengthNm?: number,
  ): Promise<RunSheetView> {
    return this.runSheets.build(id, number, chamberId, monitorWavelengthNm);
  }

  @Get('recipes/:id/:number/run-sheet.pdf')
  async runSheetPdf(
    @Param('id', ParseIntPipe) id: number,
    @Param('number', ParseIntPipe) number: number,
    @Query('chamberId', ParseIntPipe) chamberId: number,
    @Res({ passthrough: true }) res: Response,
    @Query('monitorWavelengthNm', new ParseFloatPipe({ optional: true })) monitorWavelengthNm?: number,
  ): Promise<StreamableFile> {
    const sheet = await this.runSheets.build(id, number, chamberId, monitorWavelengthNm);
    res.setHeader('Content-Disposition', `attachment; filename="run-sheet-${id}-v${number}.pdf"`);
    return new StreamableFile(await this.runSheets.pdf(sheet), { type: 'application/pdf' });
  }
}
