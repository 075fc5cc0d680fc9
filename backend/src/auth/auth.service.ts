import { BadRequestException, ForbiddenException, Injectable, UnauthorizedException } from '@nestjs/common';
import { JwtService } from '@nestjs/jwt';
import { SessionsService } from '../sessions/sessions.service.js';
import { UsersService } from '../users/users.service.js';
import type { User } from '../users/user.entity.js';
import { unknownUserHash, verifyPassword } from '../users/passwords.js';
import type { SessionClaims } from './session.js';
import { SignInLimiter } from './sign-in-limiter.js';

/** One message for unknown e-mail and wrong password: it must not tell them apart. */
export const WRONG_CREDENTIALS = 'Wrong e-mail or password.';
/** Said only after the right password, so it tells nothing to someone guessing. */
export const ACCOUNT_INACTIVE = 'This account is inactive; ask an admin of your shop to reactivate it.';

@Injectable()
export class AuthService {
  constructor(
    private readonly users: UsersService,
    private readonly sessions: SessionsService,
    private readonly jwt: JwtService,
    private readonly limiter: SignInLimiter,
  ) {}

  async signIn(email: string, password: string, address: string): Promise<{ user: User; token: string }> {
    const key = email.trim().toLowerCase();
    await this.limiter.before(address, key);
    const user = await this.users.findByEmail(key);
    // The same bcrypt work whether or not the e-mail exists, so timing does not tell.
    const ok = await verifyPassword(password, user?.passwordHash ?? (await unknownUserHash()));
    if (!user || !ok) {
      await this.limiter.failed(address, key);
      throw new UnauthorizedException(WRONG_CREDENTIALS);
    }
    await this.limiter.succeeded(address, key);
    if (!user.active) throw new ForbiddenException(ACCOUNT_INACTIVE);
    const session = await this.sessions.open(user.id);
    const claims: SessionClaims = { sub: user.id, sid: session.id };
    return { user, token: await this.jwt.signAsync(claims) };
  }

  async signOut(sessionId: string): Promise<void> {
    await this.sessions.end(sessionId, 'sign-out');
  }

  async changePassword(
    user: User,
    sessionId: string,
    currentPassword: string,
    newPassword: string,
  ): Promise<void> {
    if (!(await verifyPassword(currentPassword, user.passwordHash))) {
      throw new BadRequestException('The current password is wrong');
    }
    if (currentPassword === newPassword) {
      throw new BadRequestException('The new password must differ from the current one');
    }
    await this.users.setPassword(user.id, newPassword, { kind: 'self', keepSession: sessionId });
  }
}
