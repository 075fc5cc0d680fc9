import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { issueLines } from './common.js';
import { changePasswordSchema, createUserSchema, signInSchema, updateUserSchema } from './users.js';

const lines = (schema: z.ZodType, body: unknown) => {
  const parsed = schema.safeParse(body);
  return parsed.success ? [] : issueLines(parsed.error);
};

const user = {
  email: ' New.Operator@Larkspur.example ',
  displayName: ' Noor ',
  role: 'operator',
  password: 'long-enough-pw',
};

describe('account schemas', () => {
  it('trims and lower-cases the e-mail and trims the name', () => {
    expect(createUserSchema.parse(user)).toEqual({
      email: 'new.operator@larkspur.example',
      displayName: 'Noor',
      role: 'operator',
      password: 'long-enough-pw',
    });
  });

  it.each([
    [{ email: 'not-an-email' }, 'email: Enter a valid e-mail address'],
    [{ email: '  ' }, 'email: Enter an e-mail address'],
    [{ email: `${'a'.repeat(250)}@b.example` }, 'email: At most 254 characters'],
    [{ role: 'wizard' }, 'role: Choose a role: admin, engineer, sales, operator'],
    [{ password: 'short' }, 'password: At least 10 characters'],
    [{ password: '' }, 'password: Enter a password'],
    [{ password: 'x'.repeat(201) }, 'password: At most 200 characters'],
    [{ displayName: '   ' }, 'displayName: Enter a display name'],
  ])('refuses a new user with %j', (patch, expected) => {
    expect(lines(createUserSchema, { ...user, ...patch })).toEqual([expected]);
  });

  it('signing in needs both fields as text and nothing else', () => {
    expect(lines(signInSchema, { email: '', password: 12 })).toEqual([
      'email: Enter your e-mail address',
      'password: Enter your password',
    ]);
    expect(lines(signInSchema, { email: 'a@b.example', password: 'x', admin: true })).toEqual([
      'Unrecognized key: "admin"',
    ]);
  });

  it('a new password must be long enough; an update leaves out what stays', () => {
    expect(lines(changePasswordSchema, { currentPassword: 'old', newPassword: 'short' })).toEqual([
      'newPassword: At least 10 characters',
    ]);
    expect(updateUserSchema.parse({ active: false, version: 3 })).toEqual({ active: false, version: 3 });
    expect(lines(updateUserSchema, { active: 'no', version: 3 })).toEqual([
      'active: active must be true or false',
    ]);
    // The version the admin saw is required, so a change never overwrites a newer one.
    expect(lines(updateUserSchema, { role: 'sales' })).toEqual([
      'version: version must be the version number last read',
    ]);
    expect(lines(updateUserSchema, { role: 'sales', version: 0 })).toEqual([
      'version: version must be at least 1',
    ]);
  });
});
