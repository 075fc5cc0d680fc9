import { Body, Controller, Get, HttpCode, Inject, Post, Req, Res } from '@nestjs/common';
import type { Request, Response } from 'express';
import type { UserView } from '@quietglass/shared';
import { appConfig, type AppConfig } from '../config/configuration.js';
import type { User } from '../users/user.entity.js';
import { toUserView } from '../users/user-view.js';
import { AuthService } from './auth.service.js';
import { CurrentSession, CurrentUser, type AuthedRequest } from './current-user.decorator.js';
import {
  changePasswordSchema,
  signInSchema,
  type ChangePasswordInput,
  type SignInInput,
} from '@quietglass/shared/schemas/users';
import { ZodBody } from '../common/zod-body.js';
import { AllowedBeforePasswordChange, OptionalSession, Public } from './public.decorator.js';
import { SESSION_COOKIE } from './session.js';

@Controller('auth')
export class AuthController {
  constructor(
    private readonly auth: AuthService,
    @Inject(appConfig.KEY) private readonly config: AppConfig,
  ) {}

  @Public()
  @Post('sign-in')
  @HttpCode(200)
  @ZodBody(signInSchema)
  async signIn(
    @Body() dto: SignInInput,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<{ user: UserView }> {
    const { user, token } = await this.auth.signIn(dto.email, dto.password, req.ip ?? 'unknown');
    res.cookie(SESSION_COOKIE, token, {
      httpOnly: true,
      // The client and API share one origin: the cookie never needs to go along cross-site.
      sameSite: 'strict',
      secure: this.config.cookieSecure || req.secure,
      path: '/',
      maxAge: this.config.jwtTtlSeconds * 1000,
    });
    return { user: toUserView(user) };
  }

  /** Ends this session on the server (the token stops working at once) and clears the cookie. */
  @Post('sign-out')
  @HttpCode(204)
  @AllowedBeforePasswordChange()
  async signOut(
    @CurrentSession() sessionId: string,
    @Res({ passthrough: true }) res: Response,
  ): Promise<void> {
    await this.auth.signOut(sessionId);
    res.clearCookie(SESSION_COOKIE, { path: '/' });
  }

  /**
   * Who is signed in, for the client's session check: `{ user: null }` with 200 when nobody is, so
   * a visit to the sign-in page is not an error.
   */
  @Get('session')
  @OptionalSession()
  session(@Req() req: AuthedRequest): { user: UserView | null } {
    return { user: req.user ? toUserView(req.user) : null };
  }

  @Get('me')
  @AllowedBeforePasswordChange()
  me(@CurrentUser() user: User): { user: UserView } {
    return { user: toUserView(user) };
  }

  /** Changes the user's own password; every other session of theirs ends. */
  @Post('password')
  @HttpCode(204)
  @AllowedBeforePasswordChange()
  @ZodBody(changePasswordSchema)
  async changePassword(
    @CurrentUser() user: User,
    @CurrentSession() sessionId: string,
    @Body() dto: ChangePasswordInput,
  ): Promise<void> {
    await this.auth.changePassword(user, sessionId, dto.currentPassword, dto.newPassword);
  }
}
