/*
 * What the API accepts for the shop's settings (name, logo, default target margin); the settings
 * panel checks the same schemas.
 */
import { z } from 'zod';
import { MAX_TARGET_MARGIN_PERCENT } from '../optimise/fit.js';
import { LOGO_MAX_BYTES, LOGO_TYPES, SHOP_NAME_MAX } from '../shop.js';
import { finiteNumber, requiredText, settingsVersion } from './common.js';

export const shopNameSchema = z.strictObject({
  shopName: requiredText('The shop needs a name', SHOP_NAME_MAX),
  version: settingsVersion,
});
export type ShopNameInput = z.output<typeof shopNameSchema>;

const MARGIN_MESSAGE = `A number from 0 to ${MAX_TARGET_MARGIN_PERCENT} percentage points`;

/**
 * How far inside every limit to design, percentage points: the shop's default and the margin one
 * Fit to mask or Grow layers request asks for.
 */
export const targetMarginPercentField = finiteNumber(MARGIN_MESSAGE)
  .min(0, { error: MARGIN_MESSAGE })
  .max(MAX_TARGET_MARGIN_PERCENT, { error: MARGIN_MESSAGE });

/** Percentage points inside every limit that Fit to mask and Grow layers design in by default. */
export const shopTargetMarginSchema = z.strictObject({
  targetMarginPercent: targetMarginPercentField,
  version: settingsVersion,
});
export type ShopTargetMarginInput = z.output<typeof shopTargetMarginSchema>;

/** The logo's size limit as people read it. */
export const LOGO_SIZE_MESSAGE = `The logo must be at most ${LOGO_MAX_BYTES / 1024} KB`;
/** Base64 of the file: 4 characters per 3 bytes, plus padding. */
const BASE64_MAX = Math.ceil(LOGO_MAX_BYTES / 3) * 4;

/** The logo file in base64; the API checks its bytes (signature, pixel size) after this. */
export const shopLogoSchema = z.strictObject({
  contentType: z.enum(LOGO_TYPES, { error: 'The logo must be a PNG or JPEG image' }),
  dataBase64: z
    .string({ error: 'dataBase64 must be the file in base64' })
    .min(4, { error: 'The logo file is empty' })
    .max(BASE64_MAX, { error: LOGO_SIZE_MESSAGE }),
  version: settingsVersion,
});
export type ShopLogoInput = z.output<typeof shopLogoSchema>;
