import { Type } from 'class-transformer';
import { IsDateString, IsIn, IsInt, IsOptional, Min } from 'class-validator';
import { AUDIT_ENTITIES, type AuditEntity } from '@quietglass/shared/audit';

/** Filters of the audit trail, from the query string. */
export class AuditQueryDto {
  @IsOptional()
  @IsIn(AUDIT_ENTITIES, { message: `entity must be one of ${AUDIT_ENTITIES.join(', ')}` })
  entity?: AuditEntity;

  @IsOptional()
  @Type(() => Number)
  @IsInt({ message: 'entityId must be a record id' })
  @Min(1)
  entityId?: number;

  /** Shorthand for entity=design&entityId=… (the design filter of the Audit trail page). */
  @IsOptional()
  @Type(() => Number)
  @IsInt({ message: 'designId must be a design id' })
  @Min(1)
  designId?: number;

  @IsOptional()
  @Type(() => Number)
  @IsInt({ message: 'actorId must be a user id' })
  @Min(1)
  actorId?: number;

  @IsOptional()
  @IsDateString({ strict: true }, { message: 'from must be a date (YYYY-MM-DD)' })
  from?: string;

  @IsOptional()
  @IsDateString({ strict: true }, { message: 'to must be a date (YYYY-MM-DD)' })
  to?: string;
}
