import { BadRequestException, Injectable, UnauthorizedException } from '@nestjs/common';
import { JwtService } from '@nestjs/jwt';
import { UsersService } from '../users/users.service.js';
import type { User } from '../users/user.entity.js';
import { UNKNOWN_USER_HASH, verifyPassword } from '../users/passwords.js';
import type { SessionClaims } from './session.js';

/** One message for unknown e-mail, wrong password and inactive account: it must not tell them apart. */
export const WRONG_CREDENTIALS = 'Wrong e-mail or password.';

@Injectable()
export class AuthService {
  constructor(
    private readonly users: UsersService,
    private readonly jwt: JwtService,
  ) {}

  async signIn(email: string, password: string): Promise<{ user: User; token: string }> {
    const user = await this.users.findByEmail(email);
    const ok = await verifyPassword(password, user?.passwordHash ?? UNKNOWN_USER_HASH);
    if (!user || !ok || !user.active) throw new UnauthorizedException(WRONG_CREDENTIALS);
    const claims: SessionClaims = { sub: user.id, role: user.role };
    return { user, token: await this.jwt.signAsync(claims) };
  }

  async changePassword(user: User, currentPassword: string, newPassword: string): Promise<void> {
    if (!(await verifyPassword(currentPassword, user.passwordHash))) {
      throw new BadRequestException('The current password is wrong');
    }
    if (currentPassword === newPassword) {
      throw new BadRequestException('The new password must differ from the current one');
    }
    await this.users.setPassword(user.id, newPassword);
  }
}
