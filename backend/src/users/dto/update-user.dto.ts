import { Transform } from 'class-transformer';
import { IsBoolean, IsIn, IsOptional, IsString, MaxLength, MinLength } from 'class-validator';
import { ROLES, type Role } from '@quietglass/shared';
import { trim } from '../../common/dto.js';

export class UpdateUserDto {
  @IsOptional()
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'displayName must not be empty' })
  @MaxLength(120)
  displayName?: string;

  @IsOptional()
  @IsIn(ROLES, { message: `role must be one of ${ROLES.join(', ')}` })
  role?: Role;

  @IsOptional()
  @IsBoolean()
  active?: boolean;
}
