import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import { getQuoteQueryOptions } from './get-quote';
import type { QuoteView } from './get-quotes';
import { quoteChanged } from './quote-changed';

export function sendQuote(id: number): Promise<QuoteView> {
  return apiClient.post<QuoteView>(`/quotes/${id}/send`);
}

/**
 * E-mails the quote with its reports. A failed send leaves it a draft with the error recorded, so
 * the quote is fetched again either way; the page shows the error itself.
 */
export function useSendQuote() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: sendQuote,
    meta: { errorShownInline: true },
    onSuccess: (quote) => quoteChanged(queryClient, quote),
    onError: (_error, id) => queryClient.invalidateQueries({ queryKey: getQuoteQueryOptions(id).queryKey }),
  });
}
