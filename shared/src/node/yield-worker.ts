/// <reference types="node" />
/*
 * Worker-thread side of yield-parallel.ts: runs chunks of Yield forecast trials and posts each
 * part back with its arrays transferred. The runner (plan, buffers) is kept for the job it last
 * ran, so the chunks of one forecast build it once per thread.
 */
import { parentPort } from 'node:worker_threads';
import { OpticsInputError } from '../optics/errors.js';
import { createYieldRunner, type YieldJob, type YieldPart, type YieldRunner } from '../optimise/yield.js';

/** Message from the pool to a worker: run trials [from, to) of job `id`. */
export interface YieldChunk {
  id: number;
  job: YieldJob;
  from: number;
  to: number;
}

/** First message of a worker, once it listens for chunks. */
export interface YieldWorkerReady {
  ready: true;
}

/** Reply from a worker. */
export type YieldChunkReply =
  { id: number; ok: true; part: YieldPart } | { id: number; ok: false; message: string; field?: string };

let current: { id: number; runner: YieldRunner } | null = null;

parentPort?.on('message', (chunk: YieldChunk) => {
  let reply: YieldChunkReply;
  const transfer: ArrayBuffer[] = [];
  try {
    if (!current || current.id !== chunk.id) current = { id: chunk.id, runner: createYieldRunner(chunk.job) };
    const part = current.runner.run(chunk.from, chunk.to);
    for (const values of [part.worstMargins, part.envelopeValues, part.sensitivityMargins]) {
      if (values instanceof Float64Array) transfer.push(values.buffer as ArrayBuffer);
    }
    reply = { id: chunk.id, ok: true, part };
  } catch (error) {
    reply =
      error instanceof OpticsInputError
        ? { id: chunk.id, ok: false, message: error.problem, field: error.field }
        : { id: chunk.id, ok: false, message: error instanceof Error ? error.message : String(error) };
  }
  parentPort?.postMessage(reply, transfer);
});
parentPort?.postMessage({ ready: true } satisfies YieldWorkerReady);
