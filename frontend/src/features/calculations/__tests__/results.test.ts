import { describe, expect, it } from 'vitest';
import { binCentres, grownLayers, liveMerit, thicknessRows } from '../results';
import { testCalculation } from '../../../test/calculation-fixtures';

describe('optimisation results', () => {
  it('maps a grown stack to library materials; a start layer of a material not allowed keeps its own', () => {
    const start = [{ materialId: 4, thicknessNm: 99.6, locked: true, notes: 'outer' }];
    const step = {
      step: 2,
      layerCount: 3,
      totalThicknessNm: 227,
      merit: 0.1,
      pass: true,
      worstMargin: 0.02,
      layers: [
        { material: 'layers[0]', thicknessNm: 117 },
        { material: 'TiO2', thicknessNm: 17.5 },
        { material: 'SiO2', thicknessNm: 92.5 },
      ],
    };
    const byName = new Map([
      ['TiO2', 5],
      ['SiO2', 6],
    ]);
    expect(grownLayers(step, start, byName).map((l) => [l.materialId, l.thicknessNm])).toEqual([
      [4, 117],
      [5, 17.5],
      [6, 92.5],
    ]);
    expect(() =>
      grownLayers({ ...step, layers: [{ material: 'ZrO2', thicknessNm: 1 }] }, start, byName),
    ).toThrow('material ZrO2 is not in the library');
  });

  it('pairs layers by identity: an inserted layer is new, the others keep their change', () => {
    const rows = thicknessRows(
      [
        { material: 'MgF2', thicknessNm: 90 },
        { material: 'TiO2', thicknessNm: 30 },
      ],
      [
        { material: 'MgF2', thicknessNm: 96.5 },
        { material: 'SiO2', thicknessNm: 20 },
        { material: 'TiO2', thicknessNm: 11 },
      ],
    );
    expect(rows.map((r) => [r.layer, r.beforeLayer, r.status, r.changeNm])).toEqual([
      [1, 1, 'kept', 6.5],
      [2, null, 'new', null],
      [3, 2, 'kept', -19],
    ]);
  });

  it('pairs a needle split of one layer with the part closest in thickness, and marks removals', () => {
    // SiO2 145 nm split by a MgF2 needle into 20 + 120 nm: the 120 nm part is the original layer.
    const split = thicknessRows(
      [
        { material: 'TiO2', thicknessNm: 50 },
        { material: 'SiO2', thicknessNm: 145 },
      ],
      [
        { material: 'TiO2', thicknessNm: 52 },
        { material: 'SiO2', thicknessNm: 20 },
        { material: 'MgF2', thicknessNm: 4 },
        { material: 'SiO2', thicknessNm: 120 },
      ],
    );
    expect(split.map((r) => [r.layer, r.beforeLayer, r.status])).toEqual([
      [1, 1, 'kept'],
      [2, null, 'new'],
      [3, null, 'new'],
      [4, 2, 'kept'],
    ]);
    const removed = thicknessRows(
      [
        { material: 'MgF2', thicknessNm: 90 },
        { material: 'ZrO2', thicknessNm: 8 },
        { material: 'SiO2', thicknessNm: 60 },
      ],
      [
        { material: 'MgF2', thicknessNm: 92 },
        { material: 'SiO2', thicknessNm: 61 },
      ],
    );
    expect(removed.map((r) => [r.layer, r.beforeLayer, r.status])).toEqual([
      [1, 1, 'kept'],
      [null, 2, 'removed'],
      [2, 3, 'kept'],
    ]);
  });

  it('reads the live history against iteration or layer count, and the histogram bin centres', () => {
    const running = testCalculation({
      status: 'running',
      live: {
        history: [
          { layerCount: 1, merit: 0.9 },
          { layerCount: 3, merit: 0.4 },
        ],
      },
    });
    expect(liveMerit(running)).toEqual([
      { x: 1, merit: 0.9 },
      { x: 3, merit: 0.4 },
    ]);
    expect(binCentres([-1, 0, 2])).toEqual([-0.5, 1]);
  });
});
