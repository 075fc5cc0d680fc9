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

  it('lines up layers before and after, with a change only where the material is the same', () => {
    expect(
      thicknessRows(
        [
          { material: 'MgF2', thicknessNm: 90 },
          { material: 'TiO2', thicknessNm: 30 },
        ],
        [
          { material: 'MgF2', thicknessNm: 96.5 },
          { material: 'SiO2', thicknessNm: 20 },
          { material: 'TiO2', thicknessNm: 11 },
        ],
      ).map((r) => r.changeNm),
    ).toEqual([6.5, null, null]);
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
