/// <reference types="node" />
/*
 * Worker-thread side of parallel.ts: computes one wavelength slice of a grid and writes it into the
 * shared output arrays at the slice's place.
 */
import { parentPort } from 'node:worker_threads';
import {
  computeSpectrum,
  createSpectrumOutput,
  createSpectrumPlan,
  type Polarisation,
} from '../optics/batch.js';
import type { BackSurface } from '../optics/batch.js';
import { OpticsInputError } from '../optics/errors.js';
import type { OpticalStack } from '../optics/stack.js';

/** Message from the pool to a worker. */
export interface SliceJob {
  id: number;
  stack: OpticalStack;
  wavelengthsNm: number[];
  anglesDeg: number[];
  polarisations: Polarisation[];
  options: { back: BackSurface; amplitudes: boolean };
  /** Index of this slice's first wavelength in the whole grid, and the whole grid's count. */
  wavelengthOffset: number;
  totalWavelengths: number;
  R: SharedArrayBuffer;
  T: SharedArrayBuffer;
  A: SharedArrayBuffer;
  r: SharedArrayBuffer | null;
  t: SharedArrayBuffer | null;
}

/** First message of a worker, once it listens for jobs. */
export interface WorkerReady {
  ready: true;
}

/** Reply from a worker. */
export type SliceReply =
  { id: number; ok: true } | { id: number; ok: false; message: string; field?: string };

function runSlice(job: SliceJob): void {
  const plan = createSpectrumPlan(
    job.stack,
    { wavelengthsNm: job.wavelengthsNm, anglesDeg: job.anglesDeg, polarisations: job.polarisations },
    job.options,
  );
  const local = computeSpectrum(createSpectrumOutput(plan), plan);
  const nW = job.wavelengthsNm.length;
  const rows = job.anglesDeg.length * job.polarisations.length;
  const copy = (from: Float64Array, to: SharedArrayBuffer, width: number) => {
    const target = new Float64Array(to);
    for (let row = 0; row < rows; row++) {
      const src = from.subarray(row * nW * width, (row + 1) * nW * width);
      target.set(src, (row * job.totalWavelengths + job.wavelengthOffset) * width);
    }
  };
  copy(local.R, job.R, 1);
  copy(local.T, job.T, 1);
  copy(local.A, job.A, 1);
  if (local.r && job.r) copy(local.r, job.r, 2);
  if (local.t && job.t) copy(local.t, job.t, 2);
}

parentPort?.on('message', (job: SliceJob) => {
  let reply: SliceReply;
  try {
    runSlice(job);
    reply = { id: job.id, ok: true };
  } catch (error) {
    reply =
      error instanceof OpticsInputError
        ? { id: job.id, ok: false, message: error.problem, field: error.field }
        : { id: job.id, ok: false, message: error instanceof Error ? error.message : String(error) };
  }
  parentPort?.postMessage(reply);
});
parentPort?.postMessage({ ready: true } satisfies WorkerReady);
