import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { DataSource } from 'typeorm';
import type { Role } from '@quietglass/shared';
import { User } from '../users/user.entity.js';
import { hashPassword } from '../users/passwords.js';

/**
 * The demo shop, an invented scenario: Larkspur Thin Film Works, a small coating shop with one
 * admin, two coating engineers, one salesperson and one chamber operator.
 */
export const DEMO_SHOP = 'Larkspur Thin Film Works';

export const DEMO_USERS: readonly { email: string; displayName: string; role: Role }[] = [
  { email: 'elin.voss@larkspur.example', displayName: 'Elin Voss', role: 'admin' },
  { email: 'mira.castell@larkspur.example', displayName: 'Mira Castell', role: 'engineer' },
  { email: 'tomas.reyes@larkspur.example', displayName: 'Tomas Reyes', role: 'engineer' },
  { email: 'priya.nand@larkspur.example', displayName: 'Priya Nand', role: 'sales' },
  { email: 'jonah.pike@larkspur.example', displayName: 'Jonah Pike', role: 'operator' },
];

export interface DemoSignIn {
  email: string;
  role: Role;
  password: string;
}

/**
 * Demo passwords are generated once per installation and kept in `file` (never in the code), so
 * every shop's demo has its own. Returns the sign-ins, creating the file when missing.
 */
export function demoSignIns(file: string): DemoSignIn[] {
  const known: Record<string, string> = fs.existsSync(file)
    ? Object.fromEntries(
        (JSON.parse(fs.readFileSync(file, 'utf8')) as DemoSignIn[]).map((s) => [s.email, s.password]),
      )
    : {};
  const signIns = DEMO_USERS.map((u) => ({
    email: u.email,
    role: u.role,
    password: known[u.email] ?? `${u.role}-${randomBytes(6).toString('base64url')}`,
  }));
  fs.mkdirSync(path.dirname(file), { recursive: true });
  fs.writeFileSync(file, JSON.stringify(signIns, null, 2) + '\n', { mode: 0o600 });
  return signIns;
}

/** Creates the demo users that do not exist yet; leaves existing ones (and changed passwords) alone. */
export async function seedDemo(db: DataSource, signIns: DemoSignIn[]): Promise<number> {
  const repo = db.getRepository(User);
  let created = 0;
  for (const demo of DEMO_USERS) {
    if (await repo.existsBy({ email: demo.email })) continue;
    const password = signIns.find((s) => s.email === demo.email)?.password;
    if (!password) throw new Error(`No demo password for ${demo.email}`);
    await repo.insert({ ...demo, passwordHash: await hashPassword(password), active: true });
    created += 1;
  }
  return created;
}
