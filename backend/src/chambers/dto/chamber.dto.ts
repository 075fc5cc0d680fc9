import { Transform, Type } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
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
import { finite, trim } from '../../common/dto.js';

export class ChamberMaterialDto {
  @IsInt({ message: 'materialId must be a material id' })
  materialId: number;

  @IsNumber(finite, { message: 'toolingFactor must be a number' })
  @IsPositive({ message: 'toolingFactor must be > 0' })
  @Max(10, { message: 'toolingFactor must be at most 10' })
  toolingFactor: number;

  @IsNumber(finite, { message: 'rateNmPerS must be a number' })
  @IsPositive({ message: 'rateNmPerS must be > 0' })
  @Max(100, { message: 'rateNmPerS must be at most 100 nm/s' })
  rateNmPerS: number;
}

export class ChamberDto {
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'name must not be empty' })
  @MaxLength(120)
  name: string;

  @IsArray()
  @ArrayMinSize(1, { message: 'monitorWavelengthsNm needs at least one wavelength' })
  @ArrayMaxSize(8)
  @IsNumber(finite, { each: true, message: 'monitorWavelengthsNm must hold numbers' })
  @Min(200, { each: true, message: 'monitor wavelengths must be at least 200 nm' })
  @Max(3000, { each: true, message: 'monitor wavelengths must be at most 3000 nm' })
  monitorWavelengthsNm: number[];

  @IsInt({ message: 'monitorChipMaterialId must be a material id' })
  monitorChipMaterialId: number;

  @IsArray()
  @ValidateNested({ each: true })
  @Type(() => ChamberMaterialDto)
  materials: ChamberMaterialDto[];

  @IsOptional()
  @IsString()
  @MaxLength(4000)
  notes?: string;
}

export class UpdateChamberDto extends ChamberDto {
  @IsInt()
  @Min(1)
  version: number;
}
