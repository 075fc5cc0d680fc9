import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LogoType } from '@quietglass/shared';
import { apiClient, apiRequest } from '../../../lib/api-client';
import { getShopSettingsQueryOptions, type ShopSettingsView } from './get-shop-settings';

export type ShopSettingsChange =
  | { kind: 'name'; shopName: string; version: number }
  | { kind: 'logo'; contentType: LogoType; dataBase64: string; version: number }
  | { kind: 'remove-logo'; version: number }
  | { kind: 'target-margin'; targetMarginPercent: number; version: number };

export function saveShopSettings(change: ShopSettingsChange): Promise<ShopSettingsView> {
  if (change.kind === 'name')
    return apiClient.put<ShopSettingsView>('/shop-settings', {
      shopName: change.shopName,
      version: change.version,
    });
  if (change.kind === 'target-margin')
    return apiClient.put<ShopSettingsView>('/shop-settings/target-margin', {
      targetMarginPercent: change.targetMarginPercent,
      version: change.version,
    });
  if (change.kind === 'logo')
    return apiClient.put<ShopSettingsView>('/shop-settings/logo', {
      contentType: change.contentType,
      dataBase64: change.dataBase64,
      version: change.version,
    });
  return apiRequest<ShopSettingsView>(`/shop-settings/logo?version=${change.version}`, { method: 'DELETE' });
}

/** Renames the shop, uploads or removes its logo, sets its target margin; the form shows 400 and 409 itself. */
export function useSaveShopSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveShopSettings,
    meta: { errorShownInline: true },
    onSuccess: (saved) => queryClient.setQueryData(getShopSettingsQueryOptions().queryKey, saved),
  });
}
