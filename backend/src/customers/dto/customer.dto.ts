import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';

/*
 * Response shapes for the OpenAPI description. Request bodies are checked by the shared customer
 * schemas (@quietglass/shared/schemas/customers), which the description publishes themselves.
 */

class CustomerContactView {
  @ApiProperty({ description: 'Name of the contact person', example: 'Ines Marr' }) name: string;
  @ApiProperty({ description: 'E-mail address (stored in lower case)', format: 'email' }) email: string;
  @ApiPropertyOptional({ description: 'What the contact does, e.g. purchasing' }) role?: string;
  @ApiPropertyOptional({ description: 'Telephone number as written' }) phone?: string;
}

export class CustomerViewDto {
  @ApiProperty() id: number;
  @ApiProperty() name: string;
  @ApiProperty({ type: String, nullable: true, format: 'email' }) contactEmail: string | null;
  @ApiProperty() notes: string;
  @ApiProperty({ type: [CustomerContactView] }) contacts: CustomerContactView[];
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
