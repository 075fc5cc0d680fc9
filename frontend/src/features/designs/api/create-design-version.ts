import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DesignVersionView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { storeDesignVersion } from './get-design-version';

export interface CreateDesignVersionInput {
  designId: number;
  /** The version copied into the new draft. */
  fromNumber: number;
}

export function createDesignVersion({
  designId,
  fromNumber,
}: CreateDesignVersionInput): Promise<DesignVersionView> {
  return apiClient.post<DesignVersionView>(`/designs/${designId}/versions`, { fromNumber });
}

/** Starts a new draft from a version (of any status). */
export function useCreateDesignVersion() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createDesignVersion,
    onSuccess: (view) => storeDesignVersion(queryClient, view),
  });
}
