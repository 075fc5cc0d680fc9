/*
 * Materials that can be named in a stack file (`"material": "N-BK7"`). Only published coefficients
 * go here; shop-specific coating materials belong in the stack file's own `materials` map.
 */
import type { MaterialModel } from './dispersion.js';

/** Built-in materials by name. */
export const MATERIAL_LIBRARY: Readonly<Record<string, MaterialModel>> = Object.freeze({
  /** Vacuum, and air taken as n = 1 (air's 1.0003 is below what coating work resolves). */
  air: { model: 'constant', n: 1, k: 0 },
  vacuum: { model: 'constant', n: 1, k: 0 },
  /** SCHOTT N-BK7, Sellmeier coefficients from the SCHOTT optical glass data sheet. */
  'N-BK7': {
    model: 'sellmeier',
    B: [1.03961212, 0.231792344, 1.01046945],
    C: [0.00600069867, 0.0200179144, 103.560653],
    k: 0,
  },
  /** Fused silica, I. H. Malitson, J. Opt. Soc. Am. 55, 1205 (1965). */
  'fused-silica': {
    model: 'sellmeier',
    B: [0.6961663, 0.4079426, 0.8974794],
    C: [0.0684043 ** 2, 0.1162414 ** 2, 9.896161 ** 2],
    k: 0,
  },
});
