import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
  IsIn,
  IsInt,
  IsNumber,
  IsOptional,
  IsPositive,
  Max,
  Min,
  ValidateNested,
} from 'class-validator';
import { finite } from '../../common/dto.js';
import { MAX_TARGET_MARGIN_PERCENT } from '@quietglass/shared/optimise/fit';

class MaskChoice {
  /** Defaults to the design's own spec mask. */
  @IsOptional()
  @IsInt({ message: 'specMaskId must be a spec mask id' })
  specMaskId?: number;
}

export class FitDto extends MaskChoice {
  @IsOptional()
  @IsNumber(finite, { message: 'minThicknessNm must be a number' })
  @Min(0, { message: 'minThicknessNm must be ≥ 0' })
  minThicknessNm?: number;

  @IsOptional()
  @IsNumber(finite, { message: 'maxThicknessNm must be a number' })
  @IsPositive({ message: 'maxThicknessNm must be > 0' })
  maxThicknessNm?: number;

  @IsOptional()
  @IsInt()
  @Min(1)
  @Max(1000, { message: 'maxIterations must be at most 1000' })
  maxIterations?: number;

  /** Margin to design in beyond every limit, percentage points (0 to MAX_TARGET_MARGIN_PERCENT). */
  @IsOptional()
  @IsNumber(finite, { message: 'targetMarginPercent must be a number' })
  @Min(0, { message: 'targetMarginPercent must be ≥ 0' })
  @Max(MAX_TARGET_MARGIN_PERCENT, {
    message: `targetMarginPercent must be at most ${MAX_TARGET_MARGIN_PERCENT} percentage points`,
  })
  targetMarginPercent?: number;
}

export class GrowDto extends FitDto {
  @IsArray()
  @ArrayMinSize(1, { message: 'allowedMaterialIds: choose at least one material' })
  @ArrayMaxSize(8)
  @IsInt({ each: true, message: 'allowedMaterialIds must hold material ids' })
  allowedMaterialIds: number[];

  /** Allowed materials that may only be the outermost layer (e.g. a fluoride on top). */
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(8)
  @IsInt({ each: true, message: 'outermostOnlyMaterialIds must hold material ids' })
  outermostOnlyMaterialIds?: number[];

  /** The only allowed materials a new layer next to the substrate may be. */
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(8)
  @IsInt({ each: true, message: 'nextToSubstrateMaterialIds must hold material ids' })
  nextToSubstrateMaterialIds?: number[];

  @IsOptional()
  @IsInt()
  @Min(1)
  @Max(200, { message: 'maxLayers must be at most 200' })
  maxLayers?: number;

  @IsOptional()
  @IsNumber(finite)
  @IsPositive({ message: 'maxTotalThicknessNm must be > 0' })
  maxTotalThicknessNm?: number;

  @IsOptional()
  @IsInt()
  @Min(1)
  @Max(200)
  maxSteps?: number;
}

export class ThicknessErrorDto {
  @IsOptional()
  @IsNumber(finite, { message: 'thickness.relativePercent must be a number' })
  @Min(0, { message: 'thickness.relativePercent must be ≥ 0' })
  @Max(50)
  relativePercent?: number;

  @IsOptional()
  @IsNumber(finite, { message: 'thickness.absoluteNm must be a number' })
  @Min(0, { message: 'thickness.absoluteNm must be ≥ 0' })
  @Max(100)
  absoluteNm?: number;

  @IsOptional()
  @IsIn(['normal', 'uniform'], { message: 'thickness.distribution must be normal or uniform' })
  distribution?: 'normal' | 'uniform';
}

export class YieldDto extends MaskChoice {
  @IsOptional()
  @IsInt({ message: 'trials must be a whole number' })
  @Min(1, { message: 'trials must be from 1 to 100000' })
  @Max(100_000, { message: 'trials must be from 1 to 100000' })
  trials?: number;

  @IsOptional()
  @IsInt()
  @Min(0)
  @Max(4_294_967_295)
  seed?: number;

  @ValidateNested()
  @Type(() => ThicknessErrorDto)
  thickness: ThicknessErrorDto;

  /** Systematic (rate calibration) error shared by all layers of a material, percent. */
  @IsOptional()
  @IsNumber(finite)
  @Min(0)
  @Max(50)
  systematicPercent?: number;

  /** Index error per material, percent. */
  @IsOptional()
  @IsNumber(finite)
  @Min(0)
  @Max(20)
  indexPercent?: number;
}

export class DiagnosisDto {
  /** Lowest and highest thickness factor a layer may have had (default 0.7–1.3). */
  @IsOptional()
  @IsArray()
  @ArrayMinSize(2)
  @ArrayMaxSize(2)
  @IsNumber(finite, { each: true })
  factorRange?: [number, number];
}

export class AcceptDto {
  /** For Grow layers: which step's stack becomes the new version (default the final one). */
  @IsOptional()
  @IsInt()
  @Min(0)
  step?: number;
}
