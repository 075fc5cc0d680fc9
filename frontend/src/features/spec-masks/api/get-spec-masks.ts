import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LimitBand, SpecMaskKind } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

/** A customer's spec mask: one revision of their drawing's limit bands. */
export interface SpecMaskView {
  id: number;
  name: string;
  customer: { id: number; name: string };
  revision: string;
  /** The customer's own specification, or the shop's internal design target. */
  kind: SpecMaskKind;
  bands: LimitBand[];
  notes: string;
  version: number;
  updatedAt: string;
}

export interface SpecMaskFilter {
  /** Only this customer's masks; every mask when omitted. */
  customerId?: number;
}

export function getSpecMasks(filter: SpecMaskFilter, signal?: AbortSignal): Promise<SpecMaskView[]> {
  const query = filter.customerId === undefined ? '' : `?customerId=${filter.customerId}`;
  return apiClient.get<SpecMaskView[]>(`/spec-masks${query}`, signal);
}

/** Prefix of every mask list's query key (all customer filters), for invalidation. */
export const SPEC_MASK_LISTS_KEY = ['spec-masks', 'list'] as const;

export function getSpecMasksQueryOptions(filter: SpecMaskFilter = {}) {
  return queryOptions({
    queryKey: [...SPEC_MASK_LISTS_KEY, { customerId: filter.customerId ?? null }] as const,
    queryFn: ({ signal }) => getSpecMasks(filter, signal),
  });
}

export function useSpecMasks(filter: SpecMaskFilter = {}, options: { enabled?: boolean } = {}) {
  return useQuery({ ...getSpecMasksQueryOptions(filter), enabled: options.enabled ?? true });
}
