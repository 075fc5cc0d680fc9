import type { RegisterOptions } from 'react-hook-form';

/** Password length limits of the API's DTOs. */
export const MIN_PASSWORD_LENGTH = 10;
export const MAX_PASSWORD_LENGTH = 200;
export const MAX_EMAIL_LENGTH = 254;
export const MAX_DISPLAY_NAME_LENGTH = 120;

/** One @, no spaces, a dot in the domain: close to what the API's e-mail check accepts. */
const EMAIL_PATTERN = /^[^\s@]+@[^\s@]+\.[^\s@.]{2,}$/;

export const emailRules = {
  required: 'Enter an e-mail address',
  maxLength: { value: MAX_EMAIL_LENGTH, message: `At most ${MAX_EMAIL_LENGTH} characters` },
  validate: (value: string) => EMAIL_PATTERN.test(value.trim()) || 'Enter a valid e-mail address',
} satisfies RegisterOptions<Record<string, string>, string>;

/** Rules for a password being set (new, initial or reset). */
export const newPasswordRules = {
  required: 'Enter a password',
  minLength: { value: MIN_PASSWORD_LENGTH, message: `At least ${MIN_PASSWORD_LENGTH} characters` },
  maxLength: { value: MAX_PASSWORD_LENGTH, message: `At most ${MAX_PASSWORD_LENGTH} characters` },
} satisfies RegisterOptions<Record<string, string>, string>;

export const displayNameRules = {
  validate: (value: string) => value.trim() !== '' || 'Enter a display name',
  maxLength: { value: MAX_DISPLAY_NAME_LENGTH, message: `At most ${MAX_DISPLAY_NAME_LENGTH} characters` },
} satisfies RegisterOptions<Record<string, string>, string>;
