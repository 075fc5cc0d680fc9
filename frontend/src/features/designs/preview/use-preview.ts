import { useEffect, useState } from 'react';
import type { PreviewRequest, PreviewResult } from '../../../lib/preview/compute-preview';
import type { PreviewCompute } from '../../../lib/preview/preview-context';

/** Wait after the last change before computing: typing a thickness fires one computation. */
export const PREVIEW_DEBOUNCE_MS = 150;

export interface PreviewState {
  result: PreviewResult | null;
  error: string | null;
  /** A newer request than the shown result is waiting or being computed. */
  pending: boolean;
}

/**
 * Computes `request` (debounced) and keeps the newest answer; answers to superseded requests are
 * dropped. A null request clears nothing: the last result stays while the inputs are invalid.
 */
export function usePreview(
  computer: PreviewCompute,
  request: PreviewRequest | null,
  delayMs = PREVIEW_DEBOUNCE_MS,
): PreviewState {
  const [state, setState] = useState<PreviewState>({ result: null, error: null, pending: false });

  useEffect(() => {
    if (!request) return;
    let current = true;
    setState((s) => (s.pending ? s : { ...s, pending: true }));
    const timer = setTimeout(() => {
      computer.compute(request).then(
        (result) => {
          if (current) setState({ result, error: null, pending: false });
        },
        (error: unknown) => {
          if (current)
            setState((s) => ({
              result: s.result,
              error: error instanceof Error ? error.message : String(error),
              pending: false,
            }));
        },
      );
    }, delayMs);
    return () => {
      current = false;
      clearTimeout(timer);
    };
  }, [computer, request, delayMs]);

  return state;
}
