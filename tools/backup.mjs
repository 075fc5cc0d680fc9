#!/usr/bin/env node
// `npm run backup [-- FILE]`: the whole database as one pg_dump archive (custom format), by default
// .data/backups/quietglass-YYYYMMDD-HHMMSS.dump. `npm run restore -- FILE`: replaces every table of
// the database with the archive's (pg_restore --clean). Both use Debian's PostgreSQL client
// programs. Without DATABASE_URL they work on the local server of `npm start` (started for the
// moment when it is not running). Stop `npm start` before a restore.
// Plain Node on purpose, like start.mjs.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { ROOT, StartupError, findPostgresBin, log, startPostgres } from './lib/services.mjs';

const argv = process.argv.slice(2);
const restore = argv[0] === '--restore';
const file = restore ? argv[1] : argv[0];

function pgTool(name) {
  const bin = findPostgresBin();
  const candidate = bin ? path.join(bin, name) : name;
  return fs.existsSync(candidate) ? candidate : name;
}

/** Connection without the password in the command line (it goes through PGPASSWORD). */
function connection(url) {
  const u = new URL(url);
  const password = decodeURIComponent(u.password);
  u.password = '';
  return { url: u.toString(), env: { ...process.env, PGPASSWORD: password } };
}

function stamp() {
  const d = new Date();
  const p = (n) => String(n).padStart(2, '0');
  return `${d.getUTCFullYear()}${p(d.getUTCMonth() + 1)}${p(d.getUTCDate())}-${p(d.getUTCHours())}${p(d.getUTCMinutes())}${p(d.getUTCSeconds())}`;
}

async function main() {
  if (restore && !file) throw new StartupError('Say which archive to restore: npm run restore -- FILE');
  if (restore && !fs.existsSync(file)) throw new StartupError(`No such backup file: ${file}`);
  let databaseUrl = process.env.DATABASE_URL;
  let stopAfter = null;
  if (!databaseUrl) {
    const dataDir = path.resolve(process.env.QG_DATA_DIR ?? path.join(ROOT, '.data'));
    const pg = await startPostgres({
      dir: path.join(dataDir, 'postgres'),
      port: Number(process.env.QG_PG_PORT ?? 5433),
      database: 'quietglass',
    });
    databaseUrl = pg.url;
    if (pg.startedHere) stopAfter = () => pg.stop();
  }
  const { url, env } = connection(databaseUrl);
  try {
    if (restore) {
      log(`restoring ${file} (every table is replaced)…`);
      const res = spawnSync(
        pgTool('pg_restore'),
        [
          '--clean',
          '--if-exists',
          '--no-owner',
          '--no-privileges',
          '--single-transaction',
          '--exit-on-error',
          '-d',
          url,
          file,
        ],
        { env, stdio: ['ignore', 'inherit', 'inherit'] },
      );
      if (res.status !== 0)
        throw new StartupError(`pg_restore failed (exit ${res.status}); the database is unchanged`);
      log(`restored ${file}`);
    } else {
      const out = path.resolve(file ?? path.join(ROOT, '.data', 'backups', `quietglass-${stamp()}.dump`));
      fs.mkdirSync(path.dirname(out), { recursive: true });
      const res = spawnSync(
        pgTool('pg_dump'),
        ['--format=custom', '--compress=1', '--no-owner', '--file', out, url],
        {
          env,
          stdio: ['ignore', 'inherit', 'inherit'],
        },
      );
      if (res.status !== 0) {
        fs.rmSync(out, { force: true });
        throw new StartupError(`pg_dump failed (exit ${res.status}); no backup was written`);
      }
      log(`backup written: ${out} (${(fs.statSync(out).size / 1024).toFixed(0)} KiB)`);
    }
  } finally {
    stopAfter?.();
  }
}

main().catch((err) => {
  process.stderr.write(`[quietglass] ${err instanceof StartupError ? err.message : (err?.stack ?? err)}\n`);
  process.exit(1);
});
