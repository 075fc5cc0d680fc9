import { describe, expect, it } from 'vitest';
import { indexAt } from '@quietglass/shared/optics/dispersion';
import { libraryIndex, readLibraryFile } from './constants-library.js';

describe('the published optical-constants library shipped with the product', () => {
  const entries = libraryIndex();

  it('lists 26 files, each read into a model whose reference and DOI match the index', () => {
    expect(entries).toHaveLength(26);
    for (const entry of entries) {
      const { parsed } = readLibraryFile(entry.file);
      expect(parsed.rangeNm.to, entry.file).toBeGreaterThan(parsed.rangeNm.from);
      const mid = (parsed.rangeNm.from + parsed.rangeNm.to) / 2;
      expect(indexAt(parsed.model, mid).n, entry.file).toBeGreaterThan(0);
      if (entry.doi && parsed.doi) expect(parsed.doi, entry.file).toBe(entry.doi);
      expect(parsed.reference.length, entry.file).toBeGreaterThan(10);
    }
  });

  it('matches tabulated points of the files, reference by reference', () => {
    const at = (file: string, nm: number) => indexAt(readLibraryFile(file).parsed.model, nm);
    // SCHOTT B 270 data sheet (1993): n(587.56 nm) = 1.5230, k = 0.
    expect(at('substrate/b270--b270.yml', 587.56)).toEqual({ n: 1.523, k: 0 });
    // P. B. Johnson, R. W. Christy, Phys. Rev. B 9, 5056 (1974), Cr row 0.188 µm: n 1.28, k 1.64.
    expect(at('metal/cr--johnson.yml', 188)).toEqual({ n: 1.28, k: 1.64 });
    // Amotchkina et al., Appl. Opt. 59, A40 (2020), ZnS tabulated k at 0.55 µm: 6.99e-4.
    expect(at('film/zns--amotchkina.yml', 550).k).toBeCloseTo(6.99e-4, 12);
    // J. H. Burnett et al., Proc. SPIE 9974, 99740X (2016): Ge formula stated for 2–14 µm only.
    expect(() => at('substrate/ge--burnett.yml', 1500)).toThrow(/outside the sellmeier model's valid range/);
    // Germanium's n ≈ 4.0 at 10 µm (from memory), a coarse sanity check of the formula.
    expect(at('substrate/ge--burnett.yml', 10_000).n).toBeCloseTo(4.0, 1);
  });

  it('refuses a path outside the library', () => {
    expect(() => readLibraryFile('../../package.json')).toThrow(/not a library file/);
  });
});
