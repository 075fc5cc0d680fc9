import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { QuoteInput } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import type { QuoteView } from './get-quotes';
import { quoteChanged } from './quote-changed';

export interface UpdateQuoteInput {
  id: number;
  /** The version the edit started from; a stale one gets 409. */
  version: number;
  changes: QuoteInput;
}

export function updateQuote({ id, version, changes }: UpdateQuoteInput): Promise<QuoteView> {
  return apiClient.put<QuoteView>(`/quotes/${id}`, { ...changes, version });
}

/** Edits a draft quote; the form shows errors itself. */
export function useUpdateQuote() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateQuote,
    meta: { errorShownInline: true },
    onSuccess: (quote) => quoteChanged(queryClient, quote),
  });
}
