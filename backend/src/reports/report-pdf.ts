import { fileURLToPath } from 'node:url';
import PDFDocument from 'pdfkit';
import type { LimitBand } from '@quietglass/shared/optics/mask';
import { niceTicks } from '@quietglass/shared/plots/nice-ticks';
import type { ReportSummary } from '@quietglass/shared/reports';

export interface PlotSeries {
  title: string;
  quantity: 'R' | 'T';
  wavelengthsNm: number[];
  valuesPercent: number[];
  bands: LimitBand[];
}

export interface ReportDocument {
  shop: string;
  /** Stable per report: see documentNumber(). */
  documentNumber: string;
  customer: string;
  part: string;
  version: number;
  /** Who approved the version and when (YYYY-MM-DD); null when no approval is on record. */
  approval: { by: string; on: string } | null;
  mask: string;
  maskRevision: string;
  date: string;
  statement: string;
  plots: PlotSeries[];
  summary: ReportSummary;
  layers: { material: string; thicknessNm: number }[] | null;
}

/** A report's document number, derived from its id alone so it never changes: CR-000042. */
export function documentNumber(reportId: number): string {
  return `CR-${String(reportId).padStart(6, '0')}`;
}

/*
 * DejaVu Sans (Bitstream Vera licence, backend/assets/fonts/LICENSE-DejaVu.txt) has every symbol
 * the report prints: ≤ ≥ ± ° µ λ θ Δ – —. The PDF's standard fonts have no ≤ or ≥. The path is
 * the same from src/reports and dist/reports.
 */
const FONT_REGULAR = fileURLToPath(new URL('../../assets/fonts/DejaVuSans.ttf', import.meta.url));
const FONT_BOLD = fileURLToPath(new URL('../../assets/fonts/DejaVuSans-Bold.ttf', import.meta.url));
const REGULAR = 'Body';
const BOLD = 'Body-Bold';

const INK = '#1d2b33';
const MUTED = '#4f5f67';
const GRID = '#d5dde1';
const CURVE = '#1f6f78';
const LIMIT = '#b2432c';
const FORBIDDEN = '#c8553d';
const RULE_LINE = '#9aa8ae';

const MARGIN = 40;
/** Space kept free at the foot of each page for the footer line, pt. */
const FOOTER_SPACE = 28;
const CELL_PAD = 3;

/** A value with a true minus sign (U+2212), or a dash when there is none. */
function fmt(v: number | null | undefined, digits = 3): string {
  return v === null || v === undefined || !Number.isFinite(v) ? '—' : v.toFixed(digits).replace(/^-/, '−');
}

type Doc = PDFKit.PDFDocument;

function pageBottom(doc: Doc): number {
  return doc.page.height - MARGIN - FOOTER_SPACE;
}

/** Starts a new page when `height` pt do not fit below `y`; returns where to draw. */
function room(doc: Doc, y: number, height: number): number {
  if (y + height <= pageBottom(doc)) return y;
  doc.addPage();
  return MARGIN;
}

interface Column {
  title: string;
  width: number;
  align?: 'left' | 'right';
}

/** Height of a table row whose cells wrap inside their columns, pt. */
function rowHeight(doc: Doc, cols: Column[], cells: string[], font: string, size: number): number {
  doc.font(font).fontSize(size);
  let h = 0;
  cells.forEach((c, i) => {
    h = Math.max(h, doc.heightOfString(c, { width: cols[i].width - 2 * CELL_PAD }));
  });
  return h + 2 * CELL_PAD;
}

function drawRow(
  doc: Doc,
  cols: Column[],
  cells: string[],
  x: number,
  y: number,
  font: string,
  size: number,
) {
  doc.font(font).fontSize(size).fillColor(INK);
  let cx = x;
  cells.forEach((c, i) => {
    doc.text(c, cx + CELL_PAD, y + CELL_PAD, {
      width: cols[i].width - 2 * CELL_PAD,
      align: cols[i].align ?? 'left',
    });
    cx += cols[i].width;
  });
}

/**
 * A table whose cells wrap within their columns: each row is as tall as its tallest cell, so no
 * text runs into the next column or row. The header row repeats after a page break. Returns the y
 * below the table.
 */
function drawTable(doc: Doc, cols: Column[], rows: string[][], x: number, y: number, size = 8): number {
  const width = cols.reduce((s, c) => s + c.width, 0);
  const header = cols.map((c) => c.title);
  const headerH = rowHeight(doc, cols, header, BOLD, size);
  const drawHeader = (at: number) => {
    doc.save().rect(x, at, width, headerH).fill('#eef2f4').restore();
    drawRow(doc, cols, header, x, at, BOLD, size);
    return at + headerH;
  };
  y = drawHeader(room(doc, y, headerH + 16));
  for (const row of rows) {
    const h = rowHeight(doc, cols, row, REGULAR, size);
    const at = room(doc, y, h);
    y = at === y ? y : drawHeader(at);
    drawRow(doc, cols, row, x, y, REGULAR, size);
    y += h;
    doc
      .save()
      .lineWidth(0.4)
      .strokeColor(GRID)
      .moveTo(x, y)
      .lineTo(x + width, y)
      .stroke()
      .restore();
  }
  return y;
}

/** Column widths that fill `total`: fixed ones as given, the rest share what is left. */
function fill(total: number, cols: (Column | Omit<Column, 'width'>)[]): Column[] {
  const fixed = cols.reduce((s, c) => s + ('width' in c ? c.width : 0), 0);
  const flexible = cols.filter((c) => !('width' in c)).length;
  return cols.map((c) => ('width' in c ? c : { ...c, width: (total - fixed) / flexible }));
}

/** Label–value pairs in two columns, values wrapping. Returns the y below. */
function drawFields(doc: Doc, fields: [string, string][], x: number, y: number, width: number): number {
  const half = width / 2;
  const labelW = 78;
  for (let i = 0; i < fields.length; i += 2) {
    const pair = fields.slice(i, i + 2);
    let h = 0;
    doc.font(REGULAR).fontSize(9);
    for (const [, value] of pair) h = Math.max(h, doc.heightOfString(value, { width: half - labelW - 8 }));
    pair.forEach(([label, value], j) => {
      const cx = x + j * half;
      doc
        .font(BOLD)
        .fontSize(8)
        .fillColor(MUTED)
        .text(label, cx, y + 1, { width: labelW - 4 });
      doc
        .font(REGULAR)
        .fontSize(9)
        .fillColor(INK)
        .text(value, cx + labelW, y, { width: half - labelW - 8 });
    });
    y += h + 4;
  }
  return y;
}

/** Where a band's limits lie: the limit values and which side of each is forbidden. */
function limitsOf(b: LimitBand): { value: number; forbidden: 'above' | 'below' }[] {
  const out: { value: number; forbidden: 'above' | 'below' }[] = [];
  if (b.max_percent !== undefined) out.push({ value: b.max_percent, forbidden: 'above' });
  if (b.min_percent !== undefined) out.push({ value: b.min_percent, forbidden: 'below' });
  if (b.target_percent !== undefined) {
    const tol = b.tolerance_percent ?? 0;
    out.push({ value: b.target_percent + tol, forbidden: 'above' });
    out.push({ value: b.target_percent - tol, forbidden: 'below' });
  }
  return out;
}

const PLOT_H = 150;
/** Height of a plot with its title, axis labels and legend, pt. */
const PLOT_BLOCK_H = PLOT_H + 78;

/**
 * A spectrum against its limit bands, as vector graphics: round axis ticks, each limit as a line
 * with its forbidden side shaded, a legend under the axis. `y` is the top of the title.
 */
function drawPlot(doc: Doc, s: PlotSeries, x: number, y: number, w: number, source: string): void {
  const top = y + 26;
  const h = PLOT_H;
  const xs = s.wavelengthsNm;
  const xt = niceTicks(
    Math.min(xs[0], ...s.bands.map((b) => b.from_nm)),
    Math.max(xs[xs.length - 1], ...s.bands.map((b) => b.to_nm)),
    11,
  );
  const limitValues = s.bands.flatMap((b) => limitsOf(b).map((l) => l.value));
  const yt =
    s.quantity === 'R'
      ? niceTicks(0, Math.max(0.5, ...s.valuesPercent, ...limitValues) * 1.1, 6)
      : niceTicks(Math.max(0, Math.min(...s.valuesPercent, ...limitValues) - 2), 100, 6);
  const yMax = s.quantity === 'T' ? Math.min(yt.max, 100) : yt.max;
  const yTicks = yt.ticks.filter((t) => t <= yMax);
  const px = (wl: number) => x + ((wl - xt.min) / (xt.max - xt.min)) * w;
  const py = (v: number) => top + h - ((v - yt.min) / (yMax - yt.min)) * h;

  doc.save();
  doc
    .font(BOLD)
    .fontSize(9)
    .fillColor(INK)
    .text(s.title, x - 36, y, { width: w + 36 });
  doc
    .font(REGULAR)
    .fontSize(7.5)
    .fillColor(INK)
    .text(`${s.quantity} (%)`, x - 38, top - 15, { width: 40 });

  doc.lineWidth(0.4).strokeColor(GRID);
  for (const t of yTicks) {
    doc
      .moveTo(x, py(t))
      .lineTo(x + w, py(t))
      .stroke();
    doc.text(t.toFixed(yt.decimals), x - 38, py(t) - 3.5, { width: 32, align: 'right', lineBreak: false });
  }
  for (const t of xt.ticks) {
    doc
      .moveTo(px(t), top)
      .lineTo(px(t), top + h)
      .stroke();
    doc.text(t.toFixed(xt.decimals), px(t) - 20, top + h + 6, {
      width: 40,
      align: 'center',
      lineBreak: false,
    });
  }

  // Forbidden sides shaded, then the limit lines over them; both clipped to the plot area.
  doc.save();
  doc.rect(x, top, w, h).clip();
  doc.fillColor(FORBIDDEN).fillOpacity(0.16);
  for (const b of s.bands) {
    const left = px(b.from_nm);
    const width = Math.max(1, px(b.to_nm) - left);
    for (const l of limitsOf(b)) {
      const ly = py(l.value);
      if (l.forbidden === 'above') doc.rect(left, top, width, ly - top).fill();
      else doc.rect(left, ly, width, top + h - ly).fill();
    }
  }
  doc.fillOpacity(1).lineWidth(1.4).strokeColor(LIMIT);
  for (const b of s.bands) {
    for (const l of limitsOf(b)) {
      doc
        .moveTo(px(b.from_nm), py(l.value))
        .lineTo(Math.max(px(b.from_nm) + 1, px(b.to_nm)), py(l.value))
        .stroke();
    }
  }
  doc.lineWidth(1.2).strokeColor(CURVE);
  xs.forEach((wl, i) => {
    if (i === 0) doc.moveTo(px(wl), py(s.valuesPercent[i]));
    else doc.lineTo(px(wl), py(s.valuesPercent[i]));
  });
  doc.stroke();
  doc.restore();

  doc.lineWidth(0.6).strokeColor(INK).rect(x, top, w, h).stroke();
  doc
    .fillColor(INK)
    .fontSize(8)
    .text('Wavelength (nm)', x, top + h + 16, { width: w, align: 'center' });

  // Legend: three swatches in a row under the axis title.
  const ly = top + h + 34;
  let lx = x;
  const entry = (label: string, swatch: () => void) => {
    swatch();
    doc
      .fillColor(INK)
      .fontSize(7.5)
      .text(label, lx + 22, ly - 4, { lineBreak: false });
    lx += 22 + doc.widthOfString(label) + 18;
  };
  entry(`${s.quantity}, ${source}`, () =>
    doc
      .lineWidth(1.2)
      .strokeColor(CURVE)
      .moveTo(lx, ly)
      .lineTo(lx + 16, ly)
      .stroke(),
  );
  entry('Limit', () =>
    doc
      .lineWidth(1.4)
      .strokeColor(LIMIT)
      .moveTo(lx, ly)
      .lineTo(lx + 16, ly)
      .stroke(),
  );
  entry('Outside the limit (forbidden)', () =>
    doc
      .rect(lx, ly - 4, 16, 8)
      .fillOpacity(0.16)
      .fill(FORBIDDEN)
      .fillOpacity(1),
  );
  doc.restore();
}

/** "Page n of m" and the document number on every page, written once all pages exist. */
function drawFooters(doc: Doc, r: ReportDocument): void {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    // Writing below the bottom margin would otherwise start a new page.
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    const y = doc.page.height - MARGIN - 12;
    const w = doc.page.width - 2 * MARGIN;
    doc
      .save()
      .lineWidth(0.5)
      .strokeColor(RULE_LINE)
      .moveTo(MARGIN, y - 6)
      .lineTo(MARGIN + w, y - 6)
      .stroke()
      .restore();
    doc.font(REGULAR).fontSize(7.5).fillColor(MUTED);
    doc.text(`${r.shop} · Compliance report ${r.documentNumber}`, MARGIN, y, {
      width: w / 2,
      lineBreak: false,
    });
    doc.text(`Page ${i - range.start + 1} of ${range.count}`, MARGIN + w / 2, y, {
      width: w / 2,
      align: 'right',
      lineBreak: false,
    });
    doc.page.margins.bottom = bottom;
  }
}

/** The compliance report as a PDF (A4). */
export function renderReportPdf(r: ReportDocument): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    margin: MARGIN,
    bufferPages: true,
    info: { Title: `Compliance report ${r.documentNumber} — ${r.part} v${r.version}`, Author: r.shop },
  });
  doc.registerFont(REGULAR, FONT_REGULAR);
  doc.registerFont(BOLD, FONT_BOLD);
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks))));
  const width = doc.page.width - 2 * MARGIN;
  const source = r.summary.source === 'designed' ? 'designed' : 'measured';

  doc
    .font(BOLD)
    .fontSize(16)
    .fillColor(INK)
    .text('Spec compliance report', MARGIN, MARGIN, { width: width - 160 });
  doc
    .font(BOLD)
    .fontSize(10)
    .text(r.documentNumber, MARGIN + width - 160, MARGIN + 4, { width: 160, align: 'right' });
  doc
    .font(REGULAR)
    .fontSize(10)
    .fillColor(MUTED)
    .text(r.shop, MARGIN, MARGIN + 22, { width });
  let y = MARGIN + 40;
  doc
    .save()
    .lineWidth(0.8)
    .strokeColor(INK)
    .moveTo(MARGIN, y)
    .lineTo(MARGIN + width, y)
    .stroke()
    .restore();
  y = drawFields(
    doc,
    [
      ['Customer', r.customer],
      ['Document no.', r.documentNumber],
      ['Part / design', r.part],
      ['Design version', String(r.version)],
      ['Spec mask', r.mask],
      ['Mask revision', r.maskRevision],
      ['Approved by', r.approval?.by ?? 'no approval on record'],
      ['Approved on', r.approval?.on ?? '—'],
      ['Values', source === 'designed' ? 'Designed values' : 'Measured values'],
      ['Issued', r.date],
    ],
    MARGIN,
    y + 8,
    width,
  );
  doc
    .font(REGULAR)
    .fontSize(8.5)
    .fillColor(MUTED)
    .text(r.statement, MARGIN, y + 4, { width });
  y = doc.y + 8;
  const overall = r.summary.pass === null ? 'NOT FULLY EVALUATED' : r.summary.pass ? 'PASS' : 'FAIL';
  doc
    .font(BOLD)
    .fontSize(12)
    .fillColor(r.summary.pass === false ? LIMIT : INK)
    .text(`Overall: ${overall}    Worst margin: ${fmt(r.summary.worstMargin)} percentage points`, MARGIN, y, {
      width,
    });
  y = doc.y + 16;

  for (const plot of r.plots) {
    y = room(doc, y, PLOT_BLOCK_H);
    drawPlot(doc, plot, MARGIN + 40, y, width - 48, source);
    y += PLOT_BLOCK_H + 6;
  }

  y = room(doc, y, 60);
  doc.font(BOLD).fontSize(10).fillColor(INK).text('Limit bands: worst point of each', MARGIN, y, { width });
  const cols = fill(width, [
    { title: 'Band', width: 34 },
    { title: 'Rule' },
    { title: 'Angles', width: 50 },
    { title: 'Pol.', width: 30 },
    { title: `Worst ${source} value (%)`, width: 58, align: 'right' },
    { title: 'At wavelength (nm)', width: 64, align: 'right' },
    { title: 'At angle', width: 38, align: 'right' },
    { title: 'Margin (pp)', width: 46, align: 'right' },
    { title: 'Result', width: 52 },
  ]);
  y = drawTable(
    doc,
    cols,
    r.summary.bands.map((b) => [
      String(b.band + 1),
      [b.rule, b.label, !b.evaluated && b.reason ? `Not evaluated: ${b.reason}` : '']
        .filter(Boolean)
        .join('\n'),
      b.angles,
      b.polarisation,
      fmt(b.valuePercent),
      fmt(b.worstAtNm, 1),
      b.worstAtDeg === undefined || b.worstAtDeg === null ? '—' : `${b.worstAtDeg}°`,
      fmt(b.worstMargin),
      !b.evaluated ? 'not evaluated' : b.pass ? 'PASS' : 'FAIL',
    ]),
    MARGIN,
    doc.y + 4,
  );
  y = room(doc, y + 4, 12);
  doc
    .font(REGULAR)
    .fontSize(7.5)
    .fillColor(MUTED)
    .text('Margin: percentage points inside (+) or outside (−) the limit at the worst point.', MARGIN, y, {
      width,
    });
  y = doc.y + 10;

  if (r.summary.colour) {
    const c = r.summary.colour;
    const text = `Reflected colour at normal incidence (CIE 1931 2°, D65): L* ${fmt(c.L, 2)}, a* ${fmt(c.a, 2)}, b* ${fmt(c.b, 2)}; luminous reflectance Rv ${fmt(c.Rv * 100)} %`;
    doc.font(REGULAR).fontSize(9);
    y = room(doc, y, doc.heightOfString(text, { width }));
    doc.fillColor(INK).text(text, MARGIN, y, { width });
    y = doc.y + 10;
  }
  if (r.layers) {
    y = room(doc, y, 50);
    doc.font(BOLD).fontSize(10).fillColor(INK).text('Layers (incident side first)', MARGIN, y, { width });
    drawTable(
      doc,
      [
        { title: 'Layer', width: 40 },
        { title: 'Material', width: 160 },
        { title: 'Physical thickness', width: 110, align: 'right' },
      ],
      r.layers.map((l, i) => [String(i + 1), l.material, `${l.thicknessNm.toFixed(2)} nm`]),
      MARGIN,
      doc.y + 4,
    );
  } else {
    y = room(doc, y, 20);
    doc
      .font(REGULAR)
      .fontSize(8.5)
      .fillColor(INK)
      .text('The layer design is not disclosed in this report.', MARGIN, y, { width });
  }
  drawFooters(doc, r);
  doc.end();
  return done;
}
