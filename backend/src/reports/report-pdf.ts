import type { LimitBand } from '@quietglass/shared/optics/mask';
import { niceTicks } from '@quietglass/shared/plots/nice-ticks';
import type { ReportSummary } from '@quietglass/shared/reports';
import {
  BOLD,
  CURVE,
  type Doc,
  drawDocumentHeader,
  drawFields,
  drawFooters,
  drawTable,
  fill,
  fmt,
  FORBIDDEN,
  GRID,
  INK,
  LIMIT,
  MARGIN,
  MUTED,
  newDocument,
  REGULAR,
  room,
} from '../common/pdf-layout.js';
import { elementAt } from '@quietglass/shared/checked';

export interface PlotSeries {
  title: string;
  quantity: 'R' | 'T';
  wavelengthsNm: number[];
  valuesPercent: number[];
  bands: LimitBand[];
}

export interface ReportDocument {
  shop: string;
  /** The shop's logo (PNG or JPEG) for the header, when one was uploaded. */
  logo?: Buffer | null;
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
    Math.min(elementAt(xs, 0, 'the plotted wavelengths'), ...s.bands.map((b) => b.from_nm)),
    Math.max(elementAt(xs, xs.length - 1, 'the plotted wavelengths'), ...s.bands.map((b) => b.to_nm)),
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
    const value = elementAt(s.valuesPercent, i, 'the plotted values');
    if (i === 0) doc.moveTo(px(wl), py(value));
    else doc.lineTo(px(wl), py(value));
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

/** The compliance report as a PDF (A4). */
export function renderReportPdf(r: ReportDocument): Promise<Buffer> {
  const { doc, done } = newDocument({
    info: { Title: `Compliance report ${r.documentNumber} — ${r.part} v${r.version}`, Author: r.shop },
  });
  const width = doc.page.width - 2 * MARGIN;
  const source = r.summary.source === 'designed' ? 'designed' : 'measured';
  let y = drawDocumentHeader(doc, {
    title: 'Spec compliance report',
    shopName: r.shop,
    logo: r.logo ?? null,
    reference: r.documentNumber,
  });
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
  drawFooters(doc, `${r.shop} · Compliance report ${r.documentNumber}`);
  doc.end();
  return done;
}
