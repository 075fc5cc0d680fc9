import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import type { OutboxMessageView } from './get-outbox';

export function getOutboxMessage(id: number, signal?: AbortSignal): Promise<OutboxMessageView> {
  return apiClient.get<OutboxMessageView>(`/outbox/${id}`, signal);
}

export function getOutboxMessageQueryOptions(id: number) {
  return queryOptions({
    queryKey: ['outbox', 'detail', id] as const,
    queryFn: ({ signal }) => getOutboxMessage(id, signal),
  });
}

/** One message; nothing is fetched for a null id (none chosen). */
export function useOutboxMessage(id: number | null) {
  return useQuery({ ...getOutboxMessageQueryOptions(id ?? 0), enabled: id !== null });
}
