/*
 * Accounts: what the API accepts for signing in, users and passwords, and what the client's forms
 * check field by field before sending. The password and e-mail rules are written here once.
 */
import { z } from 'zod';
import { ROLES } from '../roles.js';
import { versionToken } from './common.js';

export const MIN_PASSWORD_LENGTH = 10;
export const MAX_PASSWORD_LENGTH = 200;
export const MAX_EMAIL_LENGTH = 254;
export const MAX_DISPLAY_NAME_LENGTH = 120;

/** An e-mail address, trimmed and lower-cased (accounts are found by it). */
export const emailField = z
  .string({ error: 'Enter an e-mail address' })
  .trim()
  .toLowerCase()
  .min(1, { error: 'Enter an e-mail address', abort: true })
  .max(MAX_EMAIL_LENGTH, { error: `At most ${MAX_EMAIL_LENGTH} characters`, abort: true })
  .pipe(z.email({ error: 'Enter a valid e-mail address' }));

/** A password being set (own, initial or reset). */
export const newPasswordField = z
  .string({ error: 'Enter a password' })
  .min(1, { error: 'Enter a password', abort: true })
  .min(MIN_PASSWORD_LENGTH, { error: `At least ${MIN_PASSWORD_LENGTH} characters` })
  .max(MAX_PASSWORD_LENGTH, { error: `At most ${MAX_PASSWORD_LENGTH} characters` });

export const displayNameField = z
  .string({ error: 'Enter a display name' })
  .trim()
  .min(1, { error: 'Enter a display name' })
  .max(MAX_DISPLAY_NAME_LENGTH, { error: `At most ${MAX_DISPLAY_NAME_LENGTH} characters` });

export const roleField = z.enum(ROLES, { error: `Choose a role: ${ROLES.join(', ')}` });

/** Signing in checks nothing but presence: the password decides. */
export const signInSchema = z.strictObject({
  email: z
    .string({ error: 'Enter your e-mail address' })
    .min(1, { error: 'Enter your e-mail address' })
    .max(MAX_EMAIL_LENGTH, { error: `At most ${MAX_EMAIL_LENGTH} characters` }),
  password: z
    .string({ error: 'Enter your password' })
    .min(1, { error: 'Enter your password' })
    .max(MAX_PASSWORD_LENGTH, { error: `At most ${MAX_PASSWORD_LENGTH} characters` }),
});
export type SignInInput = z.output<typeof signInSchema>;

export const changePasswordSchema = z.strictObject({
  currentPassword: signInSchema.shape.password,
  newPassword: newPasswordField,
});
export type ChangePasswordInput = z.output<typeof changePasswordSchema>;

/** An administrator sets or resets another user's password. */
export const setPasswordSchema = z.strictObject({ newPassword: newPasswordField });
export type SetPasswordInput = z.output<typeof setPasswordSchema>;

export const createUserSchema = z.strictObject({
  email: emailField,
  displayName: displayNameField,
  role: roleField,
  password: newPasswordField,
});
export type CreateUserInput = z.output<typeof createUserSchema>;

/**
 * Any of a user's name, role and active flag (what is left out stays), with the version of the
 * account the admin saw, so a change (or an Undo) never overwrites another admin's newer one.
 */
export const updateUserSchema = z.strictObject({
  displayName: displayNameField.optional(),
  role: roleField.optional(),
  active: z.boolean({ error: 'active must be true or false' }).optional(),
  version: versionToken,
});
export type UpdateUserInput = z.output<typeof updateUserSchema>;
