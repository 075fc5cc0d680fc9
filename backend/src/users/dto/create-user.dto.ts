import { Transform } from 'class-transformer';
import { IsEmail, IsIn, IsString, MaxLength, MinLength } from 'class-validator';
import { ROLES, type Role } from '@quietglass/shared';
import { MIN_PASSWORD_LENGTH } from '../passwords.js';
import { trim, trimLower } from '../../common/dto.js';

export class CreateUserDto {
  @Transform(trimLower)
  @IsEmail({}, { message: 'email must be a valid e-mail address' })
  @MaxLength(254)
  email: string;

  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'displayName must not be empty' })
  @MaxLength(120)
  displayName: string;

  @IsIn(ROLES, { message: `role must be one of ${ROLES.join(', ')}` })
  role: Role;

  @IsString()
  @MinLength(MIN_PASSWORD_LENGTH, { message: `password must be at least ${MIN_PASSWORD_LENGTH} characters` })
  @MaxLength(200)
  password: string;
}
