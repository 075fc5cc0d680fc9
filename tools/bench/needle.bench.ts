/*
 * Hard optimisation benchmark (not a timed test). Run:
 * `npm run build -w shared && npx tsx tools/bench/needle.bench.ts [analytic|differences|both] [high-index] [case] [growth merit]`
 * (both methods when no argument is given; high-index TiO2 by default, or Nb2O5 / Ta2O5; case
 * `hard` by default or `normal`; growth merit `smooth` by default or `mask`, the one-sided merit
 * growing used before). QG_BENCH_ROUNDS=1 runs each method once; QG_BENCH_ANGLES, QG_BENCH_FROM_NM,
 * QG_BENCH_OUTER_N (a constant-index outermost layer) and QG_BENCH_MAX_LAYERS vary the case.
 *
 * Case `hard`: broadband AR on N-BK7 (SCHOTT Sellmeier): R ≤ 0.5 % over 400–1100 nm (5 nm steps)
 * at 0, 20 and 40°, average polarisation. Case `normal`: R ≤ 0.5 % over 420–1100 nm at normal
 * incidence, the variant these materials reach (see the README). Materials from the published library the product ships
 * (backend/assets/optical-constants, read with the engine's constants-file reader, as the demo
 * shop's library is seeded): the high-index film and SiO2 (Gao et al.) for needles, MgF2
 * (Rodríguez-de Marcos et al.) as the outermost layer, which stays outermost.
 * Start: MgF2 95 nm over the high-index film 120 nm.
 * a) Grow layers until the mask is met (at most 40 layers);
 * b) Fit to mask of the grown design after a 2 % random thickness error (1σ, seeded);
 * each twice: the first run includes JIT warm-up.
 * `differences` is the finite-difference engine: forward-difference Jacobians (one spectrum per
 * free layer) and the needle scan by probing, a 0.01 nm needle of each material at every point of
 * the depth grid, one spectrum each.
 */
import { readFileSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';
import { SpectrumWorkerPool } from '@quietglass/shared/node/parallel';
import {
  MATERIAL_LIBRARY,
  computeSpectrum,
  constantIndex,
  createSpectrumOutput,
  createSpectrumPlan,
  createMaskMerit,
  evaluateMask,
  fitToMask,
  growLayers,
  type DerivativeMethod,
  type GrowthMerit,
  type MaterialModel,
  type OpticalStack,
  type SpecMask,
} from '@quietglass/shared';
import { parseConstantsFile } from '@quietglass/shared/optics/constants-file';
import { Mulberry32, fillDeviates } from '@quietglass/shared/optimise/random';
import { required } from '@quietglass/shared/checked';

/** The one-minute load average, as the figures are recorded with it. */
const load = () => (loadavg()[0] ?? 0).toFixed(2);

const LIBRARY = new URL('../../backend/assets/optical-constants/', import.meta.url);
function published(file: string): MaterialModel {
  return parseConstantsFile(readFileSync(new URL(file, LIBRARY), 'utf8')).model;
}
const HIGH_FILES: Record<string, string> = {
  TiO2: 'film/tio2--sarkar.yml',
  Nb2O5: 'film/nb2o5--lemarchand.yml',
  Ta2O5: 'film/ta2o5--gao.yml',
};
const highName = process.argv[3] ?? 'TiO2';
const HIGH = published(required(HIGH_FILES[highName], `a published file for ${highName}`));
const SIO2 = published('film/sio2--gao.yml');
// QG_BENCH_OUTER_N: a constant-index outermost layer instead of the published MgF2 (what-if runs).
const MGF2 = process.env.QG_BENCH_OUTER_N
  ? constantIndex(Number(process.env.QG_BENCH_OUTER_N))
  : published('film/mgf2--rodriguez-de-marcos.yml');

const caseName = process.argv[4] ?? 'hard';
if (caseName !== 'hard' && caseName !== 'normal')
  throw new Error(`case must be hard or normal (got ${caseName})`);
const growthMerit = (process.argv[5] ?? 'smooth') as GrowthMerit;
// What-if overrides of the case: QG_BENCH_FROM_NM (band start), QG_BENCH_ANGLES ("0,20"),
// QG_BENCH_MAX_LAYERS (default 40).
const fromNm = Number(process.env.QG_BENCH_FROM_NM ?? (caseName === 'hard' ? 400 : 420));
const anglesDeg = process.env.QG_BENCH_ANGLES
  ? process.env.QG_BENCH_ANGLES.split(',').map(Number)
  : caseName === 'hard'
    ? [0, 20, 40]
    : [0];
const maxLayers = Number(process.env.QG_BENCH_MAX_LAYERS ?? 40);
const mask: SpecMask = {
  step_nm: 5,
  bands: [
    {
      from_nm: fromNm,
      to_nm: 1100,
      angles_deg: anglesDeg,
      polarisation: 'avg',
      quantity: 'R',
      max_percent: 0.5,
    },
  ],
};

const start: OpticalStack = {
  incident: constantIndex(1),
  layers: [
    { material: MGF2, thicknessNm: 95 },
    { material: HIGH, thicknessNm: 120 },
  ],
  substrate: required(MATERIAL_LIBRARY['N-BK7'], 'N-BK7 in the material library'),
  backLayers: [],
  exit: constantIndex(1),
};

function run(method: DerivativeMethod, round: number): OpticalStack {
  let t0 = performance.now();
  const grown = growLayers(start, mask, {
    allowedMaterials: [
      { name: highName, model: HIGH },
      { name: 'SiO2', model: SIO2 },
      { name: 'MgF2', model: MGF2 },
    ],
    layerMaterials: ['MgF2', highName],
    outermostFixed: true,
    outermostOnly: ['MgF2'],
    maxLayers,
    maxSteps: 60,
    derivatives: method,
    growthMerit,
  });
  const growSeconds = (performance.now() - t0) / 1000;
  console.log(
    `[${method}, run ${round}] a) Grow layers: ${growSeconds.toFixed(2)} s (load ${load()}), ` +
      `${grown.final.layerCount} layers, ${grown.final.totalThicknessNm.toFixed(0)} nm, ${grown.steps.length - 1} steps, ` +
      `stopped by ${grown.stoppedBy}, merit ${grown.final.merit.toFixed(4)}, ` +
      `worst margin ${grown.final.worstMargin.toFixed(4)} %-points (best step ${grown.final.step}), ` +
      `outermost ${grown.final.layers[0]?.material ?? 'none'}, ` +
      `mask ${evaluateMask(mask, grown.stack).pass ? 'passes' : 'FAILS'}`,
  );
  if (process.env.QG_BENCH_VERBOSE)
    for (const s of grown.steps)
      console.log(
        `   step ${s.step}: ${s.layerCount} layers, merit ${s.merit.toFixed(4)}, worst ${s.worstMargin.toFixed(3)}`,
      );
  console.log('   ' + grown.final.layers.map((l) => `${l.material} ${l.thicknessNm.toFixed(1)}`).join(' | '));
  console.log('   ' + reflectanceByAngle(grown.stack));
  const errors = fillDeviates(
    new Float64Array(grown.stack.layers.length),
    grown.stack.layers.length,
    new Mulberry32(20261202),
    'normal',
  );
  const perturbed: OpticalStack = {
    ...grown.stack,
    layers: grown.stack.layers.map((l, i) => ({
      ...l,
      thicknessNm: l.thicknessNm * (1 + 0.02 * required(errors[i], 'a thickness error')),
    })),
  };
  t0 = performance.now();
  const fit = fitToMask(perturbed, mask, { derivatives: method, minThicknessNm: 0, maxIterations: 200 });
  const fitSeconds = (performance.now() - t0) / 1000;
  console.log(
    `[${method}, run ${round}] b) Fit to mask from a 2 % error: ${fitSeconds.toFixed(2)} s, ${fit.iterations} iterations, ` +
      `${fit.evaluations} spectra, merit ${fit.merit.before.toFixed(4)} → ${fit.merit.after.toFixed(6)}, ` +
      `${fit.pass ? 'passes' : 'fails'} (worst margin ${fit.worstMargin.toFixed(4)})`,
  );
  return grown.stack;
}

/** Highest and mean R (unpolarised, %) over the band at each of the mask's angles. */
function reflectanceByAngle(stack: OpticalStack): string {
  const wavelengthsNm = Array.from({ length: Math.floor((1100 - fromNm) / 5) + 1 }, (_, i) => fromNm + 5 * i);
  const plan = createSpectrumPlan(stack, { wavelengthsNm, anglesDeg, polarisations: ['avg'] });
  const { R } = computeSpectrum(createSpectrumOutput(plan), plan);
  return anglesDeg
    .map((angle, a) => {
      let highest = 0;
      let sum = 0;
      for (let i = 0; i < wavelengthsNm.length; i++) {
        const v = 100 * (R[a * wavelengthsNm.length + i] ?? 0);
        highest = Math.max(highest, v);
        sum += v;
      }
      return `${angle}°: R highest ${highest.toFixed(3)} %, mean ${(sum / wavelengthsNm.length).toFixed(3)} %`;
    })
    .join('; ');
}

/**
 * d) One Jacobian of the mask merit at the grown design, every layer free: the analytic sweeps
 * against forward differences (one spectrum per layer), medians of `calls` calls each.
 */
function jacobians(stack: OpticalStack, calls: number): void {
  const merit = createMaskMerit(stack, mask, { smooth: true });
  const d = stack.layers.map((l) => l.thicknessNm);
  const free = d.map((_, i) => i);
  const jac = new Float64Array(merit.sampleCount * d.length);
  const r = new Float64Array(merit.sampleCount);
  const median = (xs: number[]) => xs.sort((a, b) => a - b)[Math.floor(xs.length / 2)] ?? NaN;
  const analytic: number[] = [];
  const differences: number[] = [];
  for (let i = 0; i < calls; i++) {
    let t = performance.now();
    merit.compute(d);
    merit.jacobian(jac, d, free);
    analytic.push(performance.now() - t);
    t = performance.now();
    merit.residuals(r, d);
    const trial = d.slice();
    for (let j = 0; j < d.length; j++) {
      trial[j] = (d[j] ?? 0) + 1e-6;
      merit.residuals(r, trial);
      trial[j] = d[j] ?? 0;
    }
    differences.push(performance.now() - t);
  }
  const a = median(analytic);
  const f = median(differences);
  console.log(
    `d) Jacobian of the ${d.length}-layer result (${merit.sampleCount} samples): analytic ${a.toFixed(2)} ms, ` +
      `forward differences ${f.toFixed(2)} ms, ${(f / a).toFixed(1)}× (median of ${calls}, load ${load()})`,
  );
}

/**
 * c) The grown design's spectrum on the mask's grid, the optimisers' unit of work: one thread
 * (computeSpectrum on one plan) against the worker-thread splitter with 2 threads (plan per call,
 * slices posted to the workers). Medians of `calls` calls each.
 */
async function threads(stack: OpticalStack, calls: number): Promise<void> {
  const grid = {
    wavelengthsNm: Array.from({ length: Math.floor((1100 - fromNm) / 5) + 1 }, (_, i) => fromNm + 5 * i),
    anglesDeg,
    polarisations: ['s', 'p'] as const,
  };
  const median = (xs: number[]) => xs.sort((a, b) => a - b)[Math.floor(xs.length / 2)] ?? NaN;
  const plan = createSpectrumPlan(stack, { ...grid, polarisations: [...grid.polarisations] });
  const out = createSpectrumOutput(plan);
  const one: number[] = [];
  for (let i = 0; i < calls; i++) {
    const t = performance.now();
    computeSpectrum(out, plan);
    one.push(performance.now() - t);
  }
  const pool = await SpectrumWorkerPool.create({ size: 2 });
  const two: number[] = [];
  try {
    for (let i = 0; i < calls; i++) {
      const t = performance.now();
      await pool.compute(stack, { ...grid, polarisations: [...grid.polarisations] });
      two.push(performance.now() - t);
    }
  } finally {
    await pool.close();
  }
  console.log(
    `c) spectrum of the ${stack.layers.length}-layer result on the mask grid (${plan.size} points): ` +
      `1 thread ${median(one).toFixed(3)} ms, 2 worker threads ${median(two).toFixed(3)} ms (median of ${calls}, load ${load()})`,
  );
}

console.log(`Node ${process.version}, ${cpus()[0]?.model ?? 'unknown CPU'}, load ${load()}`);
console.log(
  `case ${caseName} (${fromNm}–1100 nm at ${anglesDeg.join('/')}°, at most ${maxLayers} layers` +
    `${process.env.QG_BENCH_OUTER_N ? `, outermost n = ${process.env.QG_BENCH_OUTER_N}` : ''}), growth merit ${growthMerit}`,
);
const which = process.argv[2];
const rounds = Number(process.env.QG_BENCH_ROUNDS ?? 2);
let grownStack: OpticalStack | null = null;
for (let round = 1; round <= rounds; round++) {
  for (const method of ['analytic', 'differences'] as const)
    if (!which || which === 'both' || which === method) grownStack = run(method, round);
}
if (grownStack) {
  jacobians(grownStack, 50);
  await threads(grownStack, 200);
}
console.log(`load at end ${load()}`);
