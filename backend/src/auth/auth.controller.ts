import { Body, Controller, Get, HttpCode, Inject, Post, Res, UseGuards } from '@nestjs/common';
import type { Response } from 'express';
import type { UserView } from '@quietglass/shared';
import { appConfig, type AppConfig } from '../config/configuration.js';
import { toUserView, type User } from '../users/user.entity.js';
import { AuthService } from './auth.service.js';
import { CurrentUser } from './current-user.decorator.js';
import { ChangePasswordDto } from './dto/change-password.dto.js';
import { SignInDto } from './dto/sign-in.dto.js';
import { Public } from './public.decorator.js';
import { SESSION_COOKIE } from './session.js';
import { SignInThrottlerGuard } from './sign-in-throttler.guard.js';

@Controller('auth')
export class AuthController {
  constructor(
    private readonly auth: AuthService,
    @Inject(appConfig.KEY) private readonly config: AppConfig,
  ) {}

  @Public()
  @Post('sign-in')
  @HttpCode(200)
  @UseGuards(SignInThrottlerGuard)
  async signIn(
    @Body() dto: SignInDto,
    @Res({ passthrough: true }) res: Response,
  ): Promise<{ user: UserView }> {
    const { user, token } = await this.auth.signIn(dto.email, dto.password);
    res.cookie(SESSION_COOKIE, token, {
      httpOnly: true,
      sameSite: 'lax',
      secure: this.config.cookieSecure,
      path: '/',
      maxAge: this.config.jwtTtlSeconds * 1000,
    });
    return { user: toUserView(user) };
  }

  @Public()
  @Post('sign-out')
  @HttpCode(204)
  signOut(@Res({ passthrough: true }) res: Response): void {
    res.clearCookie(SESSION_COOKIE, { path: '/' });
  }

  @Get('me')
  me(@CurrentUser() user: User): { user: UserView } {
    return { user: toUserView(user) };
  }

  @Post('password')
  @HttpCode(204)
  async changePassword(@CurrentUser() user: User, @Body() dto: ChangePasswordDto): Promise<void> {
    await this.auth.changePassword(user, dto.currentPassword, dto.newPassword);
  }
}
