import { queryOptions, useQuery } from '@tanstack/react-query';
import type { QuoteView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export { QUOTE_STATUSES } from '@quietglass/shared';
export type { QuantityBreak, QuoteEvent, QuoteStatus, QuoteView } from '@quietglass/shared';

export function getQuotes(signal?: AbortSignal): Promise<QuoteView[]> {
  return apiClient.get<QuoteView[]>('/quotes', signal);
}

export function getQuotesQueryOptions() {
  return queryOptions({
    queryKey: ['quotes', 'list'] as const,
    queryFn: ({ signal }) => getQuotes(signal),
  });
}

export function useQuotes() {
  return useQuery(getQuotesQueryOptions());
}
