import { Transform, Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsBoolean,
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
import { BACK_SURFACE_TREATMENTS, type BackSurfaceTreatment } from '@quietglass/shared/designs';
import { finite, trim } from '../../common/dto.js';

/** Most layers a design may have. */
export const MAX_LAYERS = 400;

export class DesignLayerDto {
  @IsInt({ message: 'materialId must be a material id' })
  materialId: number;

  @IsNumber(finite, { message: 'thicknessNm must be a number' })
  @IsPositive({ message: 'thicknessNm must be > 0' })
  @Max(100_000, { message: 'thicknessNm must be at most 100000 nm' })
  thicknessNm: number;

  @IsOptional()
  @IsBoolean()
  locked?: boolean;

  @IsOptional()
  @IsString()
  @MaxLength(500)
  notes?: string;
}

/** The editable content of a version (everything the Layer grid and its header hold). */
export class VersionContentDto {
  @IsInt({ message: 'incidentMaterialId must be a material id' })
  incidentMaterialId: number;

  @IsInt({ message: 'substrateMaterialId must be a material id' })
  substrateMaterialId: number;

  @IsNumber(finite, { message: 'substrateThicknessMm must be a number' })
  @IsPositive({ message: 'substrateThicknessMm must be > 0' })
  @Max(1000)
  substrateThicknessMm: number;

  @IsIn(BACK_SURFACE_TREATMENTS, {
    message: `backSurface must be one of ${BACK_SURFACE_TREATMENTS.join(', ')}`,
  })
  backSurface: BackSurfaceTreatment;

  @IsNumber(finite, { message: 'referenceWavelengthNm must be a number' })
  @Min(100, { message: 'referenceWavelengthNm must be at least 100 nm' })
  @Max(20_000, { message: 'referenceWavelengthNm must be at most 20000 nm' })
  referenceWavelengthNm: number;

  @IsOptional()
  @IsString()
  @MaxLength(8000)
  notes?: string;

  @IsArray()
  @ArrayMaxSize(MAX_LAYERS, { message: `a design has at most ${MAX_LAYERS} layers` })
  @ValidateNested({ each: true })
  @Type(() => DesignLayerDto)
  layers: DesignLayerDto[];
}

export class SaveVersionDto extends VersionContentDto {
  /** The rowVersion the edit started from. */
  @IsInt()
  @Min(1)
  rowVersion: number;
}

export class CreateDesignDto extends VersionContentDto {
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'name must not be empty' })
  @MaxLength(160)
  name: string;

  @IsInt({ message: 'customerId must be a customer id' })
  customerId: number;

  @IsOptional()
  @IsInt({ message: 'specMaskId must be a spec mask id' })
  specMaskId?: number | null;
}

export class UpdateDesignDto {
  /** The design's version token the change started from. */
  @IsInt({ message: 'version must be the design version you are changing' })
  @Min(1)
  version: number;

  @IsOptional()
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'name must not be empty' })
  @MaxLength(160)
  name?: string;

  @IsOptional()
  @IsInt({ message: 'specMaskId must be a spec mask id' })
  specMaskId?: number | null;
}

export class NewVersionDto {
  /** The version to copy into the new draft. */
  @IsInt()
  @Min(1)
  fromNumber: number;

  /** Content for the new draft instead of the copy (an imported stack file). */
  @IsOptional()
  @ValidateNested()
  @Type(() => VersionContentDto)
  content?: VersionContentDto;

  /** Name of the stack file the content came from, for the audit trail. */
  @IsOptional()
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'sourceFile must not be empty' })
  @MaxLength(255)
  sourceFile?: string;
}
