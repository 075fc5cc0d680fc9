import { describe, expect, it } from 'vitest';
import { pickableMaterials, provenanceProblem } from './materials.js';

describe('material provenance and pickers', () => {
  it('a published material needs its reference; a measured one its date and run', () => {
    expect(provenanceProblem({ kind: 'published', source: ' ' })).toBe(
      'a published material needs its reference',
    );
    expect(provenanceProblem({ kind: 'published', source: 'Malitson 1965' })).toBeNull();
    expect(provenanceProblem({ kind: 'measured', date: '2026-11-20', run: '' })).toMatch(/date and the run/);
    expect(provenanceProblem({ kind: 'measured', date: '2026-11-20', run: 'B2-118' })).toBeNull();
    expect(provenanceProblem({ kind: 'typical' })).toBeNull();
  });

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
