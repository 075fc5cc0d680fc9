import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DesignVersionView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { getDesignHistoryQueryOptions } from './get-design-history';

/** Lifecycle steps after submission: draft → submitted is the version editor's Submit. */
export type ReviewAction = 'approve' | 'return' | 'release' | 'retire';

export interface TransitionVersionInput {
  designId: number;
  number: number;
  action: ReviewAction;
  /** Required to return a version (say what to change); optional otherwise. */
  comment?: string;
}

export function transitionVersion({
  designId,
  number,
  action,
  comment,
}: TransitionVersionInput): Promise<DesignVersionView> {
  return apiClient.post<DesignVersionView>(
    `/designs/${designId}/versions/${number}/${action}`,
    comment ? { comment } : {},
  );
}

/** Moves a version on in its lifecycle; the panel shows refusals (403 four-eyes, 409 order) itself. */
export function useTransitionVersion() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: transitionVersion,
    meta: { errorShownInline: true },
    onSuccess: (view) =>
      queryClient.invalidateQueries({ queryKey: getDesignHistoryQueryOptions(view.designId).queryKey }),
  });
}
