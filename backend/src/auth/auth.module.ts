import { Module } from '@nestjs/common';
import { APP_GUARD } from '@nestjs/core';
import { JwtModule } from '@nestjs/jwt';
import { appConfig, type AppConfig } from '../config/configuration.js';
import { SessionsModule } from '../sessions/sessions.module.js';
import { UsersModule } from '../users/users.module.js';
import { AuthController } from './auth.controller.js';
import { AuthService } from './auth.service.js';
import { RolesGuard } from './roles.guard.js';
import { SessionGuard } from './session.guard.js';
import { SignInLimiter } from './sign-in-limiter.js';

@Module({
  imports: [
    UsersModule,
    SessionsModule,
    JwtModule.registerAsync({
      inject: [appConfig.KEY],
      useFactory: (config: AppConfig) => {
        if (!config.jwtSecret)
          throw new Error('JWT_SECRET is not set (npm start sets it; see README, Configuration)');
        return {
          secret: config.jwtSecret,
          signOptions: { expiresIn: config.jwtTtlSeconds },
        };
      },
    }),
  ],
  controllers: [AuthController],
  providers: [
    AuthService,
    SignInLimiter,
    { provide: APP_GUARD, useClass: SessionGuard },
    { provide: APP_GUARD, useClass: RolesGuard },
  ],
})
export class AuthModule {}
