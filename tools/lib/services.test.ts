import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { StartupError, startPostgres } from './services.mjs';

const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;

describe('the PostgreSQL data folder', () => {
  // As root, PostgreSQL runs as the postgres system user, which must be able to enter the folder.
  it.runIf(isRoot)('is refused with a message naming the blocking folder, and nothing is moved', async () => {
    const closed = fs.mkdtempSync(path.join(os.tmpdir(), 'qg-closed-'));
    fs.chmodSync(closed, 0o700);
    const tmpBefore = fs.readdirSync(os.tmpdir()).filter((n) => n.startsWith('quietglass-pg-'));
    try {
      const started = startPostgres({ dir: path.join(closed, 'postgres'), port: 1, database: 'none' });
      await expect(started).rejects.toBeInstanceOf(StartupError);
      await expect(started).rejects.toThrow(
        `The postgres system user cannot use the data folder ${path.join(closed, 'postgres')}: it cannot enter ${closed}. Allow it (chmod o+x ${closed})`,
      );
      // No database folder was made anywhere else.
      expect(fs.readdirSync(os.tmpdir()).filter((n) => n.startsWith('quietglass-pg-'))).toEqual(tmpBefore);
      expect(fs.existsSync(path.join(closed, 'postgres', 'pgdata'))).toBe(false);
    } finally {
      fs.rmSync(closed, { recursive: true, force: true });
    }
  });
});
