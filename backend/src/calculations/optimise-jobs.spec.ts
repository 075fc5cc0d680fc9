import { describe, expect, it } from 'vitest';
import { growLayers, type GrowResult } from '@quietglass/shared/optimise/needle';
import { grownLayerMaterialId } from '@quietglass/shared/calculations';
import { RESULT_FORECAST, forecastResult } from '@quietglass/shared/optimise/result-forecast';
import { parseStack } from '@quietglass/shared/optics/stack';
import { runOptimiseJob, type GrowInput } from './optimise-jobs.js';

/*
 * Constant-index materials (MgF2 1.38, SiO2 1.46, TiO2 2.35, glass 1.52: typical values near 550 nm,
 * common practice, from memory) and the usual visible AR requirement R ≤ 0.5 % over 420–680 nm
 * (common practice, no source). Material ids are invented.
 */
const constant = (n: number) => ({ model: 'constant' as const, n, k: 0 });
const IDS = { MgF2: 4, SiO2: 6, TiO2: 7 };

/** A MgF2 quarter wave at 550 nm (550 / (4 · 1.38) = 99.6 nm) grown with SiO2 and TiO2 only. */
const INPUT: GrowInput = {
  kind: 'grow',
  stack: {
    incident: { material: 'air' },
    substrate: { material: 'glass', thickness_mm: 2 },
    materials: { air: constant(1), glass: constant(1.52), 'material-4': constant(1.38) },
    layers: [{ material: 'material-4', thickness_nm: 99.6 }],
    reference_nm: 550,
  },
  back: 'none',
  bands: [{ from_nm: 420, to_nm: 680, quantity: 'R', max_percent: 0.5, step_nm: 10 }],
  layerMaterialIds: [IDS.MgF2],
  allowed: [
    { materialId: IDS.SiO2, name: 'SiO2', model: constant(1.46) },
    { materialId: IDS.TiO2, name: 'TiO2', model: constant(2.35) },
  ],
  options: { maxLayers: 8, maxTotalThicknessNm: 2000, minThicknessNm: 10, maxSteps: 4 },
};

describe('grownLayerMaterialId', () => {
  it('maps every layer of a grown stack to a material, a start layer of a material not allowed included', () => {
    const result = runOptimiseJob(INPUT, () => true) as GrowResult;
    const names = result.final.layers.map((l) => l.material);
    // The start layer's material was not allowed: the engine names it by its place in the start.
    expect(names).toContain('layers[0]');
    const byName = new Map([
      ['SiO2', IDS.SiO2],
      ['TiO2', IDS.TiO2],
      ['MgF2', IDS.MgF2],
    ]);
    const ids = names.map((name) => grownLayerMaterialId(name, INPUT.layerMaterialIds, byName));
    expect(ids.every((id) => id !== undefined)).toBe(true);
    names.forEach((name, i) => {
      if (name === 'layers[0]') expect(ids[i]).toBe(IDS.MgF2);
      else expect(ids[i]).toBe(byName.get(name));
    });
  });

  it('prefers the name and leaves an unknown name unresolved', () => {
    const byName = new Map([['TiO2', 7]]);
    expect(grownLayerMaterialId('TiO2', [4], byName)).toBe(7);
    expect(grownLayerMaterialId('layers[0]', [4], byName)).toBe(4);
    expect(grownLayerMaterialId('layers[3]', [4], byName)).toBeUndefined();
    expect(grownLayerMaterialId('ZrO2', [4], byName)).toBeUndefined();
  });
});

describe('a Grow layers job', () => {
  it('grows on the merit and with the needles per step it was asked for', () => {
    const asked = {
      ...INPUT,
      options: { ...INPUT.options, growthMerit: 'smooth' as const, needlesPerStep: 1 },
    };
    const result = runOptimiseJob(asked, () => true) as GrowResult;
    // The same growth run directly on the engine with the same settings grows the same design.
    const direct = growLayers(
      parseStack(INPUT.stack),
      { bands: INPUT.bands },
      {
        back: 'none',
        allowedMaterials: INPUT.allowed.map(({ name, model }) => ({ name, model })),
        ...INPUT.options,
        growthMerit: 'smooth',
        needlesPerStep: 1,
      },
    );
    expect(result.final.layers).toEqual(direct.final.layers);
    // ...and not the one the default (mask) merit grows, so the setting reached the engine.
    const byDefault = runOptimiseJob(INPUT, () => true) as GrowResult;
    expect(result.final.layers).not.toEqual(byDefault.final.layers);
  });
});

describe('the forecast beside a Grow layers result', () => {
  it('forecasts the grown stack under the stated thickness error, as its last progress', () => {
    const fractions: number[] = [];
    const result = runOptimiseJob(INPUT, (p) => {
      fractions.push(p.fraction);
      return true;
    }) as GrowResult;
    const forecast = result.forecast!;
    expect(forecast.trials).toBe(RESULT_FORECAST.trials);
    expect(forecast.relativePercent).toBe(RESULT_FORECAST.relativePercent);
    // The same forecast of the same stack, run directly, gives the same figures.
    const direct = forecastResult(result.stack, { bands: INPUT.bands }, 'none')!;
    expect(forecast.yieldFraction).toBe(direct.yieldFraction);
    expect(forecast.medianWorstMargin).toBe(direct.medianWorstMargin);
    // A worst margin below the median of the trials' worst margins is what a 1 % error costs.
    expect(forecast.medianWorstMargin).toBeLessThan(result.final.worstMargin);
    expect(fractions.at(-1)).toBe(1);
    expect(fractions.filter((f) => f > 0.99).length).toBeGreaterThan(0);
  });

  it('keeps no forecast when the job is cancelled during it', () => {
    const result = runOptimiseJob(INPUT, (p) => p.fraction <= 0.99) as GrowResult;
    expect(result.stoppedBy).not.toBe('cancelled');
    expect(result.forecast).toBeNull();
  });
});
