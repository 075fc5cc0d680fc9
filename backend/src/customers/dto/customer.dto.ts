import { Transform } from 'class-transformer';
import { IsEmail, IsOptional, IsString, MaxLength, MinLength, ValidateIf } from 'class-validator';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);

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
