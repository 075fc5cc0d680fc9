import { queryOptions, useQuery } from '@tanstack/react-query';
import type { OutboxMessageView } from '@quietglass/shared';
import { apiClient, apiUrl } from '../../../lib/api-client';

export type { OutboxAttachmentView, OutboxMessageView } from '@quietglass/shared';

export function getOutbox(signal?: AbortSignal): Promise<OutboxMessageView[]> {
  return apiClient.get<OutboxMessageView[]>('/outbox', signal);
}

export function getOutboxQueryOptions() {
  return queryOptions({
    queryKey: ['outbox', 'list'] as const,
    queryFn: ({ signal }) => getOutbox(signal),
  });
}

export function useOutbox() {
  return useQuery(getOutboxQueryOptions());
}

/** Where the browser downloads an attachment (always as a file, never shown as a page). */
export function outboxAttachmentUrl(messageId: number, attachmentId: number): string {
  return apiUrl(`/outbox/${messageId}/attachments/${attachmentId}`);
}
