import { Transform, Type } from 'class-transformer';
import {
  IsIn,
  IsInt,
  IsNumber,
  IsOptional,
  IsPositive,
  IsString,
  Max,
  MaxLength,
  Min,
} from 'class-validator';
import { RUN_SHEET_JOB_LIMITS, RUN_SHEET_SIDES, type RunSheetSides } from '@quietglass/shared/runsheet';
import { finite, trim } from '../../common/dto.js';

/** The chamber and monitor wavelength, and what this run coats: part, quantity, sides, substrate. */
export class RunSheetQueryDto {
  @Type(() => Number)
  @IsInt({ message: 'chamberId must be a chamber id' })
  chamberId: number;

  @IsOptional()
  @Type(() => Number)
  @IsNumber(finite, { message: 'monitorWavelengthNm must be a number' })
  @IsPositive({ message: 'monitorWavelengthNm must be > 0' })
  monitorWavelengthNm?: number;

  @IsOptional()
  @Transform(trim)
  @IsString({ message: 'part must be text' })
  @MaxLength(RUN_SHEET_JOB_LIMITS.partMaxLength, {
    message: `part must be at most ${RUN_SHEET_JOB_LIMITS.partMaxLength} characters`,
  })
  part?: string;

  @IsOptional()
  @Type(() => Number)
  @IsInt({ message: 'quantity must be a whole number of parts' })
  @Min(1, { message: 'quantity must be at least 1' })
  @Max(RUN_SHEET_JOB_LIMITS.quantityMax, {
    message: `quantity must be at most ${RUN_SHEET_JOB_LIMITS.quantityMax}`,
  })
  quantity?: number;

  @IsOptional()
  @IsIn(RUN_SHEET_SIDES, { message: `sides must be one of ${RUN_SHEET_SIDES.join(', ')}` })
  sides?: RunSheetSides;

  @IsOptional()
  @Type(() => Number)
  @IsNumber(finite, { message: 'substrateThicknessMm must be a number' })
  @IsPositive({ message: 'substrateThicknessMm must be > 0' })
  @Max(RUN_SHEET_JOB_LIMITS.substrateThicknessMaxMm, {
    message: `substrateThicknessMm must be at most ${RUN_SHEET_JOB_LIMITS.substrateThicknessMaxMm} mm`,
  })
  substrateThicknessMm?: number;
}
