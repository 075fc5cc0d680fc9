import { Transform, Type } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
  IsDateString,
  IsEmail,
  IsIn,
  IsInt,
  IsNumber,
  IsOptional,
  IsString,
  Matches,
  Max,
  MaxLength,
  Min,
  MinLength,
  ValidateNested,
} from 'class-validator';
import { finite, trim, trimLower } from '../../common/dto.js';

/** Prices: finite, at most 4 decimals. */
const money = { ...finite, maxDecimalPlaces: 4 } as const;

export class QuantityBreakDto {
  @IsInt({ message: 'minQuantity must be a whole number' })
  @Min(1, { message: 'minQuantity must be at least 1' })
  minQuantity: number;

  @IsNumber(money, { message: 'unitPrice must be a number with at most 4 decimals' })
  @Min(0, { message: 'unitPrice must not be negative' })
  @Max(1e9)
  unitPrice: number;
}

export class QuoteDto {
  @IsInt({ message: 'customerId must be a customer id' })
  customerId: number;

  @Transform(trimLower)
  @IsEmail({}, { message: 'contactEmail must be a valid e-mail address' })
  contactEmail: string;

  @IsInt({ message: 'designId must be a design id' })
  designId: number;

  @IsInt({ message: 'versionNumber must be a version number' })
  versionNumber: number;

  @IsOptional()
  @IsInt({ message: 'specMaskId must be a spec mask id' })
  specMaskId?: number;

  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'partDescription must not be empty' })
  @MaxLength(2000)
  partDescription: string;

  @IsArray()
  @ArrayMinSize(1, { message: 'quantityBreaks needs at least one price' })
  @ArrayMaxSize(20)
  @ValidateNested({ each: true })
  @Type(() => QuantityBreakDto)
  quantityBreaks: QuantityBreakDto[];

  @Matches(/^[A-Z]{3}$/, { message: 'currency must be a three-letter ISO 4217 code such as EUR or USD' })
  currency: string;

  @IsInt({ message: 'leadTimeDays must be a whole number of days' })
  @Min(1)
  @Max(730)
  leadTimeDays: number;

  @IsDateString({ strict: true }, { message: 'validUntil must be a date (YYYY-MM-DD)' })
  validUntil: string;

  @IsOptional()
  @IsString()
  @MaxLength(8000)
  terms?: string;
}

export class UpdateQuoteDto extends QuoteDto {
  @IsInt()
  @Min(1)
  version: number;
}

export class AttachReportsDto {
  @IsArray()
  @ArrayMaxSize(10)
  @IsInt({ each: true, message: 'reportIds must hold report ids' })
  reportIds: number[];
}

export class QuoteDecisionDto {
  @IsIn(['accepted', 'declined'], { message: 'status must be accepted or declined' })
  status: 'accepted' | 'declined';

  @IsOptional()
  @IsString()
  @MaxLength(2000)
  note?: string;
}
