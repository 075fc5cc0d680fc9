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
import {
  MAX_RUN_LENGTH,
  MAX_SOURCE_LENGTH,
  PROVENANCE_KINDS,
  type ProvenanceKind,
} from '@quietglass/shared/materials';
import { trim } from '../../common/dto.js';

export class RangeDto {
  @IsNumber({ allowNaN: false, allowInfinity: false }, { message: 'rangeNm.from must be a number' })
  from: number;

  @IsNumber({ allowNaN: false, allowInfinity: false }, { message: 'rangeNm.to must be a number' })
  to: number;
}

export class ProvenanceDto {
  /**
   * Required unless `typical: true` says it: published (needs `source`), measured (needs `date`
   * and `run`) or typical.
   */
  @IsOptional()
  @IsIn(PROVENANCE_KINDS, { message: 'provenance.kind must be published, measured or typical' })
  kind?: ProvenanceKind;

  @IsOptional()
  @IsString()
  @MaxLength(MAX_SOURCE_LENGTH)
  source?: string;

  @IsOptional()
  @IsString()
  @MaxLength(MAX_RUN_LENGTH)
  run?: string;

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

/** The parsing choices of an n,k CSV file, for its preview and its import. */
export class NkCsvDto {
  @IsString()
  csv: string;

  /** nm or µm; may be left out when the header names the unit ("Wavelength (nm)"). */
  @IsOptional()
  @IsIn(['nm', 'um'], { message: 'unit must be nm or um' })
  unit?: 'nm' | 'um';
}

/** Create a tabulated material from an n,k CSV file's text; the file is kept for download. */
export class ImportMaterialCsvDto extends MaterialMeta {
  @IsString()
  csv: string;

  @IsOptional()
  @IsIn(['nm', 'um'], { message: 'unit must be nm or um' })
  unit?: 'nm' | 'um';

  @IsOptional()
  @IsIn(['linear', 'pchip'], { message: 'interpolation must be linear or pchip' })
  interpolation?: 'linear' | 'pchip';

  /** Outside the table: hold the end values and warn (true) or refuse (default). */
  @IsOptional()
  @IsBoolean()
  clamp?: boolean;

  /** The uploaded file's name, kept with its text. */
  @IsOptional()
  @IsString()
  @MaxLength(255)
  fileName?: string;
}

/**
 * Create a material from a published optical-constants file (YAML with its reference): the
 * file's reference becomes the provenance and its notes the sample notes; the file is kept.
 */
export class ImportConstantsFileDto {
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'name must not be empty' })
  @MaxLength(120)
  name: string;

  @IsString()
  text: string;

  @IsString()
  @MinLength(1, { message: 'fileName must not be empty' })
  @MaxLength(255)
  fileName: string;

  /** Outside the stated range: hold the end values and warn (true) or refuse (default). */
  @IsOptional()
  @IsBoolean()
  clamp?: boolean;

  /** Added below the file's own sample notes. */
  @IsOptional()
  @IsString()
  @MaxLength(2000)
  notes?: string;
}

/** Retire or restore a material: the version the action was decided on. */
export class MaterialVersionDto {
  @IsInt()
  @Min(1)
  version: number;
}
