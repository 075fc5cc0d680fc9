import { Transform } from 'class-transformer';
import { IsEmail, IsInt, IsOptional, IsString, Min, MaxLength, MinLength, ValidateIf } from 'class-validator';
import { trim } from '../../common/dto.js';

export class CustomerDto {
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'name must not be empty' })
  @MaxLength(160)
  name: string;

  @IsOptional()
  @Transform(({ value }) => (typeof value === 'string' ? value.trim().toLowerCase() || null : value))
  @ValidateIf((_o, v) => v !== null)
  @IsEmail({}, { message: 'contactEmail must be a valid e-mail address' })
  contactEmail?: string | null;

  @IsOptional()
  @IsString()
  @MaxLength(4000)
  notes?: string;
}

export class UpdateCustomerDto extends CustomerDto {
  /** The version the edit started from. */
  @IsInt({ message: 'version must be the customer version you are changing' })
  @Min(1)
  version: number;
}
