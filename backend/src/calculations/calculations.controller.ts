import {
  Body,
  Controller,
  Delete,
  Get,
  HttpCode,
  Param,
  ParseIntPipe,
  Post,
  Query,
  Res,
  StreamableFile,
} from '@nestjs/common';
import type { Response } from 'express';
import { CurrentUser } from '../auth/current-user.decorator.js';
import { Roles } from '../auth/roles.decorator.js';
import { ZodBody } from '../common/zod-body.js';
import type { User } from '../users/user.entity.js';
import { queuedReply, toCalculationView } from './calculation-view.js';
import { CalculationsService } from './calculations.service.js';
import { OptimiseService } from './optimise.service.js';
import type { CalculationView, LatestCalculations } from '@quietglass/shared/calculations';
import {
  acceptRequestSchema,
  fitRequestSchema,
  growRequestSchema,
  yieldRequestSchema,
  type AcceptRequest,
  type FitRequest,
  type GrowRequest,
  type YieldRequest,
} from '@quietglass/shared/schemas/optimise';
import type { DesignVersionView } from '@quietglass/shared/designs';

/** The compute queue: engineers submit and cancel; results are readable by the office roles. */
@Controller()
@Roles('admin', 'engineer')
export class CalculationsController {
  constructor(
    private readonly calculations: CalculationsService,
    private readonly optimise: OptimiseService,
  ) {}

  /** Fit to mask: Levenberg–Marquardt over the unlocked layers' thicknesses. */
  @Post('designs/:id/versions/:number/fit')
  @ZodBody(fitRequestSchema)
  async fit(
    @Param('id', ParseIntPipe) id: number,
    @Param('number', ParseIntPipe) number: number,
    @Body() dto: FitRequest,
    @CurrentUser() user: User,
    @Res({ passthrough: true }) res: Response,
  ) {
    return queuedReply(res, await this.optimise.fit(id, number, dto, user));
  }

  /** Grow layers: needle synthesis from the version's stack with the allowed materials. */
  @Post('designs/:id/versions/:number/grow')
  @ZodBody(growRequestSchema)
  async grow(
    @Param('id', ParseIntPipe) id: number,
    @Param('number', ParseIntPipe) number: number,
    @Body() dto: GrowRequest,
    @CurrentUser() user: User,
    @Res({ passthrough: true }) res: Response,
  ) {
    return queuedReply(res, await this.optimise.grow(id, number, dto, user));
  }

  /** Yield forecast: seeded Monte Carlo of thickness (and index) errors against the mask. */
  @Post('designs/:id/versions/:number/yield')
  @ZodBody(yieldRequestSchema)
  async yieldForecast(
    @Param('id', ParseIntPipe) id: number,
    @Param('number', ParseIntPipe) number: number,
    @Body() dto: YieldRequest,
    @CurrentUser() user: User,
    @Res({ passthrough: true }) res: Response,
  ) {
    return queuedReply(res, await this.optimise.yieldForecast(id, number, dto, user));
  }

  /** A Fit to mask or Grow layers result becomes a new draft version. */
  @Post('calculations/:id/accept')
  @ZodBody(acceptRequestSchema)
  accept(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: AcceptRequest,
    @CurrentUser() user: User,
  ): Promise<DesignVersionView> {
    return this.optimise.accept(id, dto.step, user);
  }

  /** 201 with a new queued calculation, or 200 with the identical one already queued or done. */
  @Post('designs/:id/versions/:number/analysis')
  async submit(
    @Param('id', ParseIntPipe) id: number,
    @Param('number', ParseIntPipe) number: number,
    @Body() body: Record<string, unknown>,
    @CurrentUser() user: User,
    @Res({ passthrough: true }) res: Response,
  ): Promise<CalculationView & { reused: boolean }> {
    return queuedReply(res, await this.calculations.submitAnalysis(id, number, body, user));
  }

  /** The latest completed result of each kind for a version, with when and by whom it was run. */
  @Get('designs/:id/versions/:number/calculations/latest')
  @Roles('admin', 'engineer', 'sales')
  async latestForVersion(
    @Param('id', ParseIntPipe) id: number,
    @Param('number', ParseIntPipe) number: number,
  ): Promise<LatestCalculations> {
    const latest = await this.calculations.latestForVersion(id, number);
    return Object.fromEntries(
      Object.entries(latest).map(([kind, c]) => [kind, c ? toCalculationView(c) : null]),
    ) as LatestCalculations;
  }

  @Get('calculations')
  async list(): Promise<CalculationView[]> {
    return (await this.calculations.list()).map(toCalculationView);
  }

  @Get('calculations/:id')
  @Roles('admin', 'engineer', 'sales')
  async get(@Param('id', ParseIntPipe) id: number): Promise<CalculationView> {
    return toCalculationView(await this.calculations.get(id));
  }

  @Get('calculations/:id/result')
  @Roles('admin', 'engineer', 'sales')
  result(
    @Param('id', ParseIntPipe) id: number,
    @Query('quantity') quantity = 'R',
    @Query('polarisation') polarisation = 'avg',
  ) {
    return this.calculations.result(id, quantity, polarisation);
  }

  /** Streamed: a large result is never held in memory as one string. */
  @Get('calculations/:id/result.csv')
  @Roles('admin', 'engineer', 'sales')
  async resultCsv(@Param('id', ParseIntPipe) id: number): Promise<StreamableFile> {
    return new StreamableFile(await this.calculations.resultCsv(id), {
      type: 'text/csv; charset=utf-8',
      disposition: `attachment; filename="analysis-${id}.csv"`,
    });
  }

  @Post('calculations/:id/cancel')
  async cancel(@Param('id', ParseIntPipe) id: number): Promise<CalculationView> {
    return toCalculationView(await this.calculations.cancel(id));
  }

  /** Owner or admin; 204. */
  @Delete('calculations/:id')
  @HttpCode(204)
  async remove(@Param('id', ParseIntPipe) id: number, @CurrentUser() user: User): Promise<void> {
    await this.calculations.remove(id, user);
  }
}
