import { Controller, Get, Res } from '@nestjs/common';
import type { Response } from 'express';
import { Public } from '../auth/public.decorator.js';
import { HealthService, type HealthReport } from './health.service.js';

@Controller('health')
export class HealthController {
  constructor(private readonly health: HealthService) {}

  /**
   * Public: database, Redis, queue and worker state from the latest background checks. 200 when
   * all is well, 503 with the same report when anything is degraded.
   */
  @Public()
  @Get()
  async report(@Res({ passthrough: true }) res: Response): Promise<HealthReport> {
    const report = await this.health.report();
    res.status(report.status === 'ok' ? 200 : 503);
    return report;
  }
}
