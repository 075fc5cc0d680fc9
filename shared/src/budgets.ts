/*
 * Work budgets of the compute queue: how much one job may ask of a worker, and how many jobs one
 * user may have waiting or running. Work is counted in layer-evaluations (one layer's
 * characteristic matrix at one wavelength, angle and polarisation), the engine's unit of speed;
 * the engine does 17–26 million of them per second on one thread of the reference machine
 * (README, Benchmarks), so the largest allowed job runs for about a minute or two.
 */

/** Most layer-evaluations of one job, by kind. */
export const JOB_WORK_LIMITS = {
  analysis: 1_000_000_000,
  fit: 2_000_000_000,
  grow: 2_000_000_000,
  yield: 4_000_000_000,
  diagnosis: 2_000_000_000,
} as const;

export type BudgetedKind = keyof typeof JOB_WORK_LIMITS;

/** Jobs one user may have queued or running at once (the API may be configured otherwise). */
export const MAX_ACTIVE_JOBS_PER_USER = 4;

/** Iterations of needle refinement counted per Grow layers step. */
const GROW_REFINE_ITERATIONS = 20;

/** What a job's size is made of; only the fields of its kind are read. */
export interface JobSize {
  layers: number;
  /** Wavelength × angle samples: of the grid (analysis) or of the mask / measurement. */
  samples: number;
  /** Polarisations computed per sample (2 for s and p, from which avg follows). */
  polarisations?: number;
  iterations?: number;
  trials?: number;
  /** Yield forecast: trials that also run each layer's sensitivity. */
  sensitivityTrials?: number;
  /** Grow layers: most layers and steps. */
  maxLayers?: number;
  steps?: number;
}

/** Estimated layer-evaluations of a job; `explain` names the factors for messages. */
export function jobWork(kind: BudgetedKind, size: JobSize): { work: number; explain: string } {
  const pol = size.polarisations ?? 2;
  const L = size.layers;
  const S = size.samples;
  switch (kind) {
    case 'analysis':
      return {
        work: L * S * pol,
        explain: `${L} layers × ${S} wavelength-angle points × ${pol} polarisations`,
      };
    case 'fit':
    case 'diagnosis': {
      // Each iteration evaluates the spectrum and its derivative for every layer.
      const it = size.iterations ?? 1;
      return {
        work: it * (L + 1) * L * S * pol,
        explain: `${it} iterations × ${L} layers × ${L + 1} spectra × ${S} samples`,
      };
    }
    case 'grow': {
      const M = Math.max(L, size.maxLayers ?? L);
      const steps = size.steps ?? 1;
      return {
        work: steps * GROW_REFINE_ITERATIONS * (M + 1) * M * S * pol,
        explain: `${steps} steps × up to ${M} layers × ${S} samples`,
      };
    }
    case 'yield': {
      const trials = size.trials ?? 1;
      const sens = Math.min(trials, size.sensitivityTrials ?? 0);
      return {
        work: L * S * pol * (trials + sens * L),
        explain: `${trials} trials × ${L} layers × ${S} samples${sens > 0 ? `, with ${sens} sensitivity trials` : ''}`,
      };
    }
  }
}

const LABELS: Record<BudgetedKind, string> = {
  analysis: 'This analysis',
  fit: 'This Fit to mask',
  grow: 'This Grow layers',
  yield: 'This Yield forecast',
  diagnosis: 'This Run diagnosis',
};

/** Null when the job fits its budget, else the message to show (it states the limit). */
export function overBudget(kind: BudgetedKind, size: JobSize): string | null {
  const { work, explain } = jobWork(kind, size);
  const limit = JOB_WORK_LIMITS[kind];
  if (work <= limit) return null;
  return `${LABELS[kind]} needs about ${work.toExponential(1)} layer-evaluations (${explain}); one job may use at most ${limit.toExponential(1)}. Ask for fewer layers, samples, iterations or trials.`;
}

/** The message when a user already has the most jobs queued or running. */
export function tooManyActiveJobs(active: number, limit = MAX_ACTIVE_JOBS_PER_USER): string {
  return `You already have ${active} calculations queued or running; at most ${limit} per user. Wait for one to finish or cancel one.`;
}

/** Wavelength × angle samples of a mask's bands (each band's own step, ends included). */
export function maskSamples(
  bands: readonly { from_nm: number; to_nm: number; step_nm?: number; angles_deg?: readonly number[] }[],
): number {
  let total = 0;
  for (const b of bands) {
    const step = b.step_nm ?? 1;
    total += (Math.max(0, Math.ceil((b.to_nm - b.from_nm) / step - 1e-9)) + 1) * (b.angles_deg?.length ?? 1);
  }
  return total;
}
