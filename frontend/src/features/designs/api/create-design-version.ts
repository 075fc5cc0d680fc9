import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DesignVersionContent, DesignVersionView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { storeDesignVersion } from './get-design-version';

export interface CreateDesignVersionInput {
  designId: number;
  /** The version copied into the new draft. */
  fromNumber: number;
  /** Content for the draft instead of the copy (an imported stack file), and the file's name. */
  content?: DesignVersionContent;
  sourceFile?: string;
}

export function createDesignVersion({
  designId,
  ...body
}: CreateDesignVersionInput): Promise<DesignVersionView> {
  return apiClient.post<DesignVersionView>(`/designs/${designId}/versions`, body);
}

/** Starts a new draft from a version (of any status). */
export function useCreateDesignVersion() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createDesignVersion,
    onSuccess: (view) => storeDesignVersion(queryClient, view),
  });
}
