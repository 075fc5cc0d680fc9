import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DesignVersionContent, DesignVersionView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { storeDesignVersion } from './get-design-version';

export interface SaveDesignVersionInput {
  designId: number;
  number: number;
  content: DesignVersionContent;
  /** The row version the edit started from; someone else's save in between gives 409. */
  rowVersion: number;
}

export function saveDesignVersion({
  designId,
  number,
  content,
  rowVersion,
}: SaveDesignVersionInput): Promise<DesignVersionView> {
  return apiClient.put<DesignVersionView>(`/designs/${designId}/versions/${number}`, {
    ...content,
    rowVersion,
  });
}

/** Saves a draft; the workspace shows a 409 itself with its reload offer. */
export function useSaveDesignVersion() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveDesignVersion,
    meta: { errorShownInline: true },
    onSuccess: (view) => storeDesignVersion(queryClient, view),
  });
}
