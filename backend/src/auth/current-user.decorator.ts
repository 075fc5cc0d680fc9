import { createParamDecorator, type ExecutionContext } from '@nestjs/common';
import type { Request } from 'express';
import type { User } from '../users/user.entity.js';

export type AuthedRequest = Request & { user?: User; sessionId?: string };

/** The signed-in user, as loaded by the session guard. */
export const CurrentUser = createParamDecorator((_data: unknown, ctx: ExecutionContext): User => {
  const req = ctx.switchToHttp().getRequest<AuthedRequest>();
  if (!req.user) throw new Error('CurrentUser used on a public route');
  return req.user;
});

/** Id of the server-side session of this request. */
export const CurrentSession = createParamDecorator((_data: unknown, ctx: ExecutionContext): string => {
  const req = ctx.switchToHttp().getRequest<AuthedRequest>();
  if (!req.sessionId) throw new Error('CurrentSession used on a public route');
  return req.sessionId;
});
