import { Transform, Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsInt,
  IsNumber,
  IsOptional,
  IsString,
  Max,
  MaxLength,
  Min,
  ValidateIf,
  ValidateNested,
} from 'class-validator';
import { PROCESS_LIMITS, PROCESS_NOTES_MAX, type ProcessQuantity } from '@quietglass/shared/chambers';
import { finite, trim } from '../../common/dto.js';

/** Number within the shared limits, with messages that give the limit and unit. */
function Within(q: ProcessQuantity): PropertyDecorator {
  const { min, max, unit } = PROCESS_LIMITS[q];
  return (target, key) => {
    IsNumber(finite, { message: `${q} must be a number (${unit})` })(target, key);
    Min(min, { message: `${q} must be at least ${min} ${unit}` })(target, key);
    Max(max, { message: `${q} must be at most ${max} ${unit}` })(target, key);
  };
}

/** An optional quantity: null (or left out) means not used. */
function Optional(q: ProcessQuantity): PropertyDecorator {
  return (target, key) => {
    ValidateIf((_o, v) => v !== null && v !== undefined)(target, key);
    Within(q)(target, key);
  };
}

export class ProcessSettingDto {
  @IsInt({ message: 'materialId must be a material id' })
  materialId: number;

  @Within('substrateTemperatureC')
  substrateTemperatureC: number;

  @Within('basePressureMbar')
  basePressureMbar: number;

  @Optional('o2FlowSccm')
  o2FlowSccm?: number | null;

  @Optional('o2PartialPressureMbar')
  o2PartialPressureMbar?: number | null;

  @Optional('arFlowSccm')
  arFlowSccm?: number | null;

  @Optional('ionVoltageV')
  ionVoltageV?: number | null;

  @Optional('ionCurrentA')
  ionCurrentA?: number | null;

  @Optional('ionGasFlowSccm')
  ionGasFlowSccm?: number | null;

  @IsOptional()
  @Transform(trim)
  @IsString({ message: 'notes must be text' })
  @MaxLength(PROCESS_NOTES_MAX, { message: `notes must be at most ${PROCESS_NOTES_MAX} characters` })
  notes?: string;
}

export class ProcessSettingsDto {
  @IsArray({ message: 'settings must be a list' })
  @ArrayMaxSize(50)
  @ValidateNested({ each: true })
  @Type(() => ProcessSettingDto)
  settings: ProcessSettingDto[];

  /** The version the editor read: 0 before the first save. */
  @IsInt({ message: 'version must be the version you read' })
  @Min(0)
  version: number;
}
