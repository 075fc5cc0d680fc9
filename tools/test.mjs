#!/usr/bin/env node
// `npm test`: every check of the project in one run, on real PostgreSQL and Redis started here
// (separate test data folder and ports), then stopped again.
//   npm test                      everything
//   npm test -- --only backend    one or more stages (comma-separated): static, shared, tools,
//                                 backend, frontend, browser
// Plain Node on purpose: it runs before npm dependencies are installed.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import {
  ROOT,
  StartupError,
  ensureNpmDependencies,
  ensureSystemPackages,
  log,
  readOrCreateSecret,
  runStep,
  spawnService,
  startPostgres,
  startRedis,
  waitFor,
} from './lib/services.mjs';

const STAGES = ['static', 'shared', 'tools', 'backend', 'frontend', 'browser'];
const onlyIdx = process.argv.indexOf('--only');
const only = onlyIdx >= 0 ? (process.argv[onlyIdx + 1] ?? '').split(',').filter(Boolean) : STAGES;
for (const s of only)
  if (!STAGES.includes(s)) throw new StartupError(`unknown stage "${s}"; stages: ${STAGES.join(', ')}`);

// `--filter PATTERN[,PATTERN…]` narrows the vitest runs to matching test files (handy while working on one).
const filterIdx = process.argv.indexOf('--filter');
// Several patterns may be given comma-separated (`--filter health,roles`).
const filter =
  filterIdx >= 0
    ? ['--passWithNoTests', ...(process.argv[filterIdx + 1] ?? '').split(',').filter(Boolean)]
    : [];
const results = [];
const stoppers = [];
const children = [];

function intEnv(name, fallback) {
  const raw = process.env[name];
  return raw ? Number(raw) : fallback;
}

/** Runs one step to completion; records pass/fail and carries on, so one run reports every failure. */
function step(name, cmd, args, opts = {}) {
  return new Promise((resolve) => {
    log(`▶ ${name}`);
    const started = Date.now();
    const child = spawn(cmd, args, { cwd: ROOT, stdio: 'inherit', ...opts });
    child.once('exit', (code, signal) => {
      const ok = code === 0;
      const secs = ((Date.now() - started) / 1000).toFixed(1);
      results.push({ name, ok, secs });
      log(`${ok ? '✔' : '✘'} ${name} (${secs} s${ok ? '' : `, ${signal ?? `exit ${code}`}`})`);
      resolve(ok);
    });
  });
}

function stopAll() {
  for (const child of children) if (child.exitCode === null) child.kill('SIGTERM');
  for (const stop of stoppers.reverse()) stop();
}

async function main() {
  ensureNpmDependencies();
  const needsServices = only.some((s) => s === 'backend' || s === 'browser');
  ensureSystemPackages([
    ...(needsServices ? ['postgres', 'redis'] : []),
    ...(only.includes('browser') ? ['chromium'] : []),
    ...(only.includes('backend') ? ['poppler'] : []),
  ]);
  const dataDir = path.resolve(process.env.QG_TEST_DATA_DIR ?? path.join(ROOT, '.data', 'test'));
  fs.mkdirSync(dataDir, { recursive: true });

  runStep('building the optics engine (shared)…', 'npm', ['run', 'build', '-w', 'shared', '--silent']);

  if (only.includes('static')) {
    await step('type-check (all workspaces)', 'npm', ['run', 'typecheck', '--silent']);
    await step('lint (ESLint)', 'npx', ['eslint', '.', '--max-warnings', '0']);
    await step('format (Prettier)', 'npx', ['prettier', '--check', '.', '--log-level', 'warn']);
  }
  if (only.includes('shared'))
    await step('shared: optics engine tests', 'npx', ['vitest', 'run'], { cwd: path.join(ROOT, 'shared') });
  if (only.includes('tools'))
    await step('tools: CLI tests', 'npx', ['vitest', 'run'], { cwd: path.join(ROOT, 'tools') });
  if (only.includes('frontend')) {
    await step('frontend: component tests', 'npx', ['vitest', 'run'], { cwd: path.join(ROOT, 'frontend') });
  }

  let env = { ...process.env };
  if (needsServices) {
    const pg = await startPostgres({
      dir: path.join(dataDir, 'postgres'),
      port: intEnv('QG_TEST_PG_PORT', 5434),
      database: 'quietglass_test',
    });
    stoppers.push(() => pg.stop());
    pg.resetDatabase();
    const redis = await startRedis({
      dir: path.join(dataDir, 'redis'),
      port: intEnv('QG_TEST_REDIS_PORT', 6381),
      persistent: false,
    });
    stoppers.push(() => redis.stop());
    env = {
      ...env,
      NODE_ENV: 'test',
      DATABASE_URL: pg.url,
      REDIS_URL: redis.url,
      JWT_SECRET: readOrCreateSecret(path.join(dataDir, 'jwt-secret'), 48),
      QG_DEMO_CREDENTIALS: path.join(dataDir, 'demo-sign-ins.json'),
      BCRYPT_COST: '4',
      SIGNIN_LIMIT: '10',
      WORKER_PING_TIMEOUT_MS: '1500',
      QG_HEALTH_INTERVAL_MS: '1000',
      // The suites share demo users and leave jobs queued; budgets.e2e-spec checks the real limit.
      QG_MAX_ACTIVE_JOBS: '1000',
      // The fault drill stops and restarts this PostgreSQL (see backend/test/fault-drill.e2e-spec.ts).
      QG_TEST_PG_DIR: path.join(dataDir, 'postgres'),
      QG_TEST_PG_PORT: String(intEnv('QG_TEST_PG_PORT', 5434)),
      QG_TEST_PORT: String(intEnv('QG_TEST_PORT', 3100)),
    };
  }
  const backendDir = path.join(ROOT, 'backend');
  if (only.includes('backend')) {
    // The e2e tests start the real worker process from the build.
    runStep('building the API and worker (backend)…', 'npm', ['run', 'build', '-w', 'backend', '--silent']);
    await step('backend: unit tests', 'npx', ['vitest', 'run', ...filter], { cwd: backendDir, env });
    await step(
      'backend: e2e tests (PostgreSQL + Redis)',
      'npx',
      ['vitest', 'run', '-c', 'vitest.e2e.config.ts', ...filter],
      {
        cwd: backendDir,
        env,
      },
    );
  }
  if (only.includes('browser')) {
    runStep('building the API, worker and client for the browser tests…', 'npm', [
      'run',
      'build',
      '-w',
      'backend',
      '--silent',
    ]);
    runStep('', 'npm', ['run', 'build', '-w', 'frontend', '--silent']);
    const port = intEnv('QG_TEST_PORT', 3100);
    // Browser tests run on their own fresh database.
    const pg = await startPostgres({
      dir: path.join(dataDir, 'postgres'),
      port: intEnv('QG_TEST_PG_PORT', 5434),
      database: 'quietglass_browser',
    });
    pg.resetDatabase();
    // Jobs the backend tests left in Redis belong to another database: start the queue empty too.
    runStep('emptying the test Redis…', 'redis-cli', ['-u', env.REDIS_URL, 'flushall']);
    const browserEnv = {
      ...env,
      DATABASE_URL: pg.url,
      PORT: String(port),
      CLIENT_DIST: path.join(ROOT, 'frontend', 'dist'),
      // Every browser test signs the same demo users in from 127.0.0.1, dozens of times a minute;
      // the sign-in limits themselves are checked by the backend e2e tests (auth, security).
      SIGNIN_LIMIT: '1000',
    };
    runStep(
      'migrating and seeding the browser-test database…',
      'node',
      ['backend/dist/database/migrate.js', '--seed', env.QG_DEMO_CREDENTIALS],
      { env: browserEnv },
    );
    children.push(spawnService('api', 'node', ['backend/dist/main.js'], { env: browserEnv }));
    children.push(spawnService('worker', 'node', ['backend/dist/worker/main.js'], { env: browserEnv }));
    await waitFor(
      async () => {
        try {
          const res = await fetch(`http://127.0.0.1:${port}/api/health`);
          return res.ok && (await res.json()).status === 'ok';
        } catch {
          return false;
        }
      },
      'the test API and worker',
      60_000,
    );
    await step(
      'browser: end-to-end tests (Chromium)',
      'npx',
      ['vitest', 'run', '-c', 'vitest.browser.config.ts', ...filter],
      {
        cwd: path.join(ROOT, 'tools'),
        env: { ...browserEnv, QG_BASE_URL: `http://127.0.0.1:${port}` },
      },
    );
  }
}

let exitCode = 0;
try {
  await main();
} catch (err) {
  process.stderr.write(`\n[quietglass] ${err instanceof StartupError ? err.message : (err?.stack ?? err)}\n`);
  exitCode = 1;
} finally {
  stopAll();
}
const failed = results.filter((r) => !r.ok);
process.stdout.write('\nQuietglass test summary\n');
for (const r of results) process.stdout.write(`  ${r.ok ? 'pass' : 'FAIL'}  ${r.name} (${r.secs} s)\n`);
process.stdout.write(`stages: ${results.length - failed.length} passed, ${failed.length} failed\n`);
if (failed.length > 0 || results.length === 0) exitCode = 1;
process.exit(exitCode);
