import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { QuoteInput } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import type { QuoteView } from './get-quotes';
import { quoteChanged } from './quote-changed';

export function createQuote(input: QuoteInput): Promise<QuoteView> {
  return apiClient.post<QuoteView>('/quotes', input);
}

/** A new draft quote; the form shows errors itself. */
export function useCreateQuote() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createQuote,
    meta: { errorShownInline: true },
    onSuccess: (quote) => quoteChanged(queryClient, quote),
  });
}
