import { Transform, Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsDateString,
  IsIn,
  IsInt,
  IsNumber,
  IsOptional,
  IsPositive,
  IsString,
  Max,
  MaxLength,
  Min,
  MinLength,
  ValidateNested,
} from 'class-validator';
import { RUN_REMARK_MAX_LENGTH, type SpectrumQuantity } from '@quietglass/shared/runs';
import { finite, trim } from '../../common/dto.js';

export class StartRunDto {
  @IsInt({ message: 'designId must be a design id' })
  designId: number;

  @IsInt({ message: 'versionNumber must be a version number' })
  versionNumber: number;

  @IsInt({ message: 'chamberId must be a chamber id' })
  chamberId: number;

  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'lotNumber must not be empty' })
  @MaxLength(60)
  lotNumber: string;

  @IsDateString({ strict: true }, { message: 'runDate must be a date (YYYY-MM-DD)' })
  runDate: string;

  @IsOptional()
  @IsString()
  @MaxLength(4000)
  notes?: string;
}

export class LayerReadingDto {
  @IsInt()
  @Min(1)
  step: number;

  @IsOptional()
  @IsNumber(finite, { message: 'monitorThicknessNm must be a number' })
  @IsPositive({ message: 'monitorThicknessNm must be > 0' })
  monitorThicknessNm?: number;

  @IsOptional()
  @IsNumber(finite, { message: 'rateNmPerS must be a number' })
  @IsPositive({ message: 'rateNmPerS must be > 0' })
  rateNmPerS?: number;

  @IsOptional()
  @IsString()
  @MaxLength(500)
  notes?: string;
}

export class DurabilityDto {
  @IsIn(['adhesion', 'abrasion', 'humidity', 'other'], {
    message: 'test must be adhesion, abrasion, humidity or other',
  })
  test: 'adhesion' | 'abrasion' | 'humidity' | 'other';

  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'method must name the test procedure (e.g. ISO 9211-4, tape adhesion)' })
  @MaxLength(200)
  method: string;

  @IsIn(['pass', 'fail'], { message: 'result must be pass or fail' })
  result: 'pass' | 'fail';

  @IsOptional()
  @IsString()
  @MaxLength(500)
  notes?: string;
}

export class UpdateRunDto {
  @IsInt({ message: 'version must be the version of the run the change is based on' })
  @Min(1)
  version: number;

  @IsOptional()
  @IsArray()
  @ArrayMaxSize(400)
  @ValidateNested({ each: true })
  @Type(() => LayerReadingDto)
  layerReadings?: LayerReadingDto[];

  @IsOptional()
  @IsArray()
  @ArrayMaxSize(50)
  @ValidateNested({ each: true })
  @Type(() => DurabilityDto)
  durability?: DurabilityDto[];

  @IsOptional()
  @IsString()
  @MaxLength(4000)
  notes?: string;
}

export class RunRemarkDto {
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'text must not be empty' })
  @MaxLength(RUN_REMARK_MAX_LENGTH, { message: `text must be at most ${RUN_REMARK_MAX_LENGTH} characters` })
  text: string;
}

export class UploadSpectrumDto {
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'filename must not be empty' })
  @MaxLength(255)
  filename: string;

  @IsString()
  csv: string;

  @IsNumber(finite, { message: 'angleDeg must be a number' })
  @Min(0)
  @Max(89)
  angleDeg: number;

  @IsIn(['witness', 'part'], { message: 'sample must be witness or part' })
  sample: 'witness' | 'part';

  /** Which quantity to read from a file that holds both R and T (e.g. the calculation CLI's output). */
  @IsOptional()
  @IsIn(['R', 'T'], { message: 'quantity must be R or T' })
  quantity?: SpectrumQuantity;
}
