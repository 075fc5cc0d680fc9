import net from 'node:net';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { Redis } from 'ioredis';
import nodemailer from 'nodemailer';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { CSRF_HEADER } from '@quietglass/shared';
import { loadConfig } from '../src/config/configuration.js';
import { SmtpFakeService } from '../src/mail/smtp-fake.service.js';
import {
  createTestApp,
  demoSession,
  sessionCookie,
  sessionWithOwnPassword,
  userVersion,
} from './support/app.js';
import { demoSignIn } from './support/env.js';
import { rawRequest } from './support/request.js';

// Checks follow OWASP ASVS 4.0.3 level 2: V3 (sessions), V2.2 (anti-automation), V4.2.2 and
// V13.2.3 (CSRF), V14.4 (security headers), V12.5 (file download), V5.1 (input), V7.1 (logs).

let app: NestExpressApplication;
let admin: string;
let counter = 0;
const http = () => request(app.getHttpServer());
const raw = () => rawRequest(app.getHttpServer());

beforeAll(async () => {
  app = await createTestApp();
  admin = await demoSession(app, 'admin');
});
afterAll(async () => {
  await app.close();
});

/** Clears the sign-in counters, so one test's guessing does not hold back the next one's users. */
async function clearSignInCounters(): Promise<void> {
  const redis = new Redis(process.env.REDIS_URL ?? '');
  const keys = await redis.keys('qg:signin:*');
  if (keys.length > 0) await redis.del(...keys);
  redis.disconnect();
}

/** A new user with their own password chosen (past the first-sign-in change): e-mail, password, cookie. */
async function readyUser(role: 'engineer' | 'sales' = 'engineer') {
  counter += 1;
  const email = `security-${Date.now()}-${counter}@larkspur.example`;
  const created = await http()
    .post('/api/users')
    .set('Cookie', admin)
    .send({ email, displayName: `Sec User ${counter}`, role, password: 'admin-set-password' });
  expect(created.status).toBe(201);
  const cookie = await sessionWithOwnPassword(app, email, 'admin-set-password');
  return { id: created.body.id as number, email, password: 'admin-set-password-own', cookie };
}

const me = (cookie: string) => http().get('/api/auth/me').set('Cookie', cookie);

describe('request ids', () => {
  it('every answer names its request: a well-formed X-Request-Id is kept, anything else replaced', async () => {
    const fresh = await http().get('/api/health');
    expect(fresh.headers['x-request-id']).toMatch(
      /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/,
    );
    const kept = await http().get('/api/health').set('X-Request-Id', 'proxy-0042-abcd');
    expect(kept.headers['x-request-id']).toBe('proxy-0042-abcd');
    const replaced = await http().get('/api/health').set('X-Request-Id', 'id with spaces <script>');
    expect(replaced.headers['x-request-id']).toMatch(/^[0-9a-f]{8}-/);
    expect(replaced.headers['x-request-id']).not.toBe(fresh.headers['x-request-id']);
  });
});

describe('sessions end on the server', () => {
  it('sign-out ends the session: replaying its token gives 401, by cookie and as a bearer token', async () => {
    const user = await readyUser();
    expect((await me(user.cookie)).status).toBe(200);
    expect((await http().post('/api/auth/sign-out').set('Cookie', user.cookie)).status).toBe(204);
    expect((await me(user.cookie)).status).toBe(401);
    const token = user.cookie.slice('qg_session='.length);
    const bearer = await http().get('/api/auth/me').set('Authorization', `Bearer ${token}`);
    expect(bearer.status).toBe(401);
    expect(bearer.body.message).toBe('Your session has ended; sign in again');
  });

  it('changing one’s own password ends every other session and keeps this one', async () => {
    const user = await readyUser();
    const other = await sessionCookie(app, user.email, user.password);
    const changed = await http()
      .post('/api/auth/password')
      .set('Cookie', user.cookie)
      .send({ currentPassword: user.password, newPassword: 'a-third-password' });
    expect(changed.status).toBe(204);
    expect((await me(other)).status).toBe(401);
    expect((await me(user.cookie)).status).toBe(200);
  });

  it('an admin reset ends every session and makes the user choose a password again', async () => {
    const user = await readyUser();
    const reset = await http()
      .post(`/api/users/${user.id}/password`)
      .set('Cookie', admin)
      .send({ newPassword: 'admin-reset-password' });
    expect(reset.status).toBe(204);
    expect((await me(user.cookie)).status).toBe(401);
    const next = await sessionCookie(app, user.email, 'admin-reset-password');
    expect((await me(next)).body.user.mustChangePassword).toBe(true);
    expect((await http().get('/api/designs').set('Cookie', next)).status).toBe(403);
  });

  it('a deactivated then reactivated account does not get its old session back', async () => {
    const user = await readyUser();
    const version = await userVersion(app, admin, user.id);
    const off = await http()
      .patch(`/api/users/${user.id}`)
      .set('Cookie', admin)
      .send({ active: false, version })
      .expect(200);
    await http()
      .patch(`/api/users/${user.id}`)
      .set('Cookie', admin)
      .send({ active: true, version: off.body.version })
      .expect(200);
    expect((await me(user.cookie)).status).toBe(401);
  });

  it('a role change ends the sessions that carried the old role', async () => {
    const user = await readyUser('sales');
    await http()
      .patch(`/api/users/${user.id}`)
      .set('Cookie', admin)
      .send({ role: 'engineer', version: await userVersion(app, admin, user.id) })
      .expect(200);
    expect((await me(user.cookie)).status).toBe(401);
  });

  it('a session idle beyond the timeout ends; one in use is renewed', async () => {
    const user = await readyUser();
    const db = app.get(DataSource);
    const idle = (loadConfig().sessionIdleSeconds + 60) * 1000;
    await db.query(
      `UPDATE sessions SET last_seen_at = now() - make_interval(secs => $2) WHERE user_id = $1 AND ended_at IS NULL`,
      [user.id, idle / 1000],
    );
    expect((await me(user.cookie)).status).toBe(401);
    const [row] = await db.query(
      `SELECT end_reason FROM sessions WHERE user_id = $1 ORDER BY created_at DESC LIMIT 1`,
      [user.id],
    );
    expect(row.end_reason).toBe('idle');

    const fresh = await sessionCookie(app, user.email, user.password);
    await db.query(
      `UPDATE sessions SET last_seen_at = now() - interval '5 minutes' WHERE user_id = $1 AND ended_at IS NULL`,
      [user.id],
    );
    expect((await me(fresh)).status).toBe(200);
    const [seen] = await db.query(
      `SELECT extract(epoch FROM now() - last_seen_at) AS ago FROM sessions WHERE user_id = $1 AND ended_at IS NULL`,
      [user.id],
    );
    expect(Number(seen.ago)).toBeLessThan(60);
  });
});

describe('sign-in throttle', () => {
  beforeEach(clearSignInCounters);
  afterEach(clearSignInCounters);

  it('ignores a forged X-Forwarded-For: rotating it does not escape the limit', async () => {
    const limit = Number(process.env.SIGNIN_LIMIT ?? 10);
    const email = demoSignIn('sales').email;
    const statuses: number[] = [];
    for (let i = 0; i < limit + 5; i += 1) {
      const res = await http()
        .post('/api/auth/sign-in')
        .set('X-Forwarded-For', `203.0.113.${i + 1}`)
        .send({ email, password: `guess-${i}` });
      statuses.push(res.status);
    }
    expect(statuses.slice(0, limit).every((s) => s === 401)).toBe(true);
    expect(statuses.slice(limit)).toEqual(Array(5).fill(429));
  });

  it('limits one password tried across many e-mails from one address', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 35; i += 1) {
      const res = await http()
        .post('/api/auth/sign-in')
        .send({ email: `spray-${i}@elsewhere.example`, password: 'Summer2026!' });
      statuses.push(res.status);
    }
    const firstRefused = statuses.indexOf(429);
    expect(firstRefused).toBe(Number(process.env.SIGNIN_LIMIT ?? 10) * 3);
    const refused = await http()
      .post('/api/auth/sign-in')
      .send({ email: 'spray-99@elsewhere.example', password: 'Summer2026!' });
    expect(refused.status).toBe(429);
    expect(refused.body.message).toMatch(/^Too many failed sign-ins from your address; try again in \d+ s$/);
    expect(Number(refused.headers['retry-after'])).toBeGreaterThan(0);
    // A demo user who signed in from here before is not held back by someone else's guessing.
    const owner = demoSignIn('operator');
    await clearSignInCounters();
    await sessionCookie(app, owner.email, owner.password);
    for (let i = 0; i < 31; i += 1)
      await http()
        .post('/api/auth/sign-in')
        .send({ email: `spray-b${i}@elsewhere.example`, password: 'x-guess' });
    const ok = await http().post('/api/auth/sign-in').send({ email: owner.email, password: owner.password });
    expect(ok.status).toBe(200);
  });

  it('answers an unknown e-mail with the same bcrypt work as a real one', async () => {
    const { hashPassword, unknownUserHash } = await import('../src/users/passwords.js');
    const bcrypt = (await import('bcryptjs')).default;
    expect(bcrypt.getRounds(await unknownUserHash())).toBe(bcrypt.getRounds(await hashPassword('x')));
  });
});

describe('sign-in throttle behind a named proxy (TRUST_PROXY)', () => {
  let proxied: NestExpressApplication;
  const via = () => request(proxied.getHttpServer());

  beforeAll(async () => {
    process.env.TRUST_PROXY = 'loopback';
    proxied = await createTestApp();
    delete process.env.TRUST_PROXY;
  });
  afterAll(async () => {
    await clearSignInCounters();
    await proxied.close();
  });

  it('holds an account guessed from many addresses, but not for the owner’s own address', async () => {
    const user = await readyUser();
    await clearSignInCounters();
    const home = await via()
      .post('/api/auth/sign-in')
      .set('X-Forwarded-For', '198.51.100.7')
      .send({ email: user.email, password: user.password });
    expect(home.status).toBe(200);
    const accountLimit = loadConfig().signInAccountFailures;
    for (let i = 0; i < accountLimit; i += 1) {
      const res = await via()
        .post('/api/auth/sign-in')
        .set('X-Forwarded-For', `192.0.2.${i + 1}`)
        .send({ email: user.email, password: `guess-${i}` });
      expect(res.status).toBe(401);
    }
    // Even the right password waits from an address the account never used…
    const stranger = await via()
      .post('/api/auth/sign-in')
      .set('X-Forwarded-For', '192.0.2.200')
      .send({ email: user.email, password: user.password });
    expect(stranger.status).toBe(429);
    expect(stranger.body.message).toMatch(/account is held .* try again in \d+ s$/);
    // …while its owner, at home, signs in as usual.
    const owner = await via()
      .post('/api/auth/sign-in')
      .set('X-Forwarded-For', '198.51.100.7')
      .send({ email: user.email, password: user.password });
    expect(owner.status).toBe(200);
  });
});

describe('cross-site requests and headers', () => {
  it('refuses a cross-site form post that would approve a design, with 403', async () => {
    const cookie = await demoSession(app, 'engineer', 1);
    const res = await raw()
      .post('/api/designs/1/versions/1/approve')
      .set('Cookie', cookie)
      .set('Origin', 'https://attacker.example')
      .set('Content-Type', 'application/x-www-form-urlencoded')
      .send('comment=ok');
    expect(res.status).toBe(403);
    expect(res.body.message).toBe('Cross-site requests are not accepted');
  });

  it('refuses a state-changing request without the client’s header, even same-origin', async () => {
    const cookie = await demoSession(app, 'sales');
    const res = await raw().post('/api/customers').set('Cookie', cookie).send({ name: 'No header Ltd' });
    expect(res.status).toBe(403);
    expect(res.body.message).toBe(`State-changing requests must carry the ${CSRF_HEADER}: 1 header`);
    const fetchSite = await raw()
      .post('/api/customers')
      .set('Cookie', cookie)
      .set(CSRF_HEADER, '1')
      .set('Sec-Fetch-Site', 'cross-site')
      .send({ name: 'Cross site Ltd' });
    expect(fetchSite.status).toBe(403);
    const ok = await raw()
      .post('/api/customers')
      .set('Cookie', cookie)
      .set(CSRF_HEADER, '1')
      .send({ name: `With header ${Date.now()}` });
    expect(ok.status).toBe(201);
  });

  it('sends the protective headers and hides the server framework', async () => {
    const res = await http().get('/api/health');
    const csp = String(res.headers['content-security-policy']);
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("script-src 'self'");
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-frame-options']).toBe('DENY');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});

describe('the local SMTP fake', () => {
  it('refuses mail from anyone who does not hold the API’s secret', async () => {
    const { port } = app.get(SmtpFakeService).connection();
    const stranger = nodemailer.createTransport({ host: '127.0.0.1', port, secure: false, ignoreTLS: true });
    await expect(
      stranger.sendMail({ from: 'x@y.example', to: 'admin@larkspur.example', subject: 'hi', text: 'hi' }),
    ).rejects.toThrow(/530|auth/i);
    const guessed = nodemailer.createTransport({
      host: '127.0.0.1',
      port,
      secure: false,
      ignoreTLS: true,
      auth: { user: 'quietglass-api', pass: 'guess' },
    });
    await expect(
      guessed.sendMail({ from: 'x@y.example', to: 'a@larkspur.example', subject: 'hi', text: 'hi' }),
    ).rejects.toThrow(/535|invalid/i);
  });

  it('serves an HTML attachment as a download of plain bytes, never as a page', async () => {
    const fake = app.get(SmtpFakeService).connection();
    const transport = nodemailer.createTransport({
      host: '127.0.0.1',
      port: fake.port,
      secure: false,
      ignoreTLS: true,
      auth: { user: fake.user, pass: fake.pass },
    });
    const subject = `attachment check ${Date.now()}`;
    await transport.sendMail({
      from: 'quotes@larkspur.example',
      to: 'buyer@halden.example',
      subject,
      text: 'see attached',
      attachments: [
        {
          filename: 'look "here".html',
          contentType: 'text/html',
          content: '<script>fetch("/api/users")</script>',
        },
      ],
    });
    const list = await http().get('/api/outbox').set('Cookie', admin);
    const message = (list.body as { id: number; subject: string; attachments: { id: number }[] }[]).find(
      (m) => m.subject === subject,
    );
    expect(message).toBeDefined();
    const file = await http()
      .get(`/api/outbox/${message!.id}/attachments/${message!.attachments[0]!.id}`)
      .set('Cookie', admin);
    expect(file.status).toBe(200);
    expect(file.headers['content-type']).toBe('application/octet-stream');
    expect(file.headers['content-disposition']).toBe(
      `attachment; filename="look _here_.html"; filename*=UTF-8''look%20%22here%22.html`,
    );
    expect(file.headers['x-content-type-options']).toBe('nosniff');
  });

  it('refuses to start on a port another program holds, naming QG_SMTP_PORT', async () => {
    const blocker = net.createServer();
    await new Promise<void>((resolve) => blocker.listen(0, '127.0.0.1', resolve));
    const port = (blocker.address() as net.AddressInfo).port;
    const fake = new SmtpFakeService(
      { ...loadConfig(), smtpUrl: null, smtpFakePort: port },
      app.get(DataSource),
    );
    await expect(fake.onModuleInit()).rejects.toThrow(
      `The local SMTP fake cannot listen on 127.0.0.1:${port} (EADDRINUSE); set QG_SMTP_PORT to a free port, or leave it unset to pick one`,
    );
    await new Promise<void>((resolve) => blocker.close(() => resolve()));
  });
});

describe('input hygiene', () => {
  it('refuses NUL characters with 400 before any work, also at sign-in', async () => {
    const res = await http().post('/api/auth/sign-in').send({ email: 'a\u0000@b.example', password: 'x' });
    expect(res.status).toBe(400);
    expect(res.body.message).toBe('email must not contain NUL characters');
    const sales = await demoSession(app, 'sales');
    const cust = await http().post('/api/customers').set('Cookie', sales).send({ name: 'Nul\u0000 Ltd' });
    expect(cust.status).toBe(400);
    expect(cust.body.message).toBe('name must not contain NUL characters');
  });

  it('refuses ids beyond the database’s integer range with 400', async () => {
    const res = await http()
      .patch('/api/users/2147483648')
      .set('Cookie', admin)
      .send({ displayName: 'Nobody', version: 1 });
    expect(res.status).toBe(400);
    expect(res.body.message).toBe('id 2147483648 is out of range (at most 2147483647)');
    const fine = await http()
      .patch('/api/users/2147483647')
      .set('Cookie', admin)
      .send({ displayName: 'Nobody', version: 1 });
    expect(fine.status).toBe(404);
  });

  it('refuses a body nested 100 000 deep with 400, also unauthenticated', async () => {
    const deep = '['.repeat(100_000) + ']'.repeat(100_000);
    const res = await http().post('/api/auth/sign-in').set('Content-Type', 'application/json').send(deep);
    expect(res.status).toBe(400);
    expect(res.body.message).toBe('The request body nests deeper than 32 levels');
  });
});
