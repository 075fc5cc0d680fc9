import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { Session } from './session.entity.js';
import { SessionsService } from './sessions.service.js';

/** Owns the sessions table; auth opens and checks sessions, users ends them on account changes. */
@Module({
  imports: [TypeOrmModule.forFeature([Session])],
  providers: [SessionsService],
  exports: [SessionsService],
})
export class SessionsModule {}
