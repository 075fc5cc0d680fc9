import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CustomerContact } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

/** A customer of the shop, as the API returns it. */
export interface CustomerView {
  id: number;
  name: string;
  contactEmail: string | null;
  notes: string;
  contacts: CustomerContact[];
  /** Set while archived (hidden from pickers, records kept). */
  archivedAt: string | null;
  version: number;
}

export interface CustomerFilter {
  /** Archived customers too (the Customers page); pickers leave them out. */
  includeArchived?: boolean;
}

/** Customers (office roles); without archived ones unless asked. */
export function getCustomers(filter: CustomerFilter = {}, signal?: AbortSignal): Promise<CustomerView[]> {
  return apiClient.get<CustomerView[]>(
    `/customers${filter.includeArchived ? '?includeArchived=true' : ''}`,
    signal,
  );
}

/** Prefix of every customer list's key, for invalidation. */
export const CUSTOMER_LISTS_KEY = ['customers', 'list'] as const;

export function getCustomersQueryOptions(filter: CustomerFilter = {}) {
  return queryOptions({
    queryKey: [...CUSTOMER_LISTS_KEY, { includeArchived: filter.includeArchived ?? false }] as const,
    queryFn: ({ signal }) => getCustomers(filter, signal),
  });
}

export function useCustomers(filter: CustomerFilter = {}) {
  return useQuery(getCustomersQueryOptions(filter));
}
