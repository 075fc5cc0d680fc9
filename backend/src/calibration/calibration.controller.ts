import { Body, Controller, Get, Param, ParseIntPipe, Post, Put } from '@nestjs/common';
import type { CalibrationDecisionView, ChamberCalibrationView } from '@quietglass/shared/calibration';
import {
  calibrationDecisionSchema,
  calibrationSettingsSchema,
  type CalibrationDecisionInput,
  type CalibrationSettingsInput,
} from '@quietglass/shared/schemas/calibration';
import { CurrentUser } from '../auth/current-user.decorator.js';
import { Roles } from '../auth/roles.decorator.js';
import { ZodBody } from '../common/zod-body.js';
import type { User } from '../users/user.entity.js';
import { CalibrationService } from './calibration.service.js';

/** Chamber calibration: everyone who reads chambers sees it; engineers and admins decide. */
@Controller()
@Roles('admin', 'engineer', 'operator')
export class CalibrationController {
  constructor(private readonly calibration: CalibrationService) {}

  @Get('chambers/:id/calibration')
  get(@Param('id', ParseIntPipe) id: number): Promise<ChamberCalibrationView> {
    return this.calibration.calibration(id);
  }

  @Post('chambers/:id/calibration/decisions')
  @Roles('admin', 'engineer')
  @ZodBody(calibrationDecisionSchema)
  decide(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: CalibrationDecisionInput,
    @CurrentUser() user: User,
  ): Promise<CalibrationDecisionView> {
    return this.calibration.decide(id, dto, user);
  }

  @Get('calibration/settings')
  async settings() {
    const row = await this.calibration.settingsRecord();
    return { thresholdPercent: row.thresholdPercent, minRuns: row.minRuns, version: row.version };
  }

  @Put('calibration/settings')
  @Roles('admin')
  @ZodBody(calibrationSettingsSchema)
  async updateSettings(@Body() dto: CalibrationSettingsInput, @CurrentUser() user: User) {
    const row = await this.calibration.updateSettings(dto, user);
    return { thresholdPercent: row.thresholdPercent, minRuns: row.minRuns, version: row.version };
  }
}
