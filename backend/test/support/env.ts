import fs from 'node:fs';
import type { DemoSignIn } from '../../src/database/demo-seed.js';

/** The e2e environment that `npm test` prepares: real PostgreSQL and Redis, seeded demo users. */
export function requireE2eEnv(): { databaseUrl: string; redisUrl: string; credentialsFile: string } {
  const databaseUrl = process.env.DATABASE_URL;
  const redisUrl = process.env.REDIS_URL;
  const credentialsFile = process.env.QG_DEMO_CREDENTIALS;
  if (!databaseUrl || !redisUrl || !credentialsFile || !process.env.JWT_SECRET) {
    throw new Error(
      'e2e tests need DATABASE_URL, REDIS_URL, JWT_SECRET and QG_DEMO_CREDENTIALS; run them through `npm test`',
    );
  }
  return { databaseUrl, redisUrl, credentialsFile };
}

export function demoSignIn(role: DemoSignIn['role'], index = 0): DemoSignIn {
  const all = JSON.parse(fs.readFileSync(requireE2eEnv().credentialsFile, 'utf8')) as DemoSignIn[];
  const match = all.filter((s) => s.role === role)[index];
  if (!match) throw new Error(`no demo user number ${index} with role ${role}`);
  return match;
}
