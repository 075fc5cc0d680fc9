import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { QuoteDecision } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import type { QuoteView } from './get-quotes';
import { quoteChanged } from './quote-changed';

/** The customer's answer to a sent quote. */
export function decideQuote({ id, status }: { id: number; status: QuoteDecision }): Promise<QuoteView> {
  return apiClient.post<QuoteView>(`/quotes/${id}/decision`, { status });
}

export function useDecideQuote() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: decideQuote,
    meta: { errorShownInline: true },
    onSuccess: (quote) => quoteChanged(queryClient, quote),
  });
}
