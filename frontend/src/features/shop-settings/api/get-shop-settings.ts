import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ShopSettingsView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export type { ShopSettingsView } from '@quietglass/shared';

export function getShopSettings(signal?: AbortSignal): Promise<ShopSettingsView> {
  return apiClient.get<ShopSettingsView>('/shop-settings', signal);
}

export function getShopSettingsQueryOptions() {
  return queryOptions({
    queryKey: ['shop-settings'] as const,
    queryFn: ({ signal }) => getShopSettings(signal),
  });
}

export function useShopSettings() {
  return useQuery(getShopSettingsQueryOptions());
}
