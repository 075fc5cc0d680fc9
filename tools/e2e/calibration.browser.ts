import {
  calculateSpectrum,
  designStackDescription,
  engineBackSurface,
  parseStack,
  type ChamberCalibrationView,
  type NamedModel,
} from '@quietglass/shared';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser } from './browser.js';
import { FOUR_LAYER_AR, apiJson, apiSession, browserSession, demoUser, prepareDesign } from './demo-shop.js';

/*
 * Chamber calibration in the browser. An invented chamber gets four diagnosed runs of the demo AR
 * (MgF2 / ZrO2 / Al2O3 / SiO2) in which ZrO2 comes out 3 % thick and Al2O3 3 % thin, measured
 * spectra computed with the optics engine, diagnosed by the real worker. The engineer Mira Castell
 * rejects the Al2O3 suggestion and accepts the ZrO2 one on the Chambers page, each with a comment;
 * the chamber's factor changes and new run sheets say which calibration they use.
 */
const FACTORS = [1, 1.03, 0.97, 1];
let browser: Browser;
let chamberName: string;
let chamberId: number;
let designId: number;

beforeAll(async () => {
  browser = await launchBrowser();
  const prepared = await prepareDesign(`HVS-2210 calibration trial ${Date.now()}`, FOUR_LAYER_AR, 'released');
  designId = prepared.designId;
  const mira = await apiSession(demoUser('mira.castell'));
  const jonah = await apiSession(demoUser('jonah.pike'));
  try {
    const materials = await apiJson<{ id: number; name: string }[]>(mira, 'get', '/api/materials');
    const id = (name: string) => materials.find((m) => m.name === name)!.id;
    chamberName = `Bell jar C${Date.now() % 100000}`;
    const chamber = await apiJson<{ id: number }>(mira, 'post', '/api/chambers', {
      name: chamberName,
      monitorWavelengthsNm: [550],
      monitorChipMaterialId: id('Fused silica'),
      materials: [
        { materialId: id('MgF2'), toolingFactor: 1.08, rateNmPerS: 0.8 },
        { materialId: id('ZrO2'), toolingFactor: 0.97, rateNmPerS: 0.4 },
        { materialId: id('Al2O3'), toolingFactor: 1, rateNmPerS: 0.5 },
        { materialId: id('SiO2'), toolingFactor: 1.04, rateNmPerS: 0.8 },
      ],
    });
    chamberId = chamber.id;
    const version = prepared.version;
    const models = new Map(
      Object.entries(version.materialsSnapshot ?? {}).map(([k, m]) => [Number(k), m as NamedModel]),
    );
    const wavelengthsNm = Array.from({ length: 76 }, (_, i) => 400 + 4 * i);
    for (let k = 0; k < 4; k++) {
      const run = await apiJson<{ id: number }>(jonah, 'post', '/api/runs', {
        designId,
        versionNumber: 1,
        chamberId,
        lotNumber: `C-${k + 1}`,
        runDate: `2026-11-1${k}`,
      });
      const built = {
        ...version,
        layers: version.layers.map((l, i) => ({ ...l, thicknessNm: l.thicknessNm * FACTORS[i]! })),
      };
      const R = calculateSpectrum(
        parseStack(designStackDescription(built, models)),
        { wavelengthsNm, anglesDeg: [8], polarisations: ['avg'] },
        { back: engineBackSurface(version.backSurface) },
      ).R;
      // A small deterministic ripple stands in for measurement noise (±0.004 %).
      const rows = wavelengthsNm.map(
        (w, i) => `${w},${Math.max(0, 100 * R[i]! + 0.004 * Math.sin(1.7 * i + k)).toFixed(5)}`,
      );
      const spectrum = await apiJson<{ id: number }>(jonah, 'post', `/api/runs/${run.id}/spectra`, {
        filename: `C-${k + 1}.csv`,
        csv: ['wavelength_nm,R_percent', ...rows].join('\n'),
        angleDeg: 8,
        sample: 'witness',
      });
      const calc = await apiJson<{ id: number }>(
        mira,
        'post',
        `/api/runs/${run.id}/spectra/${spectrum.id}/diagnosis`,
        {},
      );
      const until = Date.now() + 120_000;
      for (;;) {
        const c = await apiJson<{ status: string; error: string | null }>(
          mira,
          'get',
          `/api/calculations/${calc.id}`,
        );
        if (c.status === 'completed') break;
        if (c.status === 'failed' || c.status === 'cancelled' || Date.now() > until)
          throw new Error(`diagnosis ${calc.id}: ${c.status} ${c.error ?? ''}`);
        await new Promise((r) => setTimeout(r, 200));
      }
    }
  } finally {
    await mira.dispose();
    await jonah.dispose();
  }
}, 300_000);

afterAll(async () => {
  await browser?.close();
});

describe('chamber calibration', () => {
  it('an engineer rejects one suggestion and accepts another, each with a comment', async () => {
    const { context, page, pageErrors } = await browserSession(browser, demoUser('mira.castell'));
    const api = await apiSession(demoUser('mira.castell'));
    try {
      const before = await apiJson<ChamberCalibrationView>(
        api,
        'get',
        `/api/chambers/${chamberId}/calibration`,
      );
      const zr = before.suggestions.find((s) => s.message.startsWith('ZrO2'))!;
      expect(before.suggestions.map((s) => s.message.split(' ')[0]).sort()).toEqual(['Al2O3', 'ZrO2']);

      await page.locator('nav[aria-label="Main"]').getByRole('link', { name: 'Chambers' }).click();
      const section = page.getByRole('region', { name: 'Chamber calibration' });
      await section.waitFor();
      await section.getByRole('combobox', { name: 'Chamber' }).click();
      await page.getByRole('option', { name: chamberName, exact: true }).click();
      const al = section.getByRole('region', { name: 'Suggested tooling factor Al2O3' });
      await al.waitFor();
      await expect
        .poll(() => section.getByRole('figure', { name: `Control chart ${chamberName} ZrO2` }).count())
        .toBe(1);

      await al.getByRole('button', { name: 'Reject' }).click();
      const reject = page.getByRole('dialog', { name: 'Reject the suggestion' });
      await reject.getByRole('button', { name: 'Reject' }).click();
      await reject.getByText('Say why').waitFor();
      await reject.getByLabel('Comment').fill('Al2O3 boat replaced after C-4; wait for new runs');
      await reject.getByRole('button', { name: 'Reject' }).click();
      await reject.waitFor({ state: 'hidden' });
      await al.waitFor({ state: 'hidden' });

      const zrRegion = section.getByRole('region', { name: 'Suggested tooling factor ZrO2' });
      await zrRegion.getByRole('button', { name: 'Accept' }).click();
      const accept = page.getByRole('dialog', { name: 'Accept the suggestion' });
      await accept.getByText(`becomes ${zr.proposedToolingFactor}`, { exact: false }).waitFor();
      await accept.getByLabel('Comment').fill('Four runs agree; witness checked on the ellipsometer');
      await page.screenshot({
        path: `${process.env.QG_TEST_DATA_DIR ?? '/tmp'}/calibration-accept.png`,
        fullPage: true,
      });
      await accept.getByRole('button', { name: 'Accept' }).click();
      await accept.waitFor({ state: 'hidden' });
      await section.getByText('No suggested correction', { exact: false }).waitFor();

      const decisions = section.getByRole('table', { name: 'Calibration decisions' });
      await expect.poll(() => decisions.getByRole('row').count()).toBe(3);
      const text = await decisions.textContent();
      expect(text).toContain('rejected');
      expect(text).toContain('Al2O3 boat replaced after C-4; wait for new runs');
      expect(text).toContain(`0.97 → ${zr.proposedToolingFactor}`);
      await page.screenshot({
        path: `${process.env.QG_TEST_DATA_DIR ?? '/tmp'}/calibration-panel.png`,
        fullPage: true,
      });

      const chamber = await apiJson<{ materials: { toolingFactor: number }[] }>(
        api,
        'get',
        `/api/chambers/${chamberId}`,
      );
      expect(chamber.materials.map((m) => m.toolingFactor)).toEqual([
        1.08,
        zr.proposedToolingFactor,
        1,
        1.04,
      ]);
      const sheet = await apiJson<{ calibration: { materials: { material: string; decision: unknown }[] } }>(
        api,
        'get',
        `/api/recipes/${designId}/1/run-sheet?chamberId=${chamberId}`,
      );
      const used = Object.fromEntries(
        sheet.calibration.materials.map((m) => [m.material, m.decision !== null]),
      );
      expect(used).toEqual({ MgF2: false, ZrO2: true, Al2O3: false, SiO2: false });
      expect(pageErrors).toEqual([]);
    } finally {
      await api.dispose();
      await context.close();
    }
  });
});
