/*
 * Hard optimisation benchmark (not a timed test): analytic derivatives against forward
 * differences. Run: `npm run build -w shared && npx tsx tools/bench/needle.bench.ts [analytic|differences]`
 * (both when no argument is given).
 *
 * Broadband AR on N-BK7: R ≤ 0.5 % over 400–1100 nm (5 nm steps) at 0, 20 and 40°, average
 * polarisation. Materials as in the demo shop library (typical Cauchy models through the typical
 * index at 550 nm, common practice, from memory): TiO2 (2.35) and SiO2 (1.46) for needles, MgF2
 * (1.38) as the outermost layer, which stays outermost. Start: MgF2 95 nm over TiO2 120 nm.
 * a) Grow layers until the mask is met (at most 30 layers);
 * b) Fit to mask of the grown design after a 2 % random thickness error (1σ, seeded);
 * Each twice: the first run includes JIT warm-up.
 * c) one Jacobian of the mask's residuals for 9 and 30 layers, analytic against differences.
 */
import { cpus, loadavg } from 'node:os';
import {
  MATERIAL_LIBRARY,
  constantIndex,
  evaluateMask,
  fitToMask,
  growLayers,
  type DerivativeMethod,
  type MaterialModel,
  type OpticalStack,
  type SpecMask,
  createMaskMerit,
} from '@quietglass/shared';
import { Mulberry32, fillDeviates } from '@quietglass/shared/optimise/random';

function typicalCauchy(n550: number, B: number): MaterialModel {
  return { model: 'cauchy', A: n550 - B / 0.55 ** 2, B, C: 0, k: 0 };
}
const TIO2 = typicalCauchy(2.35, 0.035);
const SIO2 = typicalCauchy(1.46, 0.0035);
const MGF2 = typicalCauchy(1.38, 0.003);

const mask: SpecMask = {
  step_nm: 5,
  bands: [
    {
      from_nm: 400,
      to_nm: 1100,
      angles_deg: [0, 20, 40],
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
    { material: TIO2, thicknessNm: 120 },
  ],
  substrate: MATERIAL_LIBRARY['N-BK7'],
  backLayers: [],
  exit: constantIndex(1),
};

function run(method: DerivativeMethod, round: number): void {
  let t0 = performance.now();
  const grown = growLayers(start, mask, {
    allowedMaterials: [
      { name: 'TiO2', model: TIO2 },
      { name: 'SiO2', model: SIO2 },
    ],
    layerMaterials: ['MgF2', 'TiO2'],
    outermostFixed: true,
    maxLayers: 30,
    maxSteps: 60,
    derivatives: method,
  });
  const growSeconds = (performance.now() - t0) / 1000;
  console.log(
    `[${method}, run ${round}] a) Grow layers: ${growSeconds.toFixed(2)} s, ${grown.final.layerCount} layers, ` +
      `${grown.final.totalThicknessNm.toFixed(0)} nm, stopped by ${grown.stoppedBy}, merit ${grown.final.merit.toFixed(4)}, ` +
      `worst margin ${grown.final.worstMargin.toFixed(4)} %-points, outermost ${grown.final.layers[0].material}, ` +
      `mask ${evaluateMask(mask, grown.stack).pass ? 'passes' : 'FAILS'}`,
  );
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
      thicknessNm: l.thicknessNm * (1 + 0.02 * errors[i]),
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
}

/** Milliseconds per Jacobian of an n-layer alternating TiO2/SiO2 stack under MgF2, after warm-up. */
function jacobianTiming(layerCount: number): void {
  const d = Array.from({ length: layerCount }, (_, i) => (i === 0 ? 95 : 15 + ((i * 37) % 120)));
  const stack: OpticalStack = {
    ...start,
    layers: d.map((t, i) => ({ material: i === 0 ? MGF2 : i % 2 === 1 ? TIO2 : SIO2, thicknessNm: t })),
  };
  const merit = createMaskMerit(stack, mask);
  const r = new Float64Array(merit.sampleCount);
  const jac = new Float64Array(merit.sampleCount * layerCount);
  const free = d.map((_, i) => i);
  const rounds = 100;
  for (let i = 0; i < 30; i++) {
    merit.residuals(r, d);
    merit.jacobian(jac, d, free);
  }
  let t0 = performance.now();
  for (let i = 0; i < rounds; i++) merit.residuals(r, d);
  const spectrum = (performance.now() - t0) / rounds;
  t0 = performance.now();
  for (let i = 0; i < rounds; i++) merit.jacobian(jac, d, free);
  const analytic = (performance.now() - t0) / rounds;
  console.log(
    `c) Jacobian, ${layerCount} layers × ${merit.sampleCount} samples: analytic ${analytic.toFixed(2)} ms, ` +
      `differences ${(layerCount * spectrum).toFixed(2)} ms (${layerCount} spectra of ${spectrum.toFixed(3)} ms), ` +
      `${((layerCount * spectrum) / analytic).toFixed(1)}× faster`,
  );
}

console.log(`Node ${process.version}, ${cpus()[0]?.model ?? 'unknown CPU'}, load ${loadavg()[0].toFixed(2)}`);
const which = process.argv[2];
// Run 1 includes compiling the code paths (JIT warm-up); run 2 is the steady state.
for (const round of [1, 2]) {
  for (const method of ['analytic', 'differences'] as const)
    if (!which || which === method) run(method, round);
}
if (!which || which === 'jacobian') for (const n of [9, 30]) jacobianTiming(n);
console.log(`load at end ${loadavg()[0].toFixed(2)}`);
