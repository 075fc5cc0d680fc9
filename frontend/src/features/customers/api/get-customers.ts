import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';

/** A customer of the shop, as the API returns it. */
export interface CustomerView {
  id: number;
  name: string;
  contactEmail: string | null;
  notes: string;
}

/** Every customer (office roles). */
export function getCustomers(signal?: AbortSignal): Promise<CustomerView[]> {
  return apiClient.get<CustomerView[]>('/customers', signal);
}

export function getCustomersQueryOptions() {
  return queryOptions({
    queryKey: ['customers', 'list'] as const,
    queryFn: ({ signal }) => getCustomers(signal),
  });
}

export function useCustomers() {
  return useQuery(getCustomersQueryOptions());
}
