#!/usr/bin/env node
// `npm start`: installs what is missing, starts PostgreSQL and Redis on 127.0.0.1 in .data/,
// migrates and seeds the demo shop, builds and starts the API, the worker and the client.
// `npm run dev`: the same, with Vite's dev server for the client.
// It supervises what it started: a crashed API, worker or client is restarted with growing delays
// (1, 2, 4 … 30 s; back to 1 s once a process has run a minute), and SIGINT or SIGTERM stops
// everything. The API and worker also stop by themselves when this process dies (see
// spawnService's `tied`), so none is left behind as an orphan.
//   --keep-services  leave PostgreSQL and Redis running on exit
//   --no-build       use the existing builds (serves the client only when frontend/dist exists)
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
const noBuild = args.has('--no-build');

function intEnv(name, fallback) {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const n = Number(raw);
  if (!Number.isInteger(n) || n <= 0 || n > 65535)
    throw new StartupError(`${name} must be a port number, got "${raw}"`);
  return n;
}

/** Supervised processes by name: the running child and a pending restart. */
const services = new Map();
const stoppers = [];
let shuttingDown = false;

function delayEnv(name, fallback) {
  const n = Number(process.env[name]);
  return Number.isFinite(n) && n > 0 ? n : fallback;
}
const RESTART_BASE_MS = delayEnv('QG_RESTART_DELAY_MS', 1000);
const RESTART_MAX_MS = 30_000;
const STABLE_MS = 60_000;

/** Starts a process and restarts it with exponential backoff whenever it stops on its own. */
function supervise(name, cmd, cmdArgs, opts) {
  const state = { child: null, timer: null, restarts: 0 };
  services.set(name, state);
  const launch = () => {
    state.timer = null;
    const startedAt = Date.now();
    const child = spawnService(name, cmd, cmdArgs, opts);
    state.child = child;
    if (state.restarts > 0) child.once('spawn', () => log(`${name} restarted (pid ${child.pid})`));
    child.once('exit', (code, signal) => {
      if (shuttingDown) return;
      if (Date.now() - startedAt > STABLE_MS) state.restarts = 0;
      const delay = Math.min(RESTART_MAX_MS, RESTART_BASE_MS * 2 ** state.restarts);
      state.restarts++;
      log(
        `${name} stopped unexpectedly (${signal ?? `exit ${code}`}); restarting it in ${(delay / 1000).toFixed(1)} s (restart ${state.restarts})`,
      );
      state.timer = setTimeout(launch, delay);
    });
  };
  launch();
}

async function shutdown(code) {
  if (shuttingDown) return;
  shuttingDown = true;
  log('stopping…');
  await Promise.all(
    [...services.values()].map(
      (state) =>
        new Promise((resolve) => {
          if (state.timer) clearTimeout(state.timer);
          const child = state.child;
          if (!child || child.exitCode !== null || child.signalCode !== null) return resolve();
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
  log('stopped');
  process.exit(code);
}

async function main() {
  const [major, minor] = process.versions.node.split('.').map(Number);
  if (major < 20 || (major === 20 && minor < 19)) {
    throw new StartupError(`Node.js 20.19 or newer is needed; this is ${process.versions.node}`);
  }
  process.on('SIGINT', () => void shutdown(0));
  process.on('SIGTERM', () => void shutdown(0));
  process.on('SIGHUP', () => void shutdown(0));
  // Whoever started us (npm, a shell) went away without passing a signal on: stop too.
  const parent = process.ppid;
  setInterval(() => {
    if (process.ppid !== parent) void shutdown(0);
  }, 1000).unref();

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

  if (!noBuild) {
    runStep('building the optics engine (shared)…', 'npm', ['run', 'build', '-w', 'shared', '--silent']);
    runStep('building the API and worker (backend)…', 'npm', ['run', 'build', '-w', 'backend', '--silent']);
    if (!dev)
      runStep('building the client (frontend)…', 'npm', ['run', 'build', '-w', 'frontend', '--silent']);
  }
  const credentialsFile = path.join(dataDir, 'demo-sign-ins.json');
  runStep(
    'migrating the database and seeding the demo shop…',
    'node',
    ['backend/dist/database/migrate.js', '--seed', credentialsFile],
    { env },
  );

  const clientDist = path.join(ROOT, 'frontend', 'dist');
  const serveClient = !dev && (!noBuild || fs.existsSync(path.join(clientDist, 'index.html')));
  const apiEnv = serveClient ? { ...env, CLIENT_DIST: clientDist } : env;
  supervise('api', 'node', ['backend/dist/main.js'], { env: apiEnv, tied: true });
  supervise('worker', 'node', ['backend/dist/worker/main.js'], { env, tied: true });
  let clientUrl = `http://127.0.0.1:${port}/`;
  if (dev) {
    const vitePort = intEnv('QG_VITE_PORT', 5173);
    supervise('client', 'npx', ['vite', '--port', String(vitePort), '--strictPort', '--host', '127.0.0.1'], {
      env: { ...env, QG_API_PORT: String(port) },
      cwd: path.join(ROOT, 'frontend'),
    });
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
