import { IsString, MaxLength, MinLength } from 'class-validator';
import { MIN_PASSWORD_LENGTH } from '../../users/passwords.js';

export class ChangePasswordDto {
  @IsString()
  @MinLength(1, { message: 'currentPassword is required' })
  @MaxLength(200)
  currentPassword: string;

  @IsString()
  @MinLength(MIN_PASSWORD_LENGTH, {
    message: `newPassword must be at least ${MIN_PASSWORD_LENGTH} characters`,
  })
  @MaxLength(200)
  newPassword: string;
}
