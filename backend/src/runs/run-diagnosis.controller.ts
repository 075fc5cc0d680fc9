import { Body, Controller, Get, Param, ParseIntPipe, Post, Res } from '@nestjs/common';
import type { Response } from 'express';
import type { CalculationView } from '@quietglass/shared/calculations';
import { diagnosisRequestSchema, type DiagnosisRequest } from '@quietglass/shared/schemas/optimise';
import { CurrentUser } from '../auth/current-user.decorator.js';
import { Roles } from '../auth/roles.decorator.js';
import { queuedReply, toCalculationView } from '../calculations/calculation-view.js';
import { CalculationsService } from '../calculations/calculations.service.js';
import { OptimiseService } from '../calculations/optimise.service.js';
import { ZodBody } from '../common/zod-body.js';
import type { User } from '../users/user.entity.js';

/**
 * Run diagnosis of a chamber run: queue it from a measured spectrum, read the latest one. The
 * routes live with the runs; the job itself is a calculation of the compute queue.
 */
@Controller('runs/:id')
export class RunDiagnosisController {
  constructor(
    private readonly calculations: CalculationsService,
    private readonly optimise: OptimiseService,
  ) {}

  /** Which layers of the run most likely deviated: 201 queued, or 200 with the identical job. */
  @Post('spectra/:sid/diagnosis')
  @Roles('admin', 'engineer')
  @ZodBody(diagnosisRequestSchema)
  async diagnosis(
    @Param('id', ParseIntPipe) id: number,
    @Param('sid', ParseIntPipe) sid: number,
    @Body() dto: DiagnosisRequest,
    @CurrentUser() user: User,
    @Res({ passthrough: true }) res: Response,
  ): Promise<CalculationView & { reused: boolean }> {
    return queuedReply(res, await this.optimise.diagnosis(id, sid, dto, user));
  }

  /** The latest completed Run diagnosis of the run, for the run page. */
  @Get('diagnosis/latest')
  @Roles('admin', 'engineer', 'operator')
  async latest(@Param('id', ParseIntPipe) id: number): Promise<{ calculation: CalculationView | null }> {
    const calc = await this.calculations.latestDiagnosis(id);
    return { calculation: calc ? toCalculationView(calc) : null };
  }
}
