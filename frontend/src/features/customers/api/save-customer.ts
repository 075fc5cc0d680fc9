import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CustomerInput } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';
import { CUSTOMER_LISTS_KEY, getCustomersQueryOptions, type CustomerView } from './get-customers';

/** A new customer (id null) or an edit from `version`; 409 when someone else saved it first. */
export interface SaveCustomerInput {
  id: number | null;
  version: number;
  customer: CustomerInput;
}

export function saveCustomer({ id, version, customer }: SaveCustomerInput): Promise<CustomerView> {
  return id === null
    ? apiClient.post<CustomerView>('/customers', customer)
    : apiClient.put<CustomerView>(`/customers/${id}`, { ...customer, version });
}

/**
 * Saves a customer. A new one is put into the pickers' list at once, so a picker can select it
 * before the list is fetched again.
 */
export function useSaveCustomer() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveCustomer,
    meta: { errorShownInline: true },
    onSuccess: (saved) => {
      queryClient.setQueryData(getCustomersQueryOptions().queryKey, (list) =>
        list && !list.some((c) => c.id === saved.id)
          ? [...list, saved].sort((a, b) => a.name.localeCompare(b.name))
          : list?.map((c) => (c.id === saved.id ? saved : c)),
      );
      return queryClient.invalidateQueries({ queryKey: CUSTOMER_LISTS_KEY });
    },
  });
}

export interface ArchiveCustomerInput {
  id: number;
  version: number;
  /** true archives, false restores. */
  archived: boolean;
}

export function archiveCustomer({ id, version, archived }: ArchiveCustomerInput): Promise<CustomerView> {
  return apiClient.post<CustomerView>(`/customers/${id}/${archived ? 'archive' : 'restore'}`, { version });
}

/** Archives or restores a customer (its records stay). */
export function useArchiveCustomer() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: archiveCustomer,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: CUSTOMER_LISTS_KEY }),
  });
}
