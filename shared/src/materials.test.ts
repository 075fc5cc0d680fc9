import { describe, expect, it } from 'vitest';
import { pickableMaterials } from './materials.js';

describe('material pickers', () => {
  it('pickers hide retired materials unless already chosen', () => {
    const library = [
      { id: 1, retiredAt: null },
      { id: 2, retiredAt: '2026-12-01T00:00:00.000Z' },
      { id: 3, retiredAt: null },
    ];
    expect(pickableMaterials(library).map((m) => m.id)).toEqual([1, 3]);
    expect(pickableMaterials(library, [2, null]).map((m) => m.id)).toEqual([1, 2, 3]);
  });
});
