import { Body, Controller, Get, Param, ParseIntPipe, Post, Query, Res, StreamableFile } from '@nestjs/common';
import type { Response } from 'express';
import type { ReportView } from '@quietglass/shared/reports';
import { createReportSchema, type CreateReportInput } from '@quietglass/shared/schemas/reports';
import { CurrentUser } from '../auth/current-user.decorator.js';
import { Roles } from '../auth/roles.decorator.js';
import { ZodBody } from '../common/zod-body.js';
import type { User } from '../users/user.entity.js';
import type { ComplianceReport } from './report.entity.js';
import { ReportsService } from './reports.service.js';

function view(r: ComplianceReport): ReportView {
  const { createdBy, createdAt, pdf: _pdf, ...rest } = r;
  return { ...rest, createdBy: createdBy.displayName, createdAt: createdAt.toISOString() };
}

/** Compliance reports: sales and engineers make them for customers. */
@Controller('reports')
@Roles('admin', 'engineer', 'sales')
export class ReportsController {
  constructor(private readonly reports: ReportsService) {}

  @Get()
  async list(
    @Query('designId', new ParseIntPipe({ optional: true })) designId?: number,
  ): Promise<ReportView[]> {
    return (await this.reports.list(designId)).map(view);
  }

  @Post()
  @ZodBody(createReportSchema)
  async create(@Body() dto: CreateReportInput, @CurrentUser() user: User): Promise<ReportView> {
    return view(await this.reports.create(dto, user));
  }

  @Get(':id')
  async get(@Param('id', ParseIntPipe) id: number): Promise<ReportView> {
    return view(await this.reports.get(id));
  }

  /** Inline, so the browser can preview it; the file name serves a download. */
  @Get(':id/pdf')
  async pdf(
    @Param('id', ParseIntPipe) id: number,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    res.setHeader('Content-Disposition', `inline; filename="compliance-report-${id}.pdf"`);
    return new StreamableFile(await this.reports.pdf(id), { type: 'application/pdf' });
  }
}
