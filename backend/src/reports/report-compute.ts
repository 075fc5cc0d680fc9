/*
 * The heavy part of a compliance report: the designed spectrum on the mask's grid, the band rows
 * and the plots. Runs in a worker thread (report-thread.ts) so the API's event loop stays free.
 */
import { Worker } from 'node:worker_threads';
import { calculateSpectrum } from '@quietglass/shared/optics/batch';
import { reflectedColour } from '@quietglass/shared/optics/colour';
import { evaluateMask, type LimitBand } from '@quietglass/shared/optics/mask';
import { parseStack, type OpticalStack, type StackDescription } from '@quietglass/shared/optics/stack';
import type { ReportBandRow, ReportSummary } from '@quietglass/shared/reports';
import type { PlotSeries } from './report-pdf.js';
import { elementAt } from '@quietglass/shared/checked';

export interface DesignedInput {
  bands: LimitBand[];
  stack: StackDescription;
  back: 'none' | 'incoherent';
}

export interface DesignedOutput {
  summary: ReportSummary;
  plots: PlotSeries[];
  colour: ReportSummary['colour'];
}

export function rule(b: LimitBand): string {
  if (b.max_percent !== undefined)
    return `${b.quantity} ≤ ${b.max_percent} % over ${b.from_nm}–${b.to_nm} nm`;
  if (b.min_percent !== undefined)
    return `${b.quantity} ≥ ${b.min_percent} % over ${b.from_nm}–${b.to_nm} nm`;
  return `${b.quantity} = ${b.target_percent} ± ${b.tolerance_percent} % over ${b.from_nm}–${b.to_nm} nm`;
}

/** What a report row says of the band itself, before its result: index, label, rule, angles. */
export function bandDescription(
  bands: readonly LimitBand[],
  i: number,
): Pick<ReportBandRow, 'band' | 'label' | 'rule' | 'angles' | 'polarisation'> {
  const band = elementAt(bands, i, 'the limit bands');
  return {
    band: i,
    label: band.label ?? '',
    rule: rule(band),
    angles: (band.angles_deg ?? [0]).join(', ') + '°',
    polarisation: band.polarisation ?? 'avg',
  };
}

/** Summary, plots and colour of the designed values (in the calling thread). */
export function computeDesigned(input: DesignedInput): DesignedOutput {
  const stack = parseStack(input.stack);
  return {
    summary: designedSummary(input.bands, stack, input.back),
    plots: designedPlots(input.bands, stack, input.back),
    colour: colourOf(stack, input.back),
  };
}

export function colourOf(stack: OpticalStack, back: 'none' | 'incoherent'): ReportSummary['colour'] {
  try {
    const c = reflectedColour(stack, { angleDeg: 0, back });
    return { L: c.L, a: c.a, b: c.b, Rv: c.Rv };
  } catch {
    return null;
  }
}

function designedSummary(
  bands: LimitBand[],
  stack: OpticalStack,
  back: 'none' | 'incoherent',
): ReportSummary {
  const result = evaluateMask({ bands }, stack, { back });
  const rows: ReportBandRow[] = result.bands.map((b, i) => ({
    ...bandDescription(bands, i),
    evaluated: true,
    pass: b.pass,
    worstMargin: b.worstMargin,
    worstAtNm: b.worstAt.wavelengthNm,
    worstAtDeg: b.worstAt.angleDeg,
    valuePercent: b.worstAt.valuePercent,
  }));
  return {
    source: 'designed',
    pass: result.pass,
    worstMargin: result.worstMargin,
    bands: rows,
    colour: null,
  };
}

/** One plot per quantity, angle and polarisation the mask names. */
function designedPlots(bands: LimitBand[], stack: OpticalStack, back: 'none' | 'incoherent'): PlotSeries[] {
  const groups = new Map<
    string,
    { quantity: 'R' | 'T'; angle: number; pol: 's' | 'p' | 'avg'; bands: LimitBand[] }
  >();
  for (const b of bands) {
    for (const angle of b.angles_deg ?? [0]) {
      const pol = b.polarisation ?? 'avg';
      const key = `${b.quantity}|${angle}|${pol}`;
      const g = groups.get(key) ?? { quantity: b.quantity, angle, pol, bands: [] };
      g.bands.push(b);
      groups.set(key, g);
    }
  }
  return [...groups.values()].map((g) => {
    let lo = Infinity;
    let hi = -Infinity;
    for (const b of g.bands) {
      lo = Math.min(lo, b.from_nm);
      hi = Math.max(hi, b.to_nm);
    }
    const pad = Math.max(5, (hi - lo) * 0.05);
    const from = Math.max(1, lo - pad);
    const to = hi + pad;
    const wavelengthsNm = Array.from({ length: 301 }, (_, i) => from + ((to - from) * i) / 300);
    const s = calculateSpectrum(
      stack,
      { wavelengthsNm, anglesDeg: [g.angle], polarisations: [g.pol] },
      { back },
    );
    const values = g.quantity === 'R' ? s.R : s.T;
    return {
      title: `${g.quantity} at ${g.angle}°, ${g.pol === 'avg' ? 'unpolarised' : `${g.pol}-polarised`} (designed)`,
      quantity: g.quantity,
      wavelengthsNm,
      valuesPercent: Array.from(values, (v) => v * 100),
      bands: g.bands,
    };
  });
}

/** Heap of a report thread, MB. */
const REPORT_THREAD_MB = 1024;

/**
 * computeDesigned in a worker thread of its own. From compiled code the thread runs
 * report-thread.js; from TypeScript source (tests) it loads report-thread.ts through tsx.
 */
export function computeDesignedOffThread(input: DesignedInput): Promise<DesignedOutput> {
  const here = import.meta.url;
  const options = { workerData: input, resourceLimits: { maxOldGenerationSizeMb: REPORT_THREAD_MB } };
  const worker = here.endsWith('.ts')
    ? new Worker(
        `import('tsx/esm/api').then(({ register }) => { register(); return import(${JSON.stringify(new URL('./report-thread.ts', here).href)}); })`,
        { ...options, eval: true },
      )
    : new Worker(new URL('./report-thread.js', here), options);
  return new Promise((resolve, reject) => {
    worker.once('message', (m: { ok: true; output: DesignedOutput } | { ok: false; message: string }) => {
      if (m.ok) resolve(m.output);
      else reject(new Error(m.message));
    });
    worker.once('error', reject);
    worker.once('exit', (code) => reject(new Error(`the report thread stopped (exit ${code})`)));
  });
}
