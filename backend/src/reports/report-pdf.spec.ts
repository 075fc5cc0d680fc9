import { describe, expect, it } from 'vitest';
import type { LimitBand } from '@quietglass/shared/optics/mask';
import {
  isRoundTickRow,
  overlappingWords,
  pagePngs,
  pageTexts,
  wordBoxes,
  type WordBox,
} from '../../test/support/pdf-pages.js';
import { rule } from './report-compute.js';
import { documentNumber, renderReportPdf, type ReportDocument } from './report-pdf.js';

const bands: LimitBand[] = [
  { from_nm: 450, to_nm: 650, quantity: 'R', max_percent: 0.6, label: 'visible' },
  { from_nm: 430, to_nm: 670, quantity: 'R', max_percent: 1.2, angles_deg: [0, 30], polarisation: 's' },
  { from_nm: 840, to_nm: 860, quantity: 'R', target_percent: 4, tolerance_percent: 0.5 },
  { from_nm: 420, to_nm: 680, quantity: 'T', min_percent: 98.5 },
];

/** A smooth AR-like curve, % (invented test data, not a computed design). */
function curve(from: number, to: number, f: (wl: number) => number) {
  const wavelengthsNm = Array.from({ length: 121 }, (_, i) => from + ((to - from) * i) / 120);
  return { wavelengthsNm, valuesPercent: wavelengthsNm.map(f) };
}

function sampleReport(overrides: Partial<ReportDocument> = {}): ReportDocument {
  return {
    shop: 'Larkspur Thin Film Works',
    documentNumber: documentNumber(42),
    customer: 'Halden Vision Systems',
    part: 'HVS lens AR',
    version: 3,
    approval: { by: 'Tomas Eklund', on: '2026-11-30' },
    mask: 'HVS-2210 lens AR',
    maskRevision: 'B',
    date: '2026-12-02',
    statement:
      'Designed values: computed from the approved design. They are not measurements of a coated part.',
    plots: [
      {
        title: 'R at 0°, unpolarised (designed)',
        quantity: 'R',
        ...curve(429, 665, (wl) => 0.3 + ((wl - 550) / 140) ** 2),
        bands: bands.slice(0, 2),
      },
      {
        title: 'R at 30°, s-polarised (designed)',
        quantity: 'R',
        ...curve(429, 870, (wl) => 0.5 + ((wl - 560) / 120) ** 2),
        bands: bands.slice(1, 3),
      },
      {
        title: 'T at 0°, unpolarised (designed)',
        quantity: 'T',
        ...curve(407, 693, (wl) => 99.4 - ((wl - 550) / 160) ** 2),
        bands: bands.slice(3),
      },
    ],
    summary: {
      source: 'designed',
      pass: false,
      worstMargin: -0.125,
      colour: { L: 9.12, a: 1.5, b: -6.25, Rv: 0.0102 },
      bands: bands.map((b, i) => ({
        band: i,
        label: b.label ?? '',
        rule: rule(b),
        angles: (b.angles_deg ?? [0]).join(', ') + '°',
        polarisation: b.polarisation ?? 'avg',
        evaluated: true,
        pass: i !== 1,
        worstMargin: i === 1 ? -0.125 : 0.25,
        worstAtNm: 450 + i * 10,
        worstAtDeg: i === 1 ? 30 : 0,
        valuePercent: 0.35 + i,
      })),
    },
    layers: [
      { material: 'Ta2O5', thicknessNm: 14.21 },
      { material: 'SiO2', thicknessNm: 33.8 },
      { material: 'Ta2O5', thicknessNm: 121.02 },
      { material: 'MgF2', thicknessNm: 95.5 },
    ],
    ...overrides,
  };
}

const isNumber = (w: WordBox) => /^-?\d+(\.\d+)?$/.test(w.text);

/** Rows of tick labels under each plot: lines of at least four numbers and nothing else. */
function xTickRows(words: WordBox[]): number[][] {
  const lines = new Map<string, WordBox[]>();
  for (const w of words) {
    const key = `${w.page}:${Math.round(w.yMin)}`;
    lines.set(key, [...(lines.get(key) ?? []), w]);
  }
  return [...lines.values()]
    .filter((line) => line.length >= 4 && line.every(isNumber))
    .map((line) => line.sort((a, b) => a.xMin - b.xMin).map((w) => Number(w.text)));
}

/** Tick labels right-aligned left of each plot's value axis (x = 74 pt), grouped by plot. */
function yTickColumns(words: WordBox[]): number[][] {
  const labels = words.filter((w) => isNumber(w) && w.xMax > 72 && w.xMax < 76 && w.xMin > 45);
  const columns: WordBox[][] = [];
  for (const w of labels.sort((a, b) => a.page - b.page || a.yMin - b.yMin)) {
    const last = columns.at(-1)?.at(-1);
    // Ticks of one plot are at most 50 pt apart; the next plot starts further down.
    if (last && last.page === w.page && w.yMin - last.yMin < 60) columns.at(-1)!.push(w);
    else columns.push([w]);
  }
  return columns.map((c) => c.map((w) => Number(w.text)).reverse());
}

// Each test renders whole PDFs and rasterises them with pdftoppm, which takes seconds on a busy
// machine: a minute per test rather than vitest's 5 s default.
describe('compliance report PDF, read back with poppler-utils', { timeout: 60_000 }, () => {
  it('prints ≤ ≥ ± ° and the en dash verbatim, which the standard PDF fonts cannot', async () => {
    const text = pageTexts(await renderReportPdf(sampleReport())).join('\n');
    expect(text).toContain('R ≤ 0.6 % over 450–650 nm');
    expect(text).toContain('T ≥ 98.5 % over 420–680 nm');
    expect(text).toContain('R = 4 ± 0.5 % over 840–860 nm');
    expect(text).toContain('0, 30°');
    expect(text).toContain('CIE 1931 2°');
    expect(text).toContain('(−)');
    expect(text).not.toContain('"d');
  });

  it('fills the header with the shop, customer, part, document number, versions and approval', async () => {
    const [first] = pageTexts(await renderReportPdf(sampleReport()));
    const line = (label: string, value: string) =>
      expect(first).toMatch(new RegExp(`${label}\\s+${value.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}`));
    expect(first).toContain('Larkspur Thin Film Works');
    line('Customer', 'Halden Vision Systems');
    line('Document no.', 'CR-000042');
    line('Part / design', 'HVS lens AR');
    line('Design version', '3');
    line('Spec mask', 'HVS-2210 lens AR');
    line('Mask revision', 'B');
    line('Approved by', 'Tomas Eklund');
    line('Approved on', '2026-11-30');
    line('Values', 'Designed values');
    line('Issued', '2026-12-02');
  });

  it('numbers every page "Page n of m" with the document number', async () => {
    const pages = pageTexts(
      await renderReportPdf(
        sampleReport({ layers: Array.from({ length: 60 }, () => sampleReport().layers![0]!) }),
      ),
    );
    expect(pages.length).toBeGreaterThan(1);
    pages.forEach((p, i) => {
      expect(p).toContain(`Page ${i + 1} of ${pages.length}`);
      expect(p).toContain('Compliance report CR-000042');
    });
  });

  it('never prints text over text, with long rules and labels wrapping inside their columns', async () => {
    const long = sampleReport();
    long.summary.bands[0]!.label = 'visible range for the front surface of the customer’s lens';
    long.summary.bands[1]!.rule = `${long.summary.bands[1]!.rule} and more words that must wrap inside the column`;
    const measured = sampleReport();
    measured.summary = { ...measured.summary, source: 'measured', pass: null };
    Object.assign(measured.summary.bands[3]!, {
      evaluated: false,
      pass: null,
      worstMargin: null,
      worstAtNm: null,
      worstAtDeg: null,
      valuePercent: null,
      reason: 'the measurement is R at 0°; this band is T',
    });
    for (const r of [sampleReport(), long, sampleReport({ layers: null }), measured]) {
      const words = wordBoxes(await renderReportPdf(r));
      expect(words.length).toBeGreaterThan(100);
      expect(overlappingWords(words).map(([a, b]) => `${a.text} × ${b.text}`)).toEqual([]);
    }
    // The reason sits under the rule, in whole words: "measurement" is not broken in a narrow column.
    const text = pageTexts(await renderReportPdf(measured)).join('\n');
    expect(text).toMatch(/Not evaluated: the measurement/);
  });

  it('labels both axes of every plot with round, evenly spaced ticks (Heckbert 1990)', async () => {
    const words = wordBoxes(await renderReportPdf(sampleReport()));
    const xRows = xTickRows(words);
    const yColumns = yTickColumns(words);
    expect(xRows).toHaveLength(3);
    expect(yColumns).toHaveLength(3);
    for (const row of [...xRows, ...yColumns]) expect(isRoundTickRow(row), row.join(' ')).toBe(true);
    // 429–665 nm: the axis runs 400–700 nm; the old ticks 429, 507, 586, 665 are gone.
    expect(xRows[0]).toEqual([400, 450, 500, 550, 600, 650, 700]);
    expect(yColumns[2]!.at(-1)).toBe(100);
  });

  it('keeps a short report on one page and says so when the layers are hidden', async () => {
    const pdf = await renderReportPdf(
      sampleReport({ layers: null, plots: sampleReport().plots.slice(0, 1) }),
    );
    const pages = pageTexts(pdf);
    expect(pages).toHaveLength(1);
    expect(pages[0]).toContain('The layer design is not disclosed in this report.');
    expect(pages[0]).not.toContain('Ta2O5');
    expect(pagePngs(pdf)).toHaveLength(1);
  });
});
