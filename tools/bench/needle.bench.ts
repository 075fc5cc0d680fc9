/*
 * Hard optimisation benchmark (not a timed test). Run:
 * `npm run build -w shared && npx tsx tools/bench/needle.bench.ts [analytic|differences] [high-index]`
 * (both methods when no argument is given; high-index TiO2 by default, or Nb2O5 / Ta2O5).
 *
 * Broadband AR on N-BK7 (SCHOTT Sellmeier): R ≤ 0.5 % over 400–1100 nm (5 nm steps) at 0, 20 and
 * 40°, average polarisation. Materials from the published library the product ships
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
const MGF2 = published('film/mgf2--rodriguez-de-marcos.yml');

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
    { material: HIGH, thicknessNm: 120 },
  ],
  substrate: required(MATERIAL_LIBRARY['N-BK7'], 'N-BK7 in the material library'),
  backLayers: [],
  exit: constantIndex(1),
};

function run(method: DerivativeMethod, round: number): void {
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
    maxLayers: 40,
    maxSteps: 60,
    derivatives: method,
  });
  const growSeconds = (performance.now() - t0) / 1000;
  console.log(
    `[${method}, run ${round}] a) Grow layers: ${growSeconds.toFixed(2)} s (load ${load()}), ` +
      `${grown.final.layerCount} layers, ${grown.final.totalThicknessNm.toFixed(0)} nm, ${grown.steps.length - 1} steps, ` +
      `stopped by ${grown.stoppedBy}, merit ${grown.final.merit.toFixed(4)}, ` +
      `worst margin ${grown.final.worstMargin.toFixed(4)} %-points, outermost ${grown.final.layers[0]?.material ?? 'none'}, ` +
      `mask ${evaluateMask(mask, grown.stack).pass ? 'passes' : 'FAILS'}`,
  );
  if (process.env.QG_BENCH_VERBOSE)
    for (const s of grown.steps)
      console.log(
        `   step ${s.step}: ${s.layerCount} layers, merit ${s.merit.toFixed(4)}, worst ${s.worstMargin.toFixed(3)}`,
      );
  console.log('   ' + grown.final.layers.map((l) => `${l.material} ${l.thicknessNm.toFixed(1)}`).join(' | '));
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
}

console.log(`Node ${process.version}, ${cpus()[0]?.model ?? 'unknown CPU'}, load ${load()}`);
const which = process.argv[2];
for (const round of [1, 2]) {
  for (const method of ['analytic', 'differences'] as const)
    if (!which || which === 'both' || which === method) run(method, round);
}
console.log(`load at end ${load()}`);
