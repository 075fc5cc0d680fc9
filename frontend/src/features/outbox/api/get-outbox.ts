import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiClient, apiUrl } from '../../../lib/api-client';

export interface OutboxAttachmentView {
  id: number;
  filename: string;
  contentType: string;
  /** Bytes. */
  size: number;
}

/** A message the local SMTP fake received. */
export interface OutboxMessageView {
  id: number;
  from: string;
  to: string;
  subject: string;
  text: string;
  receivedAt: string;
  attachments: OutboxAttachmentView[];
}

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

/** Where the browser fetches an attachment (served inline with its own content type). */
export function outboxAttachmentUrl(messageId: number, attachmentId: number): string {
  return apiUrl(`/outbox/${messageId}/attachments/${attachmentId}`);
}
