import { Controller, Get } from '@nestjs/common';
import { Public } from '../auth/public.decorator.js';
import { HealthService, type HealthReport } from './health.service.js';

@Controller('health')
export class HealthController {
  constructor(private readonly health: HealthService) {}

  /** Public: database, Redis, queue and worker state. Always 200; `status` says whether all is well. */
  @Public()
  @Get()
  report(): Promise<HealthReport> {
    return this.health.report();
  }
}
