import {
  answerPreviewRequest,
  createPreviewCalculator,
  type PreviewRequest,
  type PreviewResult,
  type PreviewWorkerRequest,
  type PreviewWorkerResponse,
} from './compute-preview';

/** Computes previews somewhere (a worker, or in place); every request gets its own answer. */
export interface PreviewComputer {
  compute(request: PreviewRequest): Promise<PreviewResult>;
  dispose(): void;
}

/** The engine in a module Web Worker: the page stays responsive while spectra are computed. */
export function createWorkerPreviewComputer(): PreviewComputer {
  const worker = new Worker(new URL('./preview.worker.ts', import.meta.url), { type: 'module' });
  const pending = new Map<number, { resolve: (r: PreviewResult) => void; reject: (e: Error) => void }>();
  let nextId = 1;

  worker.onmessage = (event: MessageEvent<PreviewWorkerResponse>) => {
    const answer = event.data;
    const waiting = pending.get(answer.id);
    if (!waiting) return;
    pending.delete(answer.id);
    if (answer.ok) waiting.resolve(answer.result);
    else waiting.reject(new Error(answer.error));
  };
  worker.onerror = (event: ErrorEvent) => {
    const error = new Error(`The preview worker failed: ${event.message || 'unknown error'}`);
    for (const waiting of pending.values()) waiting.reject(error);
    pending.clear();
  };

  return {
    compute(request) {
      const id = nextId++;
      return new Promise<PreviewResult>((resolve, reject) => {
        pending.set(id, { resolve, reject });
        const message: PreviewWorkerRequest = { id, request };
        worker.postMessage(message);
      });
    },
    dispose() {
      worker.terminate();
      const error = new Error('The preview was closed');
      for (const waiting of pending.values()) waiting.reject(error);
      pending.clear();
    },
  };
}

/**
 * The same computation on the calling thread, answering asynchronously like the worker does. For
 * tests (jsdom has no Worker) and for browsers without module workers.
 */
export function createInlinePreviewComputer(): PreviewComputer {
  const calculator = createPreviewCalculator();
  let nextId = 1;
  return {
    async compute(request) {
      await Promise.resolve();
      const answer = answerPreviewRequest(calculator, { id: nextId++, request });
      if (!answer.ok) throw new Error(answer.error);
      return answer.result;
    },
    dispose() {},
  };
}
