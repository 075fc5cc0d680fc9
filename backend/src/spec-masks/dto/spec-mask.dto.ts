import { Transform } from 'class-transformer';
import { IsArray, IsIn, IsInt, IsOptional, IsString, MaxLength, Min, MinLength } from 'class-validator';
import { SPEC_MASK_KINDS, type SpecMaskKind } from '@quietglass/shared/customers';
import { trim } from '../../common/dto.js';

class SpecMaskMeta {
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'name must not be empty' })
  @MaxLength(160)
  name: string;

  @IsInt({ message: 'customerId must be a customer id' })
  customerId: number;

  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'revision must not be empty' })
  @MaxLength(20)
  revision: string;

  @IsOptional()
  @IsString()
  @MaxLength(4000)
  notes?: string;

  /** 'customer' (default): the customer's specification; 'internal': the shop's own design target. */
  @IsOptional()
  @IsIn(SPEC_MASK_KINDS, { message: `kind must be one of ${SPEC_MASK_KINDS.join(', ')}` })
  kind?: SpecMaskKind;
}

/** Limit bands are checked by the optics engine's mask validation (field paths like bands[2].to_nm). */
export class SpecMaskDto extends SpecMaskMeta {
  @IsArray({ message: 'bands must be a list of limit bands' })
  bands: unknown[];
}

export class UpdateSpecMaskDto extends SpecMaskDto {
  @IsInt()
  @Min(1)
  version: number;
}

export class ImportSpecMaskCsvDto extends SpecMaskMeta {
  @IsString()
  csv: string;
}
