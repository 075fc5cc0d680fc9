import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const BACKEND = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

export interface WorkerProcess {
  child: ChildProcess;
  /** host:pid, as the worker records it on the calculations it runs. */
  id: string;
  /** Everything the worker has printed so far. */
  output(): string;
  stop(signal?: NodeJS.Signals): Promise<void>;
}

/**
 * Starts the real worker process (backend/dist/worker/main.js, built by `npm test`) and waits until
 * it is consuming the compute queue. Short lock and stalled-check times make a killed worker's job
 * come back within seconds.
 */
export async function startWorkerProcess(extraEnv: Record<string, string> = {}): Promise<WorkerProcess> {
  const child = spawn(process.execPath, [path.join(BACKEND, 'dist', 'worker', 'main.js')], {
    cwd: BACKEND,
    env: {
      ...process.env,
      QG_JOB_LOCK_MS: '3000',
      QG_STALLED_INTERVAL_MS: '1500',
      QG_COMPUTE_THREADS: '1',
      NO_COLOR: '1',
      ...extraEnv,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  const id = await new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`worker did not start:\n${output}`)), 30_000);
    const onData = (chunk: Buffer) => {
      output += chunk.toString();
      if (process.env.QG_WORKER_LOG) process.stderr.write(chunk);
      const m = /([A-Za-z0-9_.-]+:\d+) computing with/.exec(output);
      if (m) {
        clearTimeout(timer);
        resolve(m[1]!);
      }
    };
    child.stdout?.on('data', onData);
    child.stderr?.on('data', onData);
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`worker exited (${code}) before it started:\n${output}`));
    });
  });
  return {
    child,
    id,
    output: () => output,
    stop: (signal = 'SIGTERM') =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null || child.signalCode !== null) return resolve();
        child.once('exit', () => resolve());
        child.kill(signal);
      }),
  };
}
