import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform, Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsEmail,
  IsInt,
  IsOptional,
  IsString,
  Max,
  MaxLength,
  Min,
  MinLength,
  ValidateIf,
  ValidateNested,
} from 'class-validator';
import { CUSTOMER_LIMITS as L } from '@quietglass/shared/customers';
import { trim, trimLower } from '../../common/dto.js';

/** E-mail addresses are kept trimmed and in lower case; an empty one means none. */
const emailValue = ({ value }: { value: unknown }): unknown =>
  typeof value === 'string' ? value.trim().toLowerCase() || null : value;

export class CustomerContactDto {
  @ApiProperty({ description: 'Name of the contact person', maxLength: L.contactName, example: 'Ines Marr' })
  @Transform(trim)
  @IsString({ message: 'name must be text' })
  @MinLength(1, { message: 'name must not be empty' })
  @MaxLength(L.contactName, { message: `name has at most ${L.contactName} characters` })
  name: string;

  @ApiProperty({
    description: 'E-mail address (stored in lower case)',
    format: 'email',
    example: 'ines@quillon.example',
  })
  @Transform(trimLower)
  @IsEmail({}, { message: 'email must be a valid e-mail address' })
  @MaxLength(L.contactEmail)
  email: string;

  @ApiPropertyOptional({ description: 'What the contact does, e.g. purchasing', maxLength: L.contactRole })
  @IsOptional()
  @Transform(trim)
  @IsString()
  @MaxLength(L.contactRole, { message: `role has at most ${L.contactRole} characters` })
  role?: string;

  @ApiPropertyOptional({ description: 'Telephone number as written', maxLength: L.contactPhone })
  @IsOptional()
  @Transform(trim)
  @IsString()
  @MaxLength(L.contactPhone, { message: `phone has at most ${L.contactPhone} characters` })
  phone?: string;
}

export class CustomerDto {
  @ApiProperty({
    description: 'Unique customer name',
    minLength: 1,
    maxLength: L.name,
    example: 'Quillon Optics',
  })
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'name must not be empty' })
  @MaxLength(L.name)
  name: string;

  @ApiPropertyOptional({
    description: 'Address quotes go to by default (stored in lower case); null for none',
    format: 'email',
    nullable: true,
    type: String,
  })
  @IsOptional()
  @Transform(emailValue)
  @ValidateIf((_o, v) => v !== null)
  @IsEmail({}, { message: 'contactEmail must be a valid e-mail address' })
  contactEmail?: string | null;

  @ApiPropertyOptional({ maxLength: L.notes })
  @IsOptional()
  @IsString()
  @MaxLength(L.notes)
  notes?: string;

  @ApiPropertyOptional({ type: [CustomerContactDto], maxItems: L.contacts, description: 'Contact people' })
  @IsOptional()
  @IsArray({ message: 'contacts must be a list of contacts' })
  @ArrayMaxSize(L.contacts, { message: `contacts: at most ${L.contacts} contacts` })
  @ValidateNested({ each: true })
  @Type(() => CustomerContactDto)
  contacts?: CustomerContactDto[];
}

export class UpdateCustomerDto extends CustomerDto {
  @ApiProperty({ description: 'The customer version the edit started from (409 when stale)', minimum: 1 })
  @IsInt({ message: 'version must be the customer version you are changing' })
  @Min(1)
  @Max(2_147_483_647)
  version: number;
}

/** Archiving or restoring names the version it was decided on, like every edit. */
export class CustomerVersionDto {
  @ApiProperty({ description: 'The customer version the change started from (409 when stale)', minimum: 1 })
  @IsInt({ message: 'version must be the customer version you are changing' })
  @Min(1)
  @Max(2_147_483_647)
  version: number;
}

export class CustomerViewDto {
  @ApiProperty() id: number;
  @ApiProperty() name: string;
  @ApiProperty({ type: String, nullable: true, format: 'email' }) contactEmail: string | null;
  @ApiProperty() notes: string;
  @ApiProperty({ type: [CustomerContactDto] }) contacts: CustomerContactDto[];
  @ApiProperty({ type: String, format: 'date-time', nullable: true, description: 'Set while archived' })
  archivedAt: string | null;
  @ApiProperty({ description: 'Optimistic-lock version; send it back with an edit' }) version: number;
}

class CustomerRecordLink {
  @ApiProperty() id: number;
  @ApiProperty({ description: 'What the record is called on its page' }) title: string;
  @ApiProperty({ description: 'State or kind, e.g. draft, released, internal' }) status: string;
  @ApiProperty({ type: String, format: 'date-time' }) at: string;
}

export class CustomerRecordsDto {
  @ApiProperty({ type: [CustomerRecordLink] }) masks: CustomerRecordLink[];
  @ApiProperty({ type: [CustomerRecordLink] }) designs: CustomerRecordLink[];
  @ApiProperty({ type: [CustomerRecordLink] }) reports: CustomerRecordLink[];
  @ApiProperty({ type: [CustomerRecordLink] }) quotes: CustomerRecordLink[];
}
