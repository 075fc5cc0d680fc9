import { Transform, Type } from 'class-transformer';
import {
  IsBoolean,
  IsDateString,
  IsIn,
  IsInt,
  IsNumber,
  IsObject,
  IsOptional,
  IsString,
  MaxLength,
  Min,
  MinLength,
  ValidateNested,
} from 'class-validator';
import { trim } from '../../common/dto.js';

export class RangeDto {
  @IsNumber({ allowNaN: false, allowInfinity: false }, { message: 'rangeNm.from must be a number' })
  from: number;

  @IsNumber({ allowNaN: false, allowInfinity: false }, { message: 'rangeNm.to must be a number' })
  to: number;
}

export class ProvenanceDto {
  @IsOptional()
  @IsString()
  @MaxLength(500)
  source?: string;

  @IsOptional()
  @IsDateString({ strict: true }, { message: 'provenance.date must be a date (YYYY-MM-DD)' })
  date?: string | null;

  @IsOptional()
  @IsString()
  @MaxLength(4000)
  notes?: string;
}

/** Name and provenance: what every way of creating a material asks for. */
class MaterialMeta {
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'name must not be empty' })
  @MaxLength(120)
  name: string;

  @IsOptional()
  @IsBoolean()
  typical?: boolean;

  @IsOptional()
  @ValidateNested()
  @Type(() => ProvenanceDto)
  provenance?: ProvenanceDto;
}

/** Create or replace a material. `model` is checked by the optics engine's own validation. */
export class MaterialDto extends MaterialMeta {
  @ValidateNested()
  @Type(() => RangeDto)
  @IsObject({ message: 'rangeNm must be an object { from, to }' })
  rangeNm: RangeDto;

  @IsObject({ message: 'model must be a dispersion model object' })
  model: Record<string, unknown>;
}

export class UpdateMaterialDto extends MaterialDto {
  /** The version the edit started from (optimistic locking). */
  @IsInt()
  @Min(1)
  version: number;
}

/** Create a tabulated material from an n,k CSV file's text. */
export class ImportMaterialCsvDto extends MaterialMeta {
  @IsString()
  csv: string;

  @IsIn(['nm', 'um'], { message: 'unit must be nm or um' })
  unit: 'nm' | 'um';

  @IsOptional()
  @IsIn(['linear', 'pchip'], { message: 'interpolation must be linear or pchip' })
  interpolation?: 'linear' | 'pchip';
}
