import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import type { QuoteView } from './get-quotes';

export function getQuote(id: number, signal?: AbortSignal): Promise<QuoteView> {
  return apiClient.get<QuoteView>(`/quotes/${id}`, signal);
}

export function getQuoteQueryOptions(id: number) {
  return queryOptions({
    queryKey: ['quotes', 'detail', id] as const,
    queryFn: ({ signal }) => getQuote(id, signal),
  });
}

export function useQuote(id: number) {
  return useQuery(getQuoteQueryOptions(id));
}
