/*
 * The shop's own settings: its name and logo in the header of run sheets and compliance reports,
 * and the target margin its optimisations design in unless the engineer asks for another.
 */

/** Logo types a PDF can embed as they are. */
export const LOGO_TYPES = ['image/png', 'image/jpeg'] as const;
export type LogoType = (typeof LOGO_TYPES)[number];

/** Largest logo file accepted, bytes (a header logo needs far less). */
export const LOGO_MAX_BYTES = 512 * 1024;

/** Longest shop name, characters. */
export const SHOP_NAME_MAX = 120;

export interface ShopSettingsView {
  shopName: string;
  /** Present when a logo was uploaded: its type and size; fetch it from /api/shop-settings/logo. */
  logo: { contentType: LogoType; bytes: number } | null;
  /**
   * Target margin Fit to mask and Grow layers design in when the request names none, percentage
   * points (0 to MAX_TARGET_MARGIN_PERCENT); DEFAULT_TARGET_MARGIN_PERCENT until an admin sets it.
   */
  targetMarginPercent: number;
  /** Optimistic-locking counter: 0 before the first save; send it back with an edit. */
  version: number;
  updatedAt: string | null;
}
