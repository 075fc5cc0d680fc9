import { spawn } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { Controller, Get, Inject, Logger, ServiceUnavailableException, StreamableFile } from '@nestjs/common';
import { Roles } from '../auth/roles.decorator.js';
import { CurrentUser } from '../auth/current-user.decorator.js';
import { appConfig, type AppConfig } from '../config/configuration.js';
import type { User } from '../users/user.entity.js';

/** pg_dump from Debian's PostgreSQL packages (the newest under /usr/lib/postgresql), else from PATH. */
export function pgDumpPath(): string {
  const base = '/usr/lib/postgresql';
  if (fs.existsSync(base)) {
    const found = fs
      .readdirSync(base)
      .sort((a, b) => Number(b) - Number(a))
      .map((v) => path.join(base, v, 'bin', 'pg_dump'))
      .find((p) => fs.existsSync(p));
    if (found) return found;
  }
  return 'pg_dump';
}

/** Admins download the whole database as a pg_dump archive, the same as `npm run backup` writes. */
@Controller('backup')
@Roles('admin')
export class BackupsController {
  private readonly logger = new Logger('Backup');

  constructor(@Inject(appConfig.KEY) private readonly config: AppConfig) {}

  /** Streamed from pg_dump (custom format; restore with `npm run restore -- FILE`). */
  @Get()
  download(@CurrentUser() user: User): StreamableFile {
    const u = new URL(this.config.databaseUrl);
    const password = decodeURIComponent(u.password);
    u.password = '';
    const child = spawn(pgDumpPath(), ['--format=custom', '--compress=1', '--no-owner', u.toString()], {
      env: { ...process.env, PGPASSWORD: password },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    if (!child.stdout) throw new ServiceUnavailableException('pg_dump could not be started');
    let stderr = '';
    child.stderr?.on('data', (c: Buffer) => (stderr += c.toString()));
    child.once('error', (err) => {
      this.logger.error(`pg_dump could not run: ${err.message}`);
      child.stdout?.destroy(err);
    });
    child.once('exit', (code) => {
      if (code !== 0) {
        this.logger.error(`pg_dump failed (exit ${code}): ${stderr.trim()}`);
        child.stdout?.destroy(new Error('pg_dump failed'));
      }
    });
    const stamp = new Date().toISOString().replace(/[-:]/g, '').replace('T', '-').slice(0, 15);
    this.logger.log(`backup downloaded by user ${user.id} (${user.email})`);
    return new StreamableFile(child.stdout, {
      type: 'application/octet-stream',
      disposition: `attachment; filename="quietglass-${stamp}.dump"`,
    });
  }
}
