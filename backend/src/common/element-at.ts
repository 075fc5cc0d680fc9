/**
 * The element at `index`, for arrays whose length the code has already checked or built to match
 * (one thickness per layer, one value per wavelength); a missing one throws with the array named.
 * One helper for every workspace: it lives in the shared package.
 */
export { elementAt } from '@quietglass/shared';
