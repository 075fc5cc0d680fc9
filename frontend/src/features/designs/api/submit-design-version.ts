import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DesignVersionView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { storeDesignVersion } from './get-design-version';

export interface SubmitDesignVersionInput {
  designId: number;
  number: number;
  /** The row version the engineer reviewed: what is submitted is what they saw. */
  rowVersion: number;
}

export function submitDesignVersion({
  designId,
  number,
  rowVersion,
}: SubmitDesignVersionInput): Promise<DesignVersionView> {
  return apiClient.post<DesignVersionView>(`/designs/${designId}/versions/${number}/submit`, { rowVersion });
}

/** Submits a draft for approval; it cannot change afterwards. */
export function useSubmitDesignVersion() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: submitDesignVersion,
    meta: { errorShownInline: true },
    onSuccess: (view) => storeDesignVersion(queryClient, view),
  });
}
