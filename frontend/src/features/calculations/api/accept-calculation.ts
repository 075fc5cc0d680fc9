import { useMutation } from '@tanstack/react-query';
import type { DesignVersionView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export interface AcceptInput {
  calculationId: number;
  /** Grow layers: which kept step's stack becomes the new version (default the final one). */
  step?: number;
}

/** A completed Fit to mask or Grow layers result becomes a new draft version of its design. */
export function acceptCalculation({ calculationId, step }: AcceptInput): Promise<DesignVersionView> {
  return apiClient.post<DesignVersionView>(
    `/calculations/${calculationId}/accept`,
    step === undefined ? {} : { step },
  );
}

/**
 * Accepts a result; `storeVersion` (the page's: it caches the new version and refreshes the design's
 * version list) has finished before the mutation resolves.
 */
export function useAcceptCalculation(storeVersion: (view: DesignVersionView) => Promise<void>) {
  return useMutation({
    mutationFn: acceptCalculation,
    meta: { errorShownInline: true },
    onSuccess: (view) => storeVersion(view),
  });
}
