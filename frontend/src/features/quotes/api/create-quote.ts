import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import type { QuantityBreak, QuoteView } from './get-quotes';
import { quoteChanged } from './quote-changed';

/** QuoteDto. */
export interface QuoteInput {
  customerId: number;
  contactEmail: string;
  designId: number;
  versionNumber: number;
  specMaskId: number;
  partDescription: string;
  quantityBreaks: QuantityBreak[];
  currency: string;
  leadTimeDays: number;
  validUntil: string;
  terms: string;
}

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
