import { IsString, MaxLength, MinLength } from 'class-validator';

export class SignInDto {
  @IsString()
  @MinLength(1, { message: 'email is required' })
  @MaxLength(254)
  email: string;

  @IsString()
  @MinLength(1, { message: 'password is required' })
  @MaxLength(200)
  password: string;
}
