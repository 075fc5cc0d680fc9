import bcrypt from 'bcryptjs';

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

let unknownHash: Promise<string> | null = null;

/**
 * A hash of nothing at the same cost as real ones, compared against when the e-mail is unknown so
 * the answer takes as long as for a real account.
 */
export function unknownUserHash(): Promise<string> {
  unknownHash ??= bcrypt.hash('no such user', cost());
  return unknownHash;
}
