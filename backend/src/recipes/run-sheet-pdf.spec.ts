import { writeFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { ProcessSetting } from '@quietglass/shared/chambers';
import { buildRunSheet, type RunSheetView } from '@quietglass/shared/runsheet';
import {
  inkBox,
  isRoundTickRow,
  overlappingWords,
  pageGreys,
  pagePngs,
  pageTexts,
  wordBoxes,
  type WordBox,
} from '../../test/support/pdf-pages.js';
import { solidPng } from '../../test/support/png.js';
import { qwotColumnTitle, renderRunSheetPdf } from './run-sheet-pdf.js';

/** Constant-index materials (test values) and a four-layer recipe on a chamber at 600 nm. */
const H = { model: 'constant' as const, n: 2.0, k: 0 };
const L = { model: 'constant' as const, n: 1.5, k: 0 };

function setting(materialId: number, patch: Partial<ProcessSetting> = {}): ProcessSetting {
  return {
    materialId,
    substrateTemperatureC: 250,
    basePressureMbar: 2e-5,
    o2FlowSccm: 12,
    o2PartialPressureMbar: null,
    arFlowSccm: null,
    ionVoltageV: 120,
    ionCurrentA: 2.5,
    ionGasFlowSccm: 8,
    notes: 'hold the temperature within ± 5 °C; soak ≥ 30 min before the first layer',
    ...patch,
  };
}

function sheetOf(layers: { material: 'H' | 'L'; thicknessNm: number }[], patch: Partial<RunSheetView> = {}) {
  const sheet = buildRunSheet({
    layers: layers.map((l) => ({
      material: l.material,
      model: l.material === 'H' ? H : L,
      thicknessNm: l.thicknessNm,
    })),
    monitorChip: { model: 'constant', n: 1.52, k: 0 },
    chamber: {
      monitorWavelengthNm: 600,
      materials: { H: { toolingFactor: 0.75, rateNmPerS: 0.25 }, L: { toolingFactor: 1.2, rateNmPerS: 0.5 } },
    },
  });
  const view: RunSheetView = {
    ...sheet,
    layers: sheet.layers.map((l) => ({
      ...l,
      process:
        l.material === 'H'
          ? setting(2)
          : setting(1, { ionVoltageV: null, ionCurrentA: null, ionGasFlowSccm: null, notes: '' }),
    })),
    recipe: { designId: 7, number: 2, name: 'HVS-2210 four-layer AR', customer: 'Halden Vision Systems' },
    chamber: { id: 3, name: 'Box coater B2' },
    shop: { name: 'Larkspur Thin Film Works', hasLogo: false },
    substrate: { material: 'N-BK7', thicknessMm: 2, designThicknessMm: 2 },
    job: { part: 'HVS-2210-L3 lens', quantity: 48, sides: 'front' },
    calibration: {
      chamberVersion: 3,
      materials: [
        { material: 'L', toolingFactor: 1.2, decision: null },
        {
          material: 'H',
          toolingFactor: 0.75,
          decision: { id: 7, decidedAt: '2026-12-02T09:00:00.000Z', decidedBy: 'Test Engineer' },
        },
      ],
    },
    ...patch,
  };
  return view;
}

const FOUR = [
  { material: 'L' as const, thicknessNm: 120 },
  { material: 'H' as const, thicknessNm: 60 },
  { material: 'L' as const, thicknessNm: 30 },
  { material: 'H' as const, thicknessNm: 15 },
];
const render = (sheet: RunSheetView, logo: Buffer | null = null) =>
  renderRunSheetPdf(sheet, { logo, printedOn: '2026-12-03' });

const isNumber = (w: WordBox) => /^-?\d+(\.\d+)?$/.test(w.text);

// Each test renders whole PDFs and rasterises them with pdftoppm, which takes seconds on a busy
// machine: a minute per test rather than vitest's 5 s default.
describe('run sheet PDF, read back with poppler-utils', { timeout: 60_000 }, () => {
  it('names the job: shop, part, quantity, substrate and thickness, sides, chamber, λ', async () => {
    const [first] = pageTexts(await render(sheetOf(FOUR)));
    expect(first).toContain('Larkspur Thin Film Works');
    expect(first).toMatch(/Part\s+HVS-2210-L3 lens/);
    expect(first).toMatch(/Quantity\s+48 pcs/);
    expect(first).toMatch(/Substrate\s+N-BK7, 2 mm thick/);
    expect(first).toMatch(/Sides to coat\s+Front surface only/);
    expect(first).toMatch(/Chamber\s+Box coater B2/);
    expect(first).toContain('λ = 600 nm');
    const changed = pageTexts(
      await render(
        sheetOf(FOUR, { substrate: { material: 'N-BK7', thicknessMm: 2.1, designThicknessMm: 2 } }),
      ),
    )[0];
    expect(changed).toContain('N-BK7, 2.1 mm (design: 2 mm) thick');
  });

  it('prints ≤ ≥ ± ° µ λ and O₂, 10⁻⁵ verbatim, which the standard PDF fonts cannot', async () => {
    const text = pageTexts(await render(sheetOf(FOUR))).join('\n');
    for (const s of ['≤', '≥', '±', '°C', 'µm', 'λ', 'O₂', '10⁻⁵']) expect(text, s).toContain(s);
    // Process settings per layer, read back from the cells.
    expect(text).toContain('Substrate at 250 °C');
    expect(text).toContain('Base pressure ≤ 2.0 × 10⁻⁵ mbar');
    expect(text).toContain('Ion assist 120 V, 2.5 A, gas 8');
    expect(text).toContain('No ion assist');
    // 225 nm on the part = 0.225 µm; the hand sum 120 + 60 + 30 + 15.
    expect(text).toMatch(/225\.0 nm on the part \(0\.225 µm\)/);
  });

  it('labels the QWOT column as the monitor’s, with its wavelength, and has columns for actual values', async () => {
    expect(qwotColumnTitle(550)).toBe('Monitor QWOT at 550 nm');
    const words = wordBoxes(await render(sheetOf(FOUR)));
    const heading = words
      .filter((w) => w.page === 1)
      .map((w) => w.text)
      .join(' ');
    expect(heading).toContain('Monitor QWOT at 600 nm');
    for (const h of ['Actual end thickness (nm)', 'Actual rate (nm/s)', 'Remarks', 'Process settings'])
      expect(heading).toContain(h);
    // Step 1 is the last design layer (H, 15 nm): QWOT on the monitor = 4·2.0·(15/0.75)/600 = 0.267.
    const text = pageTexts(await render(sheetOf(FOUR))).join('\n');
    expect(text).toMatch(/1\s+H\s+15\.00\s+0\.750\s+20\.00\s+0\.267\s+0\.25\s+80/);
  });

  it('has sign-off lines for the operator and the checker, and the usual cautions', async () => {
    const text = pageTexts(await render(sheetOf(FOUR))).join('\n');
    expect(text).toContain('Run by (operator)');
    expect(text).toContain('Checked by');
    expect(text.match(/Signature/g)).toHaveLength(2);
    expect(text).toMatch(/high voltage/);
    expect(text).toMatch(/local regulations/);
  });

  it('numbers every page "Page n of m", also when the layers run over several pages', async () => {
    const many = Array.from({ length: 30 }, (_, i) => FOUR[i % 4]!);
    const pdf = await render(sheetOf(many));
    const pages = pageTexts(pdf);
    expect(pages.length).toBeGreaterThan(2);
    pages.forEach((p, i) => {
      expect(p).toContain(`Page ${i + 1} of ${pages.length}`);
      expect(p).toContain('Run sheet HVS-2210 four-layer AR v2');
    });
    // The table header repeats on the next page.
    const page2 = wordBoxes(pdf)
      .filter((w) => w.page === 2)
      .map((w) => w.text)
      .join(' ');
    expect(page2).toContain('Actual end thickness (nm)');
  });

  it('never prints text over text, with or without a logo, short or long', async () => {
    const many = Array.from({ length: 30 }, (_, i) => FOUR[i % 4]!);
    for (const [sheet, logo] of [
      [sheetOf(FOUR), null],
      [sheetOf(FOUR), solidPng(300, 60)],
      [sheetOf(many), null],
      [sheetOf(FOUR, { job: { part: '', quantity: null, sides: 'both' } }), solidPng(40, 120)],
    ] as const) {
      const words = wordBoxes(await render(sheet, logo));
      expect(words.length).toBeGreaterThan(150);
      expect(overlappingWords(words).map(([a, b]) => `${a.page}: ${a.text} × ${b.text}`)).toEqual([]);
    }
  });

  it('draws the monitor chart with round ticks on both axes (Heckbert 1990)', async () => {
    const words = wordBoxes(await render(sheetOf(FOUR)));
    const lines = new Map<string, WordBox[]>();
    for (const w of words) {
      const key = `${w.page}:${Math.round(w.yMin)}`;
      lines.set(key, [...(lines.get(key) ?? []), w]);
    }
    const rows = [...lines.values()].filter((l) => l.length >= 5 && l.every(isNumber));
    expect(rows).toHaveLength(1);
    const xTicks = rows[0]!.sort((a, b) => a.xMin - b.xMin).map((w) => Number(w.text));
    expect(isRoundTickRow(xTicks), xTicks.join(' ')).toBe(true);
    // Monitor total: 20 + 25 + 80 + 100 = 225 nm (part ÷ tooling factor), so the axis ends at 250 nm.
    expect(xTicks[0]).toBe(0);
    expect(xTicks.at(-1)).toBe(250);
    const axis = rows[0]![0]!;
    const yLabels = words
      .filter((w) => w.page === axis.page && isNumber(w) && w.xMax < axis.xMin + 10 && w.yMax < axis.yMin)
      .sort((a, b) => b.yMin - a.yMin)
      .map((w) => Number(w.text));
    expect(yLabels.length).toBeGreaterThanOrEqual(3);
    expect(isRoundTickRow(yLabels), yLabels.join(' ')).toBe(true);
  });

  it('keeps everything, the chart included, inside the page margins', async () => {
    const many = Array.from({ length: 30 }, (_, i) => FOUR[i % 4]!);
    for (const sheet of [sheetOf(FOUR), sheetOf(many)]) {
      const pdf = await render(sheet, solidPng(300, 60));
      const greys = pageGreys(pdf, 72);
      expect(greys.length).toBe(pagePngs(pdf).length);
      for (const page of greys) {
        // A4 landscape at 72 dpi: 842 × 595 px; margins 40 pt = 40 px.
        expect(page.width).toBe(842);
        expect(Math.abs(page.height - 595)).toBeLessThanOrEqual(1);
        const ink = inkBox(page)!;
        expect(ink.left).toBeGreaterThanOrEqual(39);
        expect(ink.right).toBeLessThanOrEqual(842 - 39);
        expect(ink.top).toBeGreaterThanOrEqual(39);
        expect(ink.bottom).toBeLessThanOrEqual(page.height - 39);
      }
    }
  });

  it('writes page 1 for the README when asked', async () => {
    const out = process.env.QG_RUN_SHEET_PNG;
    if (!out) return;
    const pages = pagePngs(await render(sheetOf(FOUR), solidPng(240, 60)), 110);
    pages.forEach((png, i) => writeFileSync(out.replace('.png', `-${i + 1}.png`), png));
  });
});
