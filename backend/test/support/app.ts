import 'reflect-metadata';
import type { INestApplication } from '@nestjs/common';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { Test } from '@nestjs/testing';
import request from 'supertest';
import { AppModule } from '../../src/app.module.js';
import { configureApp } from '../../src/app.setup.js';
import { redisConnection } from '../../src/config/configuration.js';
import type { Role } from '@quietglass/shared';
import { Redis } from 'ioredis';
import { demoSignIn, requireE2eEnv } from './env.js';

/**
 * Spec files run one after another against one Redis; each starts with no sign-in attempts counted
 * so that the sign-ins of the file before do not count against its own (the limiter's own tests
 * count from a clean slate too).
 */
async function clearSignInThrottle(redisUrl: string): Promise<void> {
  const redis = new Redis({ ...redisConnection(redisUrl), maxRetriesPerRequest: 1 });
  try {
    const keys = await redis.keys('qg:signin:*');
    if (keys.length > 0) await redis.del(...keys);
  } finally {
    redis.disconnect();
  }
}

/** The real API module on the real database and Redis, as main.ts configures it (no client). */
export async function createTestApp(): Promise<NestExpressApplication> {
  await clearSignInThrottle(requireE2eEnv().redisUrl);
  const moduleRef = await Test.createTestingModule({ imports: [AppModule] }).compile();
  const app = moduleRef.createNestApplication<NestExpressApplication>({
    bodyParser: false,
    logger: ['error'],
  });
  configureApp(app, null);
  await app.init();
  return app;
}

/** Signs in and returns the session cookie header to send with later requests. */
export async function sessionCookie(app: INestApplication, email: string, password: string): Promise<string> {
  let res = await request(app.getHttpServer()).post('/api/auth/sign-in').send({ email, password });
  // A file that signs one user in more often than the per-minute limit waits as a user would.
  const waitSeconds = Number(res.body?.retryAfterSeconds ?? Infinity);
  if (res.status === 429 && waitSeconds <= 20) {
    await new Promise((r) => setTimeout(r, waitSeconds * 1000 + 100));
    res = await request(app.getHttpServer()).post('/api/auth/sign-in').send({ email, password });
  }
  if (res.status !== 200)
    throw new Error(`sign-in as ${email} gave ${res.status}: ${JSON.stringify(res.body)}`);
  const cookie = ([] as string[])
    .concat(res.headers['set-cookie'] ?? [])
    .find((c) => c.startsWith('qg_session='));
  if (!cookie) throw new Error('sign-in set no qg_session cookie');
  return cookie.split(';')[0]!;
}

export async function demoSession(app: INestApplication, role: Role, index = 0): Promise<string> {
  const demo = demoSignIn(role, index);
  return sessionCookie(app, demo.email, demo.password);
}

/**
 * Signs in a user whose password an admin set and chooses their own (`password` + `-own`), as the
 * API requires before anything else; returns the session cookie, which stays valid.
 */
export async function sessionWithOwnPassword(
  app: INestApplication,
  email: string,
  adminSetPassword: string,
): Promise<string> {
  const cookie = await sessionCookie(app, email, adminSetPassword);
  const res = await request(app.getHttpServer())
    .post('/api/auth/password')
    .set('Cookie', cookie)
    .send({ currentPassword: adminSetPassword, newPassword: `${adminSetPassword}-own` });
  if (res.status !== 204) throw new Error(`own password for ${email} gave ${res.status}`);
  return cookie;
}

/** The account's current version as the admin's user list shows it (an edit sends it back). */
export async function userVersion(app: INestApplication, adminCookie: string, id: number): Promise<number> {
  const res = await request(app.getHttpServer()).get('/api/users').set('Cookie', adminCookie);
  const user = (res.body as { id: number; version: number }[]).find((u) => u.id === id);
  if (!user) throw new Error(`user ${id} is not in the list (${res.status})`);
  return user.version;
}
