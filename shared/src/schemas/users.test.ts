import { describe, expect, it } from 'vitest';
import { changePasswordSchema, createUserSchema, signInSchema, updateUserSchema } from './users.js';
import { problems } from './__tests__/problems.js';

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
    expect(problems(createUserSchema, { ...user, ...patch })).toEqual([expected]);
  });

  it('signing in needs both fields as text and nothing else', () => {
    expect(problems(signInSchema, { email: '', password: 12 })).toEqual([
      'email: Enter your e-mail address',
      'password: Enter your password',
    ]);
    expect(problems(signInSchema, { email: 'a@b.example', password: 'x', admin: true })).toEqual([
      'Unrecognized key: "admin"',
    ]);
  });

  it('a new password must be long enough; an update leaves out what stays', () => {
    expect(problems(changePasswordSchema, { currentPassword: 'old', newPassword: 'short' })).toEqual([
      'newPassword: At least 10 characters',
    ]);
    expect(updateUserSchema.parse({ active: false, version: 3 })).toEqual({ active: false, version: 3 });
    expect(problems(updateUserSchema, { active: 'no', version: 3 })).toEqual([
      'active: active must be true or false',
    ]);
    // The version the admin saw is required, so a change never overwrites a newer one.
    expect(problems(updateUserSchema, { role: 'sales' })).toEqual([
      'version: version must be the version number last read',
    ]);
    expect(problems(updateUserSchema, { role: 'sales', version: 0 })).toEqual([
      'version: version must be at least 1',
    ]);
  });
});
