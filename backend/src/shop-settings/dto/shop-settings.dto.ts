import { Transform } from 'class-transformer';
import { IsIn, IsInt, IsNumber, IsString, Max, MaxLength, Min, MinLength } from 'class-validator';
import { MAX_TARGET_MARGIN_PERCENT } from '@quietglass/shared/optimise/fit';
import { LOGO_MAX_BYTES, LOGO_TYPES, SHOP_NAME_MAX, type LogoType } from '@quietglass/shared/shop';
import { finite, trim } from '../../common/dto.js';

export class ShopNameDto {
  @Transform(trim)
  @IsString({ message: 'shopName must be text' })
  @MinLength(1, { message: 'shopName must not be empty' })
  @MaxLength(SHOP_NAME_MAX, { message: `shopName must be at most ${SHOP_NAME_MAX} characters` })
  shopName: string;

  /** The version the editor read: 0 before the first save. */
  @IsInt({ message: 'version must be the version you read' })
  @Min(0)
  version: number;
}

/** Base64 of the file: 4 characters per 3 bytes, plus padding. */
const BASE64_MAX = Math.ceil(LOGO_MAX_BYTES / 3) * 4;

export class ShopLogoDto {
  @IsIn(LOGO_TYPES, { message: `contentType must be one of ${LOGO_TYPES.join(', ')}` })
  contentType: LogoType;

  @IsString({ message: 'dataBase64 must be the file in base64' })
  @MinLength(4, { message: 'dataBase64 must not be empty' })
  @MaxLength(BASE64_MAX, {
    message: `the logo must be at most ${LOGO_MAX_BYTES / 1024} KB`,
  })
  dataBase64: string;

  @IsInt({ message: 'version must be the version you read' })
  @Min(0)
  version: number;
}

export class ShopTargetMarginDto {
  /** Percentage points inside every limit, 0 to MAX_TARGET_MARGIN_PERCENT. */
  @IsNumber(finite, { message: 'targetMarginPercent must be a number' })
  @Min(0, { message: 'targetMarginPercent must be ≥ 0' })
  @Max(MAX_TARGET_MARGIN_PERCENT, {
    message: `targetMarginPercent must be at most ${MAX_TARGET_MARGIN_PERCENT} percentage points`,
  })
  targetMarginPercent: number;

  @IsInt({ message: 'version must be the version you read' })
  @Min(0)
  version: number;
}
