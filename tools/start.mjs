#!/usr/bin/env node
// `npm start`: installs what is missing, starts PostgreSQL and Redis on 127.0.0.1 in .data/,
// migrates and seeds the demo shop, builds and starts the API, the worker and the client.
// `npm run dev`: the same, with Vite's dev server for the client.
// Plain Node on purpose: it runs before npm dependencies are installed.
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

const args = new Set(process.argv.slice(2));
const dev = args.has('--dev');
const keepServices = args.has('--keep-services');

function intEnv(name, fallback) {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const n = Number(raw);
  if (!Number.isInteger(n) || n <= 0 || n > 65535)
    throw new StartupError(`${name} must be a port number, got "${raw}"`);
  return n;
}

const children = [];
const stoppers = [];
let shuttingDown = false;

async function shutdown(code) {
  if (shuttingDown) return;
  shuttingDown = true;
  log('stopping…');
  await Promise.all(
    children.map(
      (child) =>
        new Promise((resolve) => {
          if (child.exitCode !== null || child.signalCode !== null) return resolve();
          const timer = setTimeout(() => child.kill('SIGKILL'), 10_000);
          child.once('exit', () => {
            clearTimeout(timer);
            resolve();
          });
          child.kill('SIGTERM');
        }),
    ),
  );
  if (!keepServices) for (const stop of stoppers.reverse()) stop();
  process.exit(code);
}

async function main() {
  const [major, minor] = process.versions.node.split('.').map(Number);
  if (major < 20 || (major === 20 && minor < 19)) {
    throw new StartupError(`Node.js 20.19 or newer is needed; this is ${process.versions.node}`);
  }
  process.on('SIGINT', () => void shutdown(0));
  process.on('SIGTERM', () => void shutdown(0));

  ensureNpmDependencies();
  const dataDir = path.resolve(process.env.QG_DATA_DIR ?? path.join(ROOT, '.data'));
  fs.mkdirSync(dataDir, { recursive: true });

  const needs = [];
  if (!process.env.DATABASE_URL) needs.push('postgres');
  if (!process.env.REDIS_URL) needs.push('redis');
  ensureSystemPackages(needs);

  let databaseUrl = process.env.DATABASE_URL;
  if (!databaseUrl) {
    const pg = await startPostgres({
      dir: path.join(dataDir, 'postgres'),
      port: intEnv('QG_PG_PORT', 5433),
      database: 'quietglass',
    });
    stoppers.push(() => pg.stop());
    databaseUrl = pg.url;
  }
  let redisUrl = process.env.REDIS_URL;
  if (!redisUrl) {
    const redis = await startRedis({
      dir: path.join(dataDir, 'redis'),
      port: intEnv('QG_REDIS_PORT', 6380),
      persistent: true,
    });
    stoppers.push(() => redis.stop());
    redisUrl = redis.url;
  }

  const port = intEnv('PORT', 3000);
  const env = {
    ...process.env,
    NODE_ENV: process.env.NODE_ENV ?? 'production',
    DATABASE_URL: databaseUrl,
    REDIS_URL: redisUrl,
    PORT: String(port),
    JWT_SECRET: process.env.JWT_SECRET ?? readOrCreateSecret(path.join(dataDir, 'jwt-secret'), 48),
  };

  runStep('building the optics engine (shared)…', 'npm', ['run', 'build', '-w', 'shared', '--silent']);
  runStep('building the API and worker (backend)…', 'npm', ['run', 'build', '-w', 'backend', '--silent']);
  if (!dev) runStep('building the client (frontend)…', 'npm', ['run', 'build', '-w', 'frontend', '--silent']);
  const credentialsFile = path.join(dataDir, 'demo-sign-ins.json');
  runStep(
    'migrating the database and seeding the demo shop…',
    'node',
    ['backend/dist/database/migrate.js', '--seed', credentialsFile],
    { env },
  );

  const apiEnv = dev ? env : { ...env, CLIENT_DIST: path.join(ROOT, 'frontend', 'dist') };
  const watch = (name, child) => {
    children.push(child);
    child.once('exit', (code, signal) => {
      if (shuttingDown) return;
      log(`${name} stopped unexpectedly (${signal ?? `exit ${code}`}); stopping the rest`);
      void shutdown(1);
    });
  };
  watch('api', spawnService('api', 'node', ['backend/dist/main.js'], { env: apiEnv }));
  watch('worker', spawnService('worker', 'node', ['backend/dist/worker/main.js'], { env }));
  let clientUrl = `http://127.0.0.1:${port}/`;
  if (dev) {
    const vitePort = intEnv('QG_VITE_PORT', 5173);
    watch(
      'client',
      spawnService(
        'client',
        'npx',
        ['vite', '--port', String(vitePort), '--strictPort', '--host', '127.0.0.1'],
        {
          env: { ...env, QG_API_PORT: String(port) },
          cwd: path.join(ROOT, 'frontend'),
        },
      ),
    );
    clientUrl = `http://127.0.0.1:${vitePort}/`;
  }

  await waitFor(
    async () => {
      try {
        const res = await fetch(`http://127.0.0.1:${port}/api/health`);
        if (!res.ok) return false;
        const body = await res.json();
        return body.status === 'ok';
      } catch {
        return false;
      }
    },
    'the API and worker (GET /api/health)',
    60_000,
  );

  const signIns = JSON.parse(fs.readFileSync(credentialsFile, 'utf8'));
  const lines = [
    '',
    `Quietglass is up: ${clientUrl}`,
    `  API ${`http://127.0.0.1:${port}/api`} · health ${`http://127.0.0.1:${port}/api/health`}`,
    '',
    'Demo sign-ins (Larkspur Thin Film Works, an invented shop; passwords generated for this install,',
    `kept in ${path.relative(ROOT, credentialsFile)}):`,
    ...signIns.map((s) => `  ${s.role.padEnd(9)} ${s.email.padEnd(32)} ${s.password}`),
    '',
    'Press Ctrl-C to stop.',
    '',
  ];
  process.stdout.write(lines.join('\n') + '\n');
}

main().catch((err) => {
  process.stderr.write(`\n[quietglass] ${err instanceof StartupError ? err.message : (err?.stack ?? err)}\n`);
  void shutdown(1);
});
