import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CustomerRecords } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export function getCustomerRecords(id: number, signal?: AbortSignal): Promise<CustomerRecords> {
  return apiClient.get<CustomerRecords>(`/customers/${id}/records`, signal);
}

export function getCustomerRecordsQueryOptions(id: number) {
  return queryOptions({
    queryKey: ['customers', 'records', id] as const,
    queryFn: ({ signal }) => getCustomerRecords(id, signal),
  });
}

export function useCustomerRecords(id: number) {
  return useQuery(getCustomerRecordsQueryOptions(id));
}
