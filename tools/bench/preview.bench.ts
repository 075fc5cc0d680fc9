/*
 * Instant-preview benchmark (not a timed test): how long one recompute of the Layer grid's preview
 * takes, as the preview worker runs it. Run with `npx tsx tools/bench/preview.bench.ts` after
 * `npm run build -w shared`.
 *
 * Case: 30 layers alternating the demo shop's typical Cauchy TiO2 and SiO2 (n 2.35 and 1.46 at
 * 550 nm), layer j = 0…29 being 40 + 5·j nm, on N-BK7 from air, front surface only; 1000
 * wavelengths evenly over 400–800 nm at 0°, average polarisation; the demo mask "HVS-2210 lens AR"
 * (R ≤ 0.5 % over 420–680 nm at 0, 15 and 30°, every 2 nm) evaluated every time, and the reflected
 * colour and Rv at 0°. Each run changes one thickness, as typing does, so the plan is reused
 * ("warm"); a "cold" run plans from scratch (a material, angle or mask changed).
 */
import type { MaterialModel, StackDescription } from '@quietglass/shared';
import {
  createPreviewCalculator,
  type PreviewRequest,
} from '../../frontend/src/lib/preview/compute-preview.ts';
import { required } from '@quietglass/shared/checked';
import { median } from './stats.js';

const LAYERS = 30;
const WARMUPS = 50;
const RUNS = 400;
const COLD_RUNS = 60;

/** n = A + B/λ² (λ in µm) through the typical index at 550 nm, as the demo materials are built. */
function typicalCauchy(n550: number, B: number): MaterialModel {
  return { model: 'cauchy', A: n550 - B / 0.55 ** 2, B, C: 0, k: 0 };
}

function stack(thicknessesNm: number[]): StackDescription {
  return {
    incident: { material: 'air' },
    substrate: { material: 'N-BK7', thickness_mm: 2 },
    materials: { TiO2: typicalCauchy(2.35, 0.035), SiO2: typicalCauchy(1.46, 0.0035) },
    layers: thicknessesNm.map((d, j) => ({ material: j % 2 === 0 ? 'TiO2' : 'SiO2', thickness_nm: d })),
    reference_nm: 550,
  };
}

const base = Array.from({ length: LAYERS }, (_, j) => 40 + 5 * j);

function request(thicknessesNm: number[], slot = 'live'): PreviewRequest {
  return {
    slot,
    stack: stack(thicknessesNm),
    back: 'none',
    wavelengths: { fromNm: 400, toNm: 800, count: 1000 },
    anglesDeg: [0],
    polarisation: 'avg',
    maskBands: [
      {
        from_nm: 420,
        to_nm: 680,
        angles_deg: [0, 15, 30],
        polarisation: 'avg',
        quantity: 'R',
        max_percent: 0.5,
        step_nm: 2,
      },
    ],
    colourAngleDeg: 0,
  };
}

function main(): void {
  const calculator = createPreviewCalculator();
  const thicknesses = [...base];
  let sink = 0;
  const recompute = (i: number) => {
    // One layer's thickness changes by a fraction of a nanometre, as an edit in the grid would.
    thicknesses[i % LAYERS] = required(base[i % LAYERS], 'a layer') + (i % 7) * 0.1;
    const result = calculator.compute(request(thicknesses));
    sink += (result.curves[0]?.R[500] ?? 0) + (result.mask?.worstMargin ?? 0);
  };
  for (let i = 0; i < WARMUPS; i++) recompute(i);
  const warm: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    const start = performance.now();
    recompute(i);
    warm.push(performance.now() - start);
  }
  const cold: number[] = [];
  for (let i = 0; i < COLD_RUNS; i++) {
    const start = performance.now();
    const result = createPreviewCalculator().compute(request(base, `cold-${i}`));
    cold.push(performance.now() - start);
    sink += result.curves[0]?.R[0] ?? 0;
  }
  const check = calculator.compute(request(base));
  console.log(
    `Preview recompute, ${LAYERS} layers × 1000 wavelengths at 0° (avg), mask at 0/15/30° (393 samples), colour at 0°`,
  );
  console.log(
    `  warm (plan reused, one thickness changed): median ${median(warm).toFixed(2)} ms over ${RUNS} runs`,
  );
  console.log(
    `  cold (planned from scratch):               median ${median(cold).toFixed(2)} ms over ${COLD_RUNS} runs`,
  );
  console.log(
    `  mask verdict: ${check.mask?.pass ? 'pass' : 'fail'}, worst margin ${check.mask?.worstMargin.toFixed(3)} pp; Rv ${(100 * (check.colour?.Rv ?? NaN)).toFixed(2)} %`,
  );
  if (!Number.isFinite(sink)) throw new Error('the benchmark computed a non-finite value');
}

main();
