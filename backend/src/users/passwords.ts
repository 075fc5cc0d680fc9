import bcrypt from 'bcryptjs';

/** Minimum length of a new password; mirrored by the client's forms. */
export const MIN_PASSWORD_LENGTH = 10;

function cost(): number {
  const raw = Number(process.env.BCRYPT_COST ?? 11);
  return Number.isInteger(raw) && raw >= 4 && raw <= 15 ? raw : 11;
}

export function hashPassword(plain: string): Promise<string> {
  return bcrypt.hash(plain, cost());
}

export function verifyPassword(plain: string, hash: string): Promise<boolean> {
  return bcrypt.compare(plain, hash);
}

/** A hash of nothing, compared against when the e-mail is unknown so timing does not tell. */
export const UNKNOWN_USER_HASH = bcrypt.hashSync('no such user', 4);
