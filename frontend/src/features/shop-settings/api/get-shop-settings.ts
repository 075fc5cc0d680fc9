export type { ShopSettingsView } from '@quietglass/shared';
export { getShopSettings, getShopSettingsQueryOptions, useShopSettings } from '../../../lib/shop-settings';
