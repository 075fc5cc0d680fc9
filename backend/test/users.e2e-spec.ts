import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  createTestApp,
  demoSession,
  sessionCookie,
  sessionWithOwnPassword,
  userVersion,
} from './support/app.js';
import { demoSignIn } from './support/env.js';

let app: NestExpressApplication;
let admin: string;

beforeAll(async () => {
  app = await createTestApp();
  admin = await demoSession(app, 'admin');
});
afterAll(async () => {
  await app.close();
});

const http = () => request(app.getHttpServer());
const userCount = async () =>
  Number((await app.get(DataSource).query('SELECT count(*) AS n FROM users'))[0].n);

describe('users (admin)', () => {
  it('lists every user without password hashes', async () => {
    const res = await http().get('/api/users').set('Cookie', admin);
    expect(res.status).toBe(200);
    const emails = (res.body as { email: string }[]).map((u) => u.email);
    expect(emails).toEqual(expect.arrayContaining([demoSignIn('admin').email, demoSignIn('operator').email]));
    for (const u of res.body) expect(u).not.toHaveProperty('passwordHash');
  });

  it('creates a user, stores the e-mail lower-case and refuses a duplicate with 409', async () => {
    const body = {
      email: 'New.Operator@Larkspur.example',
      displayName: 'Noor Ahn',
      role: 'operator',
      password: 'a-long-password',
    };
    const res = await http().post('/api/users').set('Cookie', admin).send(body);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      email: 'new.operator@larkspur.example',
      role: 'operator',
      active: true,
    });
    const before = await userCount();
    const dup = await http().post('/api/users').set('Cookie', admin).send(body);
    expect(dup.status).toBe(409);
    expect(dup.body.message).toBe('A user with e-mail new.operator@larkspur.example already exists');
    expect(await userCount()).toBe(before);
  });

  it.each([
    [
      { email: 'not-an-email', displayName: 'X', role: 'engineer', password: 'long-enough-pw' },
      'email: Enter a valid e-mail address',
    ],
    [
      { email: 'a@larkspur.example', displayName: 'X', role: 'wizard', password: 'long-enough-pw' },
      'role: Choose a role: admin, engineer, sales, operator',
    ],
    [
      { email: 'a@larkspur.example', displayName: 'X', role: 'engineer', password: 'short' },
      'password: At least 10 characters',
    ],
    [
      { email: 'a@larkspur.example', displayName: '   ', role: 'engineer', password: 'long-enough-pw' },
      'displayName: Enter a display name',
    ],
  ])('rejects %j with 400 and writes nothing', async (body, detail) => {
    const before = await userCount();
    const res = await http().post('/api/users').set('Cookie', admin).send(body);
    expect(res.status).toBe(400);
    expect(res.body.details).toContain(detail);
    expect(await userCount()).toBe(before);
  });

  it('changes a role; the user’s existing sessions end and the next one has the new role', async () => {
    const created = await http().post('/api/users').set('Cookie', admin).send({
      email: 'role-change@larkspur.example',
      displayName: 'Ray Change',
      role: 'sales',
      password: 'a-long-password',
    });
    const cookie = await sessionCookie(app, 'role-change@larkspur.example', 'a-long-password');
    expect((await http().get('/api/users').set('Cookie', cookie)).status).toBe(403);
    const patched = await http()
      .patch(`/api/users/${created.body.id}`)
      .set('Cookie', admin)
      .send({ role: 'admin', version: created.body.version });
    expect(patched.status).toBe(200);
    expect(patched.body.role).toBe('admin');
    expect((await http().get('/api/auth/me').set('Cookie', cookie)).status).toBe(401);
    const next = await sessionCookie(app, 'role-change@larkspur.example', 'a-long-password');
    expect((await http().get('/api/auth/me').set('Cookie', next)).body.user.role).toBe('admin');
  });

  it('deactivating a user ends their session; signing in with the right password says the account is inactive', async () => {
    const created = await http().post('/api/users').set('Cookie', admin).send({
      email: 'leaver@larkspur.example',
      displayName: 'Lee Ver',
      role: 'engineer',
      password: 'a-long-password',
    });
    const cookie = await sessionCookie(app, 'leaver@larkspur.example', 'a-long-password');
    const off = await http()
      .patch(`/api/users/${created.body.id}`)
      .set('Cookie', admin)
      .send({ active: false, version: created.body.version });
    expect(off.status).toBe(200);
    expect(off.body.active).toBe(false);
    expect((await http().get('/api/auth/me').set('Cookie', cookie)).status).toBe(401);
    const again = await http()
      .post('/api/auth/sign-in')
      .send({ email: 'leaver@larkspur.example', password: 'a-long-password' });
    expect(again.status).toBe(403);
    expect(again.body.message).toBe('This account is inactive; ask an admin of your shop to reactivate it.');
    expect(again.headers['set-cookie']).toBeUndefined();
    // A wrong password tells a guesser nothing more than for any other account.
    const guess = await http()
      .post('/api/auth/sign-in')
      .send({ email: 'leaver@larkspur.example', password: 'not-the-password' });
    expect(guess.status).toBe(401);
    expect(guess.body.message).toBe('Wrong e-mail or password.');
  });

  it('an admin cannot demote or deactivate themselves', async () => {
    const me = (await http().get('/api/auth/me').set('Cookie', admin)).body.user;
    const version = await userVersion(app, admin, me.id);
    const demote = await http()
      .patch(`/api/users/${me.id}`)
      .set('Cookie', admin)
      .send({ role: 'sales', version });
    expect(demote.status).toBe(409);
    expect(demote.body.message).toBe('You cannot change your own role; ask another admin');
    const off = await http()
      .patch(`/api/users/${me.id}`)
      .set('Cookie', admin)
      .send({ active: false, version });
    expect(off.status).toBe(409);
    expect(off.body.message).toBe('You cannot deactivate yourself; ask another admin');
    const still = await http().get('/api/auth/me').set('Cookie', admin);
    expect(still.body.user).toMatchObject({ role: 'admin', active: true });
  });

  it('an edit carries the version it was based on: a stale one (e.g. a late Undo) is refused and changes nothing', async () => {
    const created = await http().post('/api/users').set('Cookie', admin).send({
      email: 'versioned@larkspur.example',
      displayName: 'Vera Sion',
      role: 'sales',
      password: 'a-long-password',
    });
    expect(created.body.version).toBe(1);
    const url = `/api/users/${created.body.id}`;
    const noVersion = await http().patch(url).set('Cookie', admin).send({ role: 'engineer' });
    expect(noVersion.status).toBe(400);
    expect(noVersion.body.message).toBe(
      'Invalid input: version: version must be the version number last read',
    );
    // Admin 1 makes the user an engineer; admin 2, who read the same version, renames them.
    const first = await http().patch(url).set('Cookie', admin).send({ role: 'engineer', version: 1 });
    expect(first.status).toBe(200);
    expect(first.body).toMatchObject({ role: 'engineer', version: 2 });
    const stale = await http().patch(url).set('Cookie', admin).send({ displayName: 'Vera Late', version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.message).toBe(
      'Vera Sion was changed by someone else (now version 2); reload the page and apply your change again',
    );
    // Someone renames the account; Undo of the role change, still holding version 2, is refused.
    const renamed = await http()
      .patch(url)
      .set('Cookie', admin)
      .send({ displayName: 'Vera Sionne', version: 2 });
    expect(renamed.body.version).toBe(3);
    const undo = await http().patch(url).set('Cookie', admin).send({ role: 'sales', version: 2 });
    expect(undo.status).toBe(409);
    const now = (await http().get('/api/users').set('Cookie', admin)).body.find(
      (u: { id: number }) => u.id === created.body.id,
    );
    expect(now).toMatchObject({ role: 'engineer', displayName: 'Vera Sionne', version: 3 });
    // Concurrent edits from one version: exactly one applies.
    const racing = await Promise.all(
      ['Vera A', 'Vera B', 'Vera C'].map((displayName) =>
        http().patch(url).set('Cookie', admin).send({ displayName, version: 3 }),
      ),
    );
    expect(racing.map((r) => r.status).sort()).toEqual([200, 409, 409]);
  });

  it('two admins demoting each other at once: one wins, the other is refused, an active admin remains', async () => {
    const db = app.get(DataSource);
    const activeAdmins = async () =>
      Number((await db.query(`SELECT count(*) AS n FROM users WHERE role = 'admin' AND active`))[0].n);
    for (let round = 0; round < 5; round++) {
      const made = [];
      for (const who of ['a', 'b']) {
        const email = `rival-${who}-${round}@larkspur.example`;
        const res = await http()
          .post('/api/users')
          .set('Cookie', admin)
          .send({ email, displayName: `Rival ${who} ${round}`, role: 'admin', password: 'rival-password' });
        expect(res.status).toBe(201);
        made.push({
          id: res.body.id as number,
          cookie: await sessionWithOwnPassword(app, email, 'rival-password'),
        });
      }
      const [a, b] = made;
      const [versionA, versionB] = [
        await userVersion(app, admin, a!.id),
        await userVersion(app, admin, b!.id),
      ];
      const [byA, byB] = await Promise.all([
        http()
          .patch(`/api/users/${b!.id}`)
          .set('Cookie', a!.cookie)
          .send({ role: 'engineer', version: versionB }),
        http()
          .patch(`/api/users/${a!.id}`)
          .set('Cookie', b!.cookie)
          .send({ role: 'engineer', version: versionA }),
      ]);
      // The loser's session ended with its role change (401) or its actor had just lost the role (403).
      expect([byA.status, byB.status].filter((s) => s === 200)).toHaveLength(1);
      const roles = (await db.query('SELECT id, role FROM users WHERE id = ANY($1) ORDER BY id', [
        [a!.id, b!.id],
      ])) as {
        role: string;
      }[];
      expect(roles.map((r) => r.role).sort()).toEqual(['admin', 'engineer']);
    }
    expect(await activeAdmins()).toBeGreaterThanOrEqual(1);
  });

  it('resets a password; 404 for an unknown user; 400 for a non-numeric id', async () => {
    const created = await http().post('/api/users').set('Cookie', admin).send({
      email: 'forgetful@larkspur.example',
      displayName: 'Fay Got',
      role: 'sales',
      password: 'a-long-password',
    });
    const reset = await http()
      .post(`/api/users/${created.body.id}/password`)
      .set('Cookie', admin)
      .send({ newPassword: 'brand-new-password' });
    expect(reset.status).toBe(204);
    await sessionCookie(app, 'forgetful@larkspur.example', 'brand-new-password');
    const missing = await http()
      .patch('/api/users/999999')
      .set('Cookie', admin)
      .send({ displayName: 'Ghost', version: 1 });
    expect(missing.status).toBe(404);
    expect(missing.body.message).toBe('User 999999 does not exist');
    const bad = await http().patch('/api/users/abc').set('Cookie', admin).send({ displayName: 'Ghost' });
    expect(bad.status).toBe(400);
  });
});
