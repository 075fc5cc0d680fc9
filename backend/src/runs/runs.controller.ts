import { Body, Controller, Get, Header, Param, ParseIntPipe, Post, Put, Res } from '@nestjs/common';
import type { Response } from 'express';
import type {
  RunDetailView,
  RunSpectrumView,
  RunView,
  SpectrumComparisonView,
} from '@quietglass/shared/runs';
import {
  runRemarkSchema,
  startRunSchema,
  updateRunSchema,
  uploadSpectrumSchema,
  type RunRemarkInput,
  type StartRunInput,
  type UpdateRunInput,
  type UploadSpectrumInput,
} from '@quietglass/shared/schemas/runs';
import { CurrentUser } from '../auth/current-user.decorator.js';
import { Roles } from '../auth/roles.decorator.js';
import { ZodBody } from '../common/zod-body.js';
import type { User } from '../users/user.entity.js';
import type { ChamberRun, RunSpectrum } from './run.entity.js';
import { RunsService } from './runs.service.js';

function runView(r: ChamberRun): RunView {
  const { operator, createdAt, updatedAt, ...rest } = r;
  return {
    ...rest,
    operator: { id: operator.id, displayName: operator.displayName },
    createdAt: createdAt.toISOString(),
    updatedAt: updatedAt.toISOString(),
  };
}

function spectrumView(s: RunSpectrum): RunSpectrumView {
  const { uploadedBy, uploadedAt, originalText: _original, ...rest } = s;
  return { ...rest, uploadedBy: uploadedBy.displayName, uploadedAt: uploadedAt.toISOString() };
}

/** Chamber runs: operators log what the chamber did; engineers read it back. */
@Controller('runs')
@Roles('admin', 'engineer', 'operator')
export class RunsController {
  constructor(private readonly runs: RunsService) {}

  @Get()
  async list(): Promise<RunView[]> {
    return (await this.runs.list()).map(runView);
  }

  @Post()
  @ZodBody(startRunSchema)
  async start(@Body() dto: StartRunInput, @CurrentUser() user: User): Promise<RunView> {
    return runView(await this.runs.start(dto, user));
  }

  @Get(':id')
  async get(@Param('id', ParseIntPipe) id: number): Promise<RunDetailView> {
    const [run, spectra] = await Promise.all([this.runs.get(id), this.runs.spectra(id)]);
    return { ...runView(run), spectra: spectra.map(spectrumView) };
  }

  @Put(':id')
  @ZodBody(updateRunSchema)
  async update(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: UpdateRunInput,
    @CurrentUser() user: User,
  ): Promise<RunView> {
    return runView(await this.runs.update(id, dto, user));
  }

  /** Anyone who reads runs may add a remark; the run's own fields stay its operator's. */
  @Post(':id/remarks')
  @ZodBody(runRemarkSchema)
  async remark(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: RunRemarkInput,
    @CurrentUser() user: User,
  ): Promise<RunView> {
    return runView(await this.runs.addRemark(id, dto, user));
  }

  @Post(':id/spectra')
  @ZodBody(uploadSpectrumSchema)
  async upload(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: UploadSpectrumInput,
    @CurrentUser() user: User,
  ): Promise<RunSpectrumView> {
    return spectrumView(await this.runs.uploadSpectrum(id, dto, user));
  }

  @Get(':id/spectra/:sid/original')
  @Header('Content-Type', 'text/csv; charset=utf-8')
  async original(
    @Param('id', ParseIntPipe) id: number,
    @Param('sid', ParseIntPipe) sid: number,
    @Res({ passthrough: true }) res: Response,
  ): Promise<string> {
    const { filename, text } = await this.runs.original(id, sid);
    res.setHeader('Content-Disposition', `attachment; filename="${filename.replace(/["\\\r\n]/g, '_')}"`);
    return text;
  }

  @Get(':id/spectra/:sid/comparison')
  compare(
    @Param('id', ParseIntPipe) id: number,
    @Param('sid', ParseIntPipe) sid: number,
  ): Promise<SpectrumComparisonView> {
    return this.runs.compare(id, sid);
  }
}
