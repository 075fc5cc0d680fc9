import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES } from '@quietglass/shared';
import { createTestApp, demoSession, sessionCookie } from './support/app.js';
import { demoSignIn } from './support/env.js';

let app: NestExpressApplication;

beforeAll(async () => {
  app = await createTestApp();
});
afterAll(async () => {
  await app.close();
});

const http = () => request(app.getHttpServer());

describe('sign-in', () => {
  it.each(ROLES)('signs in the demo %s and sets an httpOnly session cookie', async (role) => {
    const demo = demoSignIn(role);
    const res = await http().post('/api/auth/sign-in').send({ email: demo.email, password: demo.password });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ email: demo.email, role, active: true });
    expect(res.body.user).not.toHaveProperty('passwordHash');
    const cookie = ([] as string[])
      .concat(res.headers['set-cookie'] ?? [])
      .find((c) => c.startsWith('qg_session='));
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Strict/i);
  });

  it('accepts the e-mail in any case and with spaces around it', async () => {
    const demo = demoSignIn('sales');
    const res = await http()
      .post('/api/auth/sign-in')
      .send({ email: `  ${demo.email.toUpperCase()} `, password: demo.password });
    expect(res.status).toBe(200);
  });

  it('answers a wrong password and an unknown e-mail alike, with 401', async () => {
    const demo = demoSignIn('engineer');
    const wrong = await http()
      .post('/api/auth/sign-in')
      .send({ email: demo.email, password: 'not-the-password' });
    const unknown = await http()
      .post('/api/auth/sign-in')
      .send({ email: 'nobody@larkspur.example', password: 'whatever-it-is' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual({
      statusCode: 401,
      error: 'Unauthorized',
      message: 'Wrong e-mail or password.',
    });
    expect(unknown.body).toEqual(wrong.body);
    expect(wrong.headers['set-cookie']).toBeUndefined();
  });

  it('rejects a malformed body with 400 and per-field details, and unknown fields', async () => {
    const res = await http().post('/api/auth/sign-in').send({ email: '', password: 12 });
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual(
      expect.arrayContaining(['email: Enter your e-mail address', 'password: Enter your password']),
    );
    const extra = await http()
      .post('/api/auth/sign-in')
      .send({ email: 'a@b.example', password: 'x', admin: true });
    expect(extra.status).toBe(400);
    expect(extra.body.details).toContain('Unrecognized key: "admin"');
  });

  it('rejects a body that is not JSON with a clear 400', async () => {
    const res = await http()
      .post('/api/auth/sign-in')
      .set('Content-Type', 'application/json')
      .send('{"email":');
    expect(res.status).toBe(400);
    expect(res.body.message).toBe('The request body is not valid JSON');
  });

  it('throttles repeated attempts for one e-mail with 429, without locking out others', async () => {
    const limit = Number(process.env.SIGNIN_LIMIT ?? 10);
    const email = 'throttle-target@larkspur.example';
    for (let i = 0; i < limit; i += 1) {
      const res = await http()
        .post('/api/auth/sign-in')
        .send({ email, password: `guess-${i}` });
      expect(res.status).toBe(401);
    }
    const blocked = await http().post('/api/auth/sign-in').send({ email, password: 'one-more-guess' });
    expect(blocked.status).toBe(429);
    expect(blocked.body.message).toMatch(/too many attempts/i);
    const other = demoSignIn('operator');
    const ok = await http().post('/api/auth/sign-in').send({ email: other.email, password: other.password });
    expect(ok.status).toBe(200);
  });
});

describe('session', () => {
  it('GET /api/auth/session answers 200 with the user, or with null when nobody is signed in', async () => {
    const anonymous = await http().get('/api/auth/session');
    expect(anonymous.status).toBe(200);
    expect(anonymous.body).toEqual({ user: null });
    const ended = await http().get('/api/auth/session').set('Cookie', 'qg_session=not-a-token');
    expect(ended.status).toBe(200);
    expect(ended.body).toEqual({ user: null });
    const cookie = await demoSession(app, 'operator');
    const signedIn = await http().get('/api/auth/session').set('Cookie', cookie);
    expect(signedIn.status).toBe(200);
    expect(signedIn.body.user).toMatchObject({ role: 'operator', email: demoSignIn('operator').email });
  });

  it('GET /api/auth/me needs a session', async () => {
    expect((await http().get('/api/auth/me')).status).toBe(401);
    const bogus = await http().get('/api/auth/me').set('Cookie', 'qg_session=not-a-token');
    expect(bogus.status).toBe(401);
  });

  it('GET /api/auth/me returns the signed-in user, by cookie or bearer token', async () => {
    const cookie = await demoSession(app, 'engineer', 1);
    const res = await http().get('/api/auth/me').set('Cookie', cookie);
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ role: 'engineer', email: demoSignIn('engineer', 1).email });
    const token = cookie.slice('qg_session='.length);
    const bearer = await http().get('/api/auth/me').set('Authorization', `Bearer ${token}`);
    expect(bearer.status).toBe(200);
  });

  it('sign-out clears the cookie', async () => {
    const res = await http()
      .post('/api/auth/sign-out')
      .set('Cookie', await demoSession(app, 'sales'));
    expect(res.status).toBe(204);
    const cleared = ([] as string[])
      .concat(res.headers['set-cookie'] ?? [])
      .find((c) => c.startsWith('qg_session='));
    expect(cleared).toMatch(/Expires=Thu, 01 Jan 1970/);
  });
});

describe('change password', () => {
  it('needs the current password, a long enough new one, and then only the new one works', async () => {
    const admin = await demoSession(app, 'admin');
    const email = 'password-changer@larkspur.example';
    const created = await http()
      .post('/api/users')
      .set('Cookie', admin)
      .send({ email, displayName: 'Pat Changer', role: 'engineer', password: 'first-password-1' });
    expect(created.status).toBe(201);
    const cookie = await sessionCookie(app, email, 'first-password-1');
    const held = await http().get('/api/designs').set('Cookie', cookie);
    expect(held.status).toBe(403);
    expect(held.body.message).toBe('Choose your own password first (Account → Change password)');
    const me = await http().get('/api/auth/me').set('Cookie', cookie);
    expect(me.body.user.mustChangePassword).toBe(true);

    const wrong = await http()
      .post('/api/auth/password')
      .set('Cookie', cookie)
      .send({ currentPassword: 'not-it-at-all', newPassword: 'second-password-2' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.message).toBe('The current password is wrong');

    const short = await http()
      .post('/api/auth/password')
      .set('Cookie', cookie)
      .send({ currentPassword: 'first-password-1', newPassword: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.details).toContain('newPassword: At least 10 characters');

    const ok = await http()
      .post('/api/auth/password')
      .set('Cookie', cookie)
      .send({ currentPassword: 'first-password-1', newPassword: 'second-password-2' });
    expect(ok.status).toBe(204);
    // Chosen by the user: the hold is lifted and the same session goes on.
    expect((await http().get('/api/designs').set('Cookie', cookie)).status).toBe(200);
    expect((await http().get('/api/auth/me').set('Cookie', cookie)).body.user.mustChangePassword).toBe(false);
    const old = await http().post('/api/auth/sign-in').send({ email, password: 'first-password-1' });
    expect(old.status).toBe(401);
    const fresh = await http().post('/api/auth/sign-in').send({ email, password: 'second-password-2' });
    expect(fresh.status).toBe(200);
  });
});
