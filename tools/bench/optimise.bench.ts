/*
 * Optimisation benchmark (not a timed test). Run: `npm run build -w shared && npx tsx
 * tools/bench/optimise.bench.ts`.
 *
 * 1. Broadband AR on N-BK7 against R ≤ 0.5 % over 420–680 nm at 0° (1 nm steps), materials
 *    n = 1.38 and 2.35 (typical MgF2 and TiO2 values, common practice, from memory):
 *    a) Grow layers from a 4-layer guess with at most 8 layers;
 *    b) Fit to mask of an 8-layer start.
 * 2. Yield forecast of a 12-layer AR (fitted here first, untimed) over 400–700 nm in 1 nm steps
 *    (301 wavelengths): 10 000 trials, 1 % thickness error (1σ), 0.5 % systematic rate error and
 *    0.5 % index error per material, per-layer sensitivity over the first 1000 trials; on both
 *    cores through worker threads, and in one thread for comparison.
 */
import { availableParallelism, cpus, loadavg } from 'node:os';
import {
  MATERIAL_LIBRARY,
  constantIndex,
  evaluateMask,
  fitToMask,
  forecastYield,
  growLayers,
  type Layer,
  type OpticalStack,
  type SpecMask,
} from '@quietglass/shared';
import { YieldWorkerPool } from '@quietglass/shared/node/yield-parallel';
import { required } from '@quietglass/shared/checked';

const LOW = constantIndex(1.38);
const HIGH = constantIndex(2.35);

function onGlass(layers: Layer[]): OpticalStack {
  return {
    incident: constantIndex(1),
    layers,
    substrate: required(MATERIAL_LIBRARY['N-BK7'], 'N-BK7 in the material library'),
    backLayers: [],
    exit: constantIndex(1),
  };
}

function alternating(thicknessesNm: number[]): Layer[] {
  return thicknessesNm.map((d, i) => ({ material: i % 2 === 0 ? LOW : HIGH, thicknessNm: d }));
}

function seconds(start: number): string {
  return ((performance.now() - start) / 1000).toFixed(3);
}

async function main(): Promise<void> {
  console.log(
    `Node ${process.version}, ${cpus()[0]?.model ?? 'unknown CPU'}, ${availableParallelism()} cores`,
  );
  console.log(
    `load average at start: ${loadavg()
      .map((x) => x.toFixed(2))
      .join(', ')}`,
  );

  const arMask: SpecMask = { bands: [{ from_nm: 420, to_nm: 680, quantity: 'R', max_percent: 0.5 }] };

  let start = performance.now();
  const grown = growLayers(onGlass(alternating([95, 110, 35, 15])), arMask, {
    allowedMaterials: [
      { name: 'L', model: LOW },
      { name: 'H', model: HIGH },
    ],
    maxLayers: 8,
  });
  const grownTime = seconds(start);
  console.log(
    `1a Grow layers from 4 layers (≤ 8): ${grownTime} s, ${grown.final.layerCount} layers, ` +
      `stopped by ${grown.stoppedBy}, mask ${evaluateMask(arMask, grown.stack).pass ? 'passes' : 'FAILS'} ` +
      `(worst margin ${grown.final.worstMargin.toFixed(4)} %-points)`,
  );

  const eight = onGlass(alternating([90, 100, 30, 40, 20, 30, 15, 15]));
  start = performance.now();
  const fitted = fitToMask(eight, arMask);
  const fitTime = seconds(start);
  const fittedStack = onGlass(alternating(fitted.thicknessesNm));
  console.log(
    `1b Fit to mask, 8 layers: ${fitTime} s, ${fitted.iterations} iterations, ${fitted.evaluations} spectra, ` +
      `merit ${fitted.merit.before.toFixed(3)} → ${fitted.merit.after.toFixed(6)}, ` +
      `mask ${evaluateMask(arMask, fittedStack).pass ? 'passes' : 'FAILS'}`,
  );

  // 12-layer design for the forecast (untimed): fitted with 0.1 %-point to spare.
  const wideMask: SpecMask = { bands: [{ from_nm: 400, to_nm: 700, quantity: 'R', max_percent: 0.5 }] };
  const twelveStart = alternating(
    Array.from({ length: 12 }, (_, i) => (i === 0 ? 90 : 20 + ((i * 37) % 50))),
  );
  const twelveFit = fitToMask(onGlass(twelveStart), wideMask, { maxIterations: 300, marginPercent: 0.1 });
  const twelve = onGlass(alternating(twelveFit.thicknessesNm));
  const yieldOptions = {
    trials: 10_000,
    seed: 20261201,
    thickness: { relativePercent: 1, distribution: 'normal' as const },
    layerMaterials: twelve.layers.map((_, i) => (i % 2 === 0 ? 'L' : 'H')),
    systematic: { L: { relativePercent: 0.5 }, H: { relativePercent: 0.5 } },
    indexErrors: { L: { relativePercent: 0.5 }, H: { relativePercent: 0.5 } },
  };
  console.log(
    `2  12-layer design: nominal worst margin ${twelveFit.worstMargin.toFixed(3)} %-points, ` +
      `thicknesses ${twelveFit.thicknessesNm.map((d) => d.toFixed(1)).join(' ')} nm`,
  );

  const pool = await YieldWorkerPool.create({ size: 2 });
  try {
    start = performance.now();
    const parallel = await pool.forecast(twelve, wideMask, yieldOptions);
    const parallelTime = seconds(start);
    console.log(
      `2a Yield forecast, 10 000 trials × 301 wavelengths, 2 worker threads: ${parallelTime} s, ` +
        `yield ${(100 * parallel.yieldFraction).toFixed(2)} %, most sensitive layers ` +
        parallel.sensitivity
          .slice(0, 3)
          .map((s) => `${s.layer} (${s.material}, −${(100 * s.yieldLossFraction).toFixed(1)} %)`)
          .join(', '),
    );
    start = performance.now();
    const single = forecastYield(twelve, wideMask, yieldOptions);
    const singleTime = seconds(start);
    console.log(
      `2b same in one thread: ${singleTime} s, yield ${(100 * single.yieldFraction).toFixed(2)} %, ` +
        `identical to 2a: ${JSON.stringify(single) === JSON.stringify(parallel)}`,
    );
  } finally {
    await pool.close();
  }
  console.log(
    `load average at end: ${loadavg()
      .map((x) => x.toFixed(2))
      .join(', ')}`,
  );
}

await main();
