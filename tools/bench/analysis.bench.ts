/*
 * Compute-queue benchmark: submit → result stored, through the API, for the standard 20-layer
 * map (1000 wavelengths over 400–700 nm × 91 angles over 0–88.2°, s and p), on a running Quietglass
 * (`npm start` in another terminal). Each run uses a fresh design so no stored result is reused.
 *   npx tsx tools/bench/analysis.bench.ts [--runs 5] [--url http://127.0.0.1:3000]
 */
import { apiSession, arg, signInDemoEngineer } from './api-session.js';
import { required } from '@quietglass/shared/checked';
import { median } from './stats.js';

const base = arg('--url', 'http://127.0.0.1:3000');
const runs = Number(arg('--runs', '5'));

const api = apiSession(base);

async function main(): Promise<void> {
  await signInDemoEngineer(api, base);

  const materials = (await api<{ id: number; name: string }[]>('GET', '/materials')).body;
  const ensure = async (name: string, n: number, k: number) => {
    const found = materials.find((m) => m.name === name);
    if (found) return found.id;
    const made = await api<{ id: number }>('POST', '/materials', {
      name,
      model: { model: 'constant', n, k },
      rangeNm: { from: 300, to: 2000 },
      typical: true,
      provenance: { source: 'benchmark case: constant index' },
    });
    return made.body.id;
  };
  const high = await ensure('Bench H (2.35 + 0.0001i)', 2.35, 0.0001);
  const low = await ensure('Bench L (1.46)', 1.46, 0);
  const substrate = await ensure('Bench substrate (1.52)', 1.52, 0);
  const air = materials.find((m) => m.name === 'Air')?.id ?? (await ensure('Air', 1, 0));
  const customers = (await api<{ id: number }[]>('GET', '/customers')).body;

  const times: number[] = [];
  const computeTimes: number[] = [];
  for (let run = 0; run < runs; run++) {
    const design = await api<{ id: number }>('POST', '/designs', {
      name: `Benchmark 20-layer ${new Date().toISOString()} #${run}`,
      customerId: required(customers[0], 'a demo customer').id,
      incidentMaterialId: air,
      substrateMaterialId: substrate,
      substrateThicknessMm: 1,
      backSurface: 'front-only',
      referenceWavelengthNm: 550,
      // Layer j: 50 + 7·j nm, alternating H and L (j = 0 … 19); a tiny offset per run keeps inputs distinct.
      layers: Array.from({ length: 20 }, (_, j) => ({
        materialId: j % 2 ? low : high,
        thicknessNm: 50 + 7 * j + run * 1e-6,
      })),
    });
    const started = performance.now();
    const sub = await api<{ id: number; status: string }>(
      'POST',
      `/designs/${design.body.id}/versions/1/analysis`,
      {
        fromNm: 400,
        toNm: 700,
        wavelengthCount: 1000,
        angleFromDeg: 0,
        angleToDeg: 88.2,
        angleCount: 91,
      },
    );
    if (sub.status !== 201) throw new Error(`submit gave ${sub.status}: ${JSON.stringify(sub.body)}`);
    let calc: { status: string; computeMs: number | null; error: string | null } = {
      status: 'queued',
      computeMs: null,
      error: null,
    };
    while (calc.status === 'queued' || calc.status === 'running') {
      await new Promise((r) => setTimeout(r, 10));
      calc = (await api<typeof calc>('GET', `/calculations/${sub.body.id}`)).body;
    }
    if (calc.status !== 'completed') throw new Error(`calculation ${calc.status}: ${calc.error}`);
    times.push(performance.now() - started);
    computeTimes.push(calc.computeMs ?? NaN);
  }
  console.log('Compute queue: standard 20-layer map, 1000 λ × 91 angles (s, p and avg), front surface');
  console.log(`runs: ${runs}`);
  console.log(
    `submit → result stored (median): ${(median(times) / 1000).toFixed(3)} s  (best ${(Math.min(...times) / 1000).toFixed(3)} s)`,
  );
  console.log(`worker compute time (median):  ${(median(computeTimes) / 1000).toFixed(3)} s`);
  console.log(`target: < 1.5 s — ${median(times) < 1500 ? 'met' : 'NOT met'}`);
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
