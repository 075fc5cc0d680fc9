import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import type { QuoteView } from './get-quotes';
import { quoteChanged } from './quote-changed';

export function attachReports({ id, reportIds }: { id: number; reportIds: number[] }): Promise<QuoteView> {
  return apiClient.post<QuoteView>(`/quotes/${id}/reports`, { reportIds });
}

/** Attaches compliance reports of the quote's design version; the dialog shows errors itself. */
export function useAttachReports() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: attachReports,
    meta: { errorShownInline: true },
    onSuccess: (quote) => quoteChanged(queryClient, quote),
  });
}
