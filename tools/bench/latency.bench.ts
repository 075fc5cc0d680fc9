/*
 * Responsiveness under load, on a running Quietglass (`npm start` in another terminal): p50/p95/max
 * latency of a light GET (the signed-in user) while the worker runs the largest Yield forecast the
 * demo recipe allows (100 000 trials) and 10 000-band spec masks are posted one after another.
 * Then the forecast is cancelled and the time until the worker has started the next job is taken.
 *   npx tsx tools/bench/latency.bench.ts [--seconds 15] [--url http://127.0.0.1:3000]
 */
import path from 'node:path';
import { apiSession, arg, ROOT, signInDemoEngineer } from './api-session.js';
import { required } from '@quietglass/shared/checked';
import { percentile } from './stats.js';

const base = arg('--url', 'http://127.0.0.1:3000');
const seconds = Number(arg('--seconds', '15'));
const credentials = arg('--credentials', path.join(ROOT, '.data', 'demo-sign-ins.json'));

const api = apiSession(base);

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function waitStatus(id: number, want: string, timeoutMs = 60_000): Promise<void> {
  const until = Date.now() + timeoutMs;
  while ((await api<{ status: string }>('GET', `/calculations/${id}`)).body.status !== want) {
    if (Date.now() > until) throw new Error(`calculation ${id} never became ${want}`);
    await sleep(20);
  }
}

async function main(): Promise<void> {
  await signInDemoEngineer(api, base, credentials);
  const designs = (await api<{ id: number; name: string; customerId?: number }[]>('GET', '/designs')).body;
  const demo = designs.find((d) => d.name.startsWith('HVS-2210'));
  if (!demo) throw new Error('the demo recipe is missing');
  const customers = (await api<{ id: number }[]>('GET', '/customers')).body;

  const seed = Date.now() % 1_000_000;
  const big = await api<{ id: number; message?: string }>('POST', `/designs/${demo.id}/versions/1/yield`, {
    trials: 100_000,
    seed,
    thickness: { relativePercent: 1 },
  });
  if (big.status !== 201) throw new Error(`the forecast was not queued: ${JSON.stringify(big.body)}`);
  await waitStatus(big.body.id, 'running');

  // 10 000 consistent bands, 1 nm wide, 0.05 nm apart (about 1 MB of JSON).
  const bands = Array.from({ length: 10_000 }, (_, i) => ({
    from_nm: 400 + i * 0.05,
    to_nm: 401 + i * 0.05,
    quantity: 'R',
    max_percent: 1,
  }));
  let masks = 0;
  let maskMs = 0;
  let stop = false;
  const poster = (async () => {
    while (!stop) {
      const t = performance.now();
      const res = await api('POST', '/spec-masks', {
        name: `Bench 10k bands ${seed}-${masks}`,
        customerId: required(customers[0], 'a demo customer').id,
        revision: 'A',
        bands,
      });
      if (res.status !== 201) throw new Error(`mask post gave ${res.status}: ${JSON.stringify(res.body)}`);
      maskMs += performance.now() - t;
      masks++;
    }
  })();

  const latencies: number[] = [];
  const until = Date.now() + seconds * 1000;
  while (Date.now() < until) {
    const t = performance.now();
    const res = await api('GET', '/auth/me');
    if (res.status !== 200) throw new Error(`GET /auth/me gave ${res.status}`);
    latencies.push(performance.now() - t);
    await sleep(50);
  }
  stop = true;
  await poster;

  const cancelAt = performance.now();
  await api('POST', `/calculations/${big.body.id}/cancel`);
  const next = await api<{ id: number }>('POST', `/designs/${demo.id}/versions/1/yield`, {
    trials: 100,
    seed: seed + 1,
    thickness: { relativePercent: 1 },
  });
  await waitStatus(next.body.id, 'running');
  const freedMs = performance.now() - cancelAt;
  await waitStatus(next.body.id, 'completed');

  latencies.sort((a, b) => a - b);
  const f = (v: number) => v.toFixed(1);
  console.log(`light GET /api/auth/me under load, ${latencies.length} requests over ${seconds} s:`);
  console.log(
    `  p50 ${f(percentile(latencies, 50))} ms, p95 ${f(percentile(latencies, 95))} ms, max ${f(percentile(latencies, 100))} ms`,
  );
  console.log(`10 000-band masks posted meanwhile: ${masks}, mean ${f(maskMs / Math.max(1, masks))} ms each`);
  console.log(`cancel of the 100 000-trial forecast → next job running: ${f(freedMs)} ms`);
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
