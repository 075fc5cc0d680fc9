/*
 * Optics engine benchmark (not a timed test): layer-evaluations per second of the fast kernel, the
 * plain complex.js reference, and the kernel on every core through worker threads, side by side on
 * the standard case. Run with `npm run bench` (it builds @quietglass/shared first).
 *
 * Standard case: 20 layers alternating N = 2.35 + 0.0001i and N = 1.46, layer j = 0…19 being
 * 50 + 7·j nm thick, on a semi-infinite n = 1.52 substrate from air; 1000 wavelengths evenly over
 * 400–700 nm, 91 angles evenly over 0–88.2°, s polarisation. One layer-evaluation is one layer at
 * one (wavelength, angle, polarisation) point.
 */
import { availableParallelism, cpus } from 'node:os';
import {
  computeSpectrum,
  constantIndex,
  createSpectrumOutput,
  createSpectrumPlan,
  type OpticalStack,
  type SpectralGrid,
} from '@quietglass/shared';
import { SpectrumWorkerPool } from '@quietglass/shared/node/parallel';
import { referenceResponse, type ReferenceLayer } from '@quietglass/shared/optics/reference';
import { required } from '@quietglass/shared/checked';
import { bestAndMedian } from './stats.js';

const LAYERS = 20;
const WAVELENGTHS = Array.from({ length: 1000 }, (_, i) => 400 + (300 * i) / 999);
const ANGLES = Array.from({ length: 91 }, (_, i) => (88.2 * i) / 90);
/** The reference runs every REFERENCE_ANGLE_STRIDE-th angle only; its rate is per layer-evaluation. */
const REFERENCE_ANGLE_STRIDE = 10;
const WARMUPS = 3;
const ROUNDS = 15;
const REFERENCE_ROUNDS = 5;

const layerSpecs: ReferenceLayer[] = Array.from({ length: LAYERS }, (_, j) => ({
  n: j % 2 === 0 ? 2.35 : 1.46,
  k: j % 2 === 0 ? 0.0001 : 0,
  thicknessNm: 50 + 7 * j,
}));
const stack: OpticalStack = {
  incident: constantIndex(1),
  layers: layerSpecs.map((l) => ({ material: constantIndex(l.n, l.k), thicknessNm: l.thicknessNm })),
  substrate: constantIndex(1.52),
  backLayers: [],
  exit: constantIndex(1),
};
const grid: SpectralGrid = { wavelengthsNm: WAVELENGTHS, anglesDeg: ANGLES, polarisations: ['s'] };
const EVALUATIONS = LAYERS * WAVELENGTHS.length * ANGLES.length;

interface Timing {
  best: number;
  median: number;
}

/**
 * Times workloads in interleaved rounds (A, B, A, B, …) after warm-up, so a burst of load from other
 * processes hits them alike and their ratio stays fair.
 */
async function timeInterleaved(
  runs: readonly (() => unknown)[],
  warmups: number,
  rounds: number,
): Promise<Timing[]> {
  for (let i = 0; i < warmups; i++) for (const run of runs) await run();
  const timed = runs.map((run) => ({ run, samples: [] as number[] }));
  for (let round = 0; round < rounds; round++) {
    for (const t of timed) {
      const start = performance.now();
      await t.run();
      t.samples.push((performance.now() - start) / 1000);
    }
  }
  return timed.map((t) => bestAndMedian(t.samples));
}

function rate(evaluations: number, seconds: number): string {
  return `${(evaluations / seconds / 1e6).toFixed(1)} M/s`;
}

async function main(): Promise<void> {
  // Engine, one thread: plan once (validation, dispersion), then the allocation-free compute.
  const plan = createSpectrumPlan(stack, grid);
  const out = createSpectrumOutput(plan);
  const runEngine = () => computeSpectrum(out, plan);

  // Plain complex.js reference on every 10th angle, all wavelengths.
  const refAngles = ANGLES.filter((_, i) => i % REFERENCE_ANGLE_STRIDE === 0);
  const refEvaluations = LAYERS * WAVELENGTHS.length * refAngles.length;
  let worstDiff = 0;
  const runReference = () => {
    for (const [ia, angleDeg] of ANGLES.entries()) {
      if (ia % REFERENCE_ANGLE_STRIDE !== 0) continue;
      for (const [iw, wavelengthNm] of WAVELENGTHS.entries()) {
        const res = referenceResponse({
          incident: { n: 1, k: 0 },
          layers: layerSpecs,
          exit: { n: 1.52, k: 0 },
          wavelengthNm,
          angleDeg,
          polarisation: 's',
        });
        const engineR = required(out.R[ia * WAVELENGTHS.length + iw], 'an engine result');
        worstDiff = Math.max(worstDiff, Math.abs(res.R - engineR));
      }
    }
  };

  // Engine on all cores through the worker-thread pool (started once, warm).
  const threads = availableParallelism();
  const pool = await SpectrumWorkerPool.create({ size: threads });
  let timings: Timing[];
  try {
    timings = await timeInterleaved([runEngine, () => pool.compute(stack, grid)], WARMUPS, ROUNDS);
  } finally {
    await pool.close();
  }
  const engine = required(timings[0], 'the engine timing');
  const parallel = required(timings[1], 'the worker-pool timing');
  // The reference runs on its own afterwards: the garbage it makes would otherwise be collected
  // during the engine's rounds.
  const reference = required(
    (await timeInterleaved([runReference], 1, REFERENCE_ROUNDS))[0],
    'the reference timing',
  );

  const rows = [
    ['engine, 1 thread', `${WAVELENGTHS.length}×${ANGLES.length}×1`, engine, EVALUATIONS],
    [
      'complex.js reference, 1 thread',
      `${WAVELENGTHS.length}×${refAngles.length}×1 (every ${REFERENCE_ANGLE_STRIDE}th angle)`,
      reference,
      refEvaluations,
    ],
    [
      `engine, ${threads} threads (worker_threads)`,
      `${WAVELENGTHS.length}×${ANGLES.length}×1`,
      parallel,
      EVALUATIONS,
    ],
  ] as const;

  const cpu = cpus()[0]?.model ?? 'unknown CPU';
  console.log(
    `Quietglass optics benchmark — ${new Date().toISOString().slice(0, 10)}, ${threads} cores (${cpu}), Node ${process.version}`,
  );
  console.log(
    `Standard case: ${LAYERS} layers, 1000 wavelengths 400–700 nm, 91 angles 0–88.2°, s; ${EVALUATIONS} layer-evaluations per full grid.`,
  );
  console.log('');
  const header = ['implementation', 'grid (λ × θ × pol)', 'best', 'median', 'rate (best)', 'rate (median)'];
  const table = rows.map(([name, size, t, evals]) => [
    name,
    size,
    `${(t.best * 1000).toFixed(1)} ms`,
    `${(t.median * 1000).toFixed(1)} ms`,
    rate(evals, t.best),
    rate(evals, t.median),
  ]);
  const widths = header.map((h, c) => Math.max(h.length, ...table.map((r) => r[c]?.length ?? 0)));
  const line = (cells: readonly string[]) => cells.map((cell, c) => cell.padEnd(widths[c] ?? 0)).join('  ');
  console.log(line(header));
  console.log(line(widths.map((w) => '-'.repeat(w))));
  for (const r of table) console.log(line(r));
  console.log('');
  const engineRate = EVALUATIONS / engine.median;
  const referenceRate = refEvaluations / reference.median;
  const parallelRate = EVALUATIONS / parallel.median;
  console.log(`engine / reference (median rates): ${(engineRate / referenceRate).toFixed(1)}×`);
  console.log(`${threads} threads / 1 thread (median rates): ${(parallelRate / engineRate).toFixed(2)}×`);
  console.log(
    `The reference ran ${refAngles.length} of ${ANGLES.length} angles; its rate is per layer-evaluation, so it ` +
      'extrapolates to the full grid. Worker timings include handing the slices to the threads.',
  );
  console.log(`Largest |R(engine) − R(reference)| on the reference's points: ${worstDiff.toExponential(2)}`);
  console.log(
    `Engine, 1 and ${threads} threads: ${WARMUPS} warm-up rounds, then ${ROUNDS} timed rounds running the two in ` +
      `turn; reference: 1 warm-up, ${REFERENCE_ROUNDS} timed. Medians are the figures to quote.`,
  );
}

await main();
