import { Body, Controller, Get, Param, ParseIntPipe, Post, Put } from '@nestjs/common';
import type { CalibrationDecisionView, ChamberCalibrationView } from '@quietglass/shared/calibration';
import { CurrentUser } from '../auth/current-user.decorator.js';
import { Roles } from '../auth/roles.decorator.js';
import type { User } from '../users/user.entity.js';
import { CalibrationService } from './calibration.service.js';
import { CalibrationDecisionDto, CalibrationSettingsDto } from './dto/calibration.dto.js';

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
  decide(
    @Param('id', ParseIntPipe) id: number,
    @Body() dto: CalibrationDecisionDto,
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
  async updateSettings(@Body() dto: CalibrationSettingsDto, @CurrentUser() user: User) {
    const row = await this.calibration.updateSettings(dto, user);
    return { thresholdPercent: row.thresholdPercent, minRuns: row.minRuns, version: row.version };
  }
}
