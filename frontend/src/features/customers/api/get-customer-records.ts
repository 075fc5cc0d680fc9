import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';

/** One record of a customer, as the customer's page lists it. */
export interface CustomerRecordLink {
  id: number;
  title: string;
  status: string;
  at: string;
}

export interface CustomerRecords {
  masks: CustomerRecordLink[];
  designs: CustomerRecordLink[];
  reports: CustomerRecordLink[];
  quotes: CustomerRecordLink[];
}

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
