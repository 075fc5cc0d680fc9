import { Transform } from 'class-transformer';
import { IsIn, IsInt, IsNumber, IsString, Max, MaxLength, Min, MinLength } from 'class-validator';
import { CALIBRATION_COMMENT_MAX_LENGTH } from '@quietglass/shared/calibration';
import { finite, trim } from '../../common/dto.js';

/** Accept or reject a suggestion exactly as it was shown (its key). */
export class CalibrationDecisionDto {
  @IsString()
  @MinLength(1, { message: 'key must name the suggestion shown' })
  @MaxLength(200)
  key: string;

  @IsIn(['accepted', 'rejected'], { message: 'decision must be accepted or rejected' })
  decision: 'accepted' | 'rejected';

  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'comment must say why' })
  @MaxLength(CALIBRATION_COMMENT_MAX_LENGTH)
  comment: string;
}

export class CalibrationSettingsDto {
  @IsNumber(finite, { message: 'thresholdPercent must be a number' })
  @Min(0.05, { message: 'thresholdPercent must be at least 0.05' })
  @Max(50, { message: 'thresholdPercent must be at most 50' })
  thresholdPercent: number;

  @IsInt({ message: 'minRuns must be a whole number' })
  @Min(2, { message: 'minRuns must be at least 2' })
  @Max(100, { message: 'minRuns must be at most 100' })
  minRuns: number;

  @IsInt({ message: 'version must be the settings version you read' })
  version: number;
}
