/*
 * The shop's settings as every page reads them (header name and logo, design defaults); the
 * shop-settings feature edits them.
 */
import { queryOptions, useQuery } from '@tanstack/react-query';
import { DEFAULT_TARGET_MARGIN_PERCENT, type ShopSettingsView } from '@quietglass/shared';
import { apiClient } from './api-client';

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

/**
 * The target margin the optimisation forms start from: the shop's, once loaded; the engine's
 * default while loading or when the settings cannot be read (the API applies the shop's anyway
 * when a request names none).
 */
export function useShopTargetMargin(): { percent: number; loaded: boolean } {
  const settings = useShopSettings();
  return settings.data
    ? { percent: settings.data.targetMarginPercent, loaded: true }
    : { percent: DEFAULT_TARGET_MARGIN_PERCENT, loaded: settings.isError };
}
