/*
 * CIE standard illuminant D65: relative spectral power distribution at 5 nm steps from 300 nm to
 * 830 nm, normalised to 100 at 560 nm, as tabulated by the CIE (ISO/CIE 11664-2:2022, CIE standard
 * illuminants; CIE 015:2018, Colorimetry, 4th edition — standard numbers and years from memory).
 *
 * Values copied from the Debian package colord-data 1.4.6-2.2, file
 * /usr/share/colord/illuminant/CIE-D65.sp, where they are scaled to 1 at 560 nm; multiplied by 100
 * here (no digit added or dropped). With the 2° observer over 380–780 nm they give the white point
 * X = 95.04, Y = 100, Z = 108.88 (tested against the published 95.047, 100, 108.883).
 */

/** First wavelength of the table, nm. */
export const D65_START_NM = 300;
/** Wavelength step of the table, nm. */
export const D65_STEP_NM = 5;

/** S_D65(λ), 300–830 nm. */
export const D65_SPD: readonly number[] = [
  0.0341, 1.6643, 3.2945, 11.7652, 20.236, 28.6447, 37.0535, 38.5011,
  39.9488, 42.4302, 44.9117, 45.775, 46.6383, 49.3637, 52.0891, 51.0323,
  49.9755, 52.3118, 54.6482, 68.7015, 82.7549, 87.1204, 91.486, 92.4589,
  93.4318, 90.057, 86.6823, 95.7736, 104.865, 110.936, 117.008, 117.41,
  117.812, 116.336, 114.861, 115.392, 115.923, 112.367, 108.811, 109.082,
  109.354, 108.578, 107.802, 106.296, 104.79, 106.239, 107.689, 106.047,
  104.405, 104.225, 104.046, 102.023, 100, 98.1671, 96.3342, 96.0611,
  95.788, 92.2368, 88.6856, 89.3459, 90.0062, 89.8026, 89.5991, 88.6489,
  87.6987, 85.4936, 83.2886, 83.4939, 83.6992, 81.863, 80.0268, 80.1207,
  80.2146, 81.2462, 82.2778, 80.281, 78.2842, 74.0027, 69.7213, 70.6652,
  71.6091, 72.979, 74.349, 67.9765, 61.604, 65.7448, 69.8856, 72.4863,
  75.087, 69.3398, 63.5927, 55.0054, 46.4182, 56.6118, 66.8054, 65.0941,
  63.3828, 63.8434, 64.304, 61.8779, 59.4519, 55.7054, 51.959, 54.6998,
  57.4406, 58.8765, 60.3125,
];
