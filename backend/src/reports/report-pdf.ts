import PDFDocument from 'pdfkit';
import type { LimitBand } from '@quietglass/shared/optics/mask';
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
  customer: string;
  part: string;
  version: number;
  mask: string;
  date: string;
  statement: string;
  plots: PlotSeries[];
  summary: ReportSummary;
  layers: { material: string; thicknessNm: number }[] | null;
}

const INK = '#1d2b33';
const GRID = '#c9d3d8';
const CURVE = '#1f6f78';
const FORBIDDEN = '#c8553d';

function fmt(v: number | null, digits = 3): string {
  return v === null || !Number.isFinite(v) ? '—' : v.toFixed(digits);
}

/** A spectrum against its limit bands, drawn as vector graphics: forbidden regions shaded. */
function drawPlot(doc: PDFKit.PDFDocument, s: PlotSeries, x: number, y: number, w: number, h: number): void {
  const xs = s.wavelengthsNm;
  const x0 = Math.min(xs[0], ...s.bands.map((b) => b.from_nm));
  const x1 = Math.max(xs[xs.length - 1], ...s.bands.map((b) => b.to_nm));
  const limits = s.bands.flatMap((b) =>
    [b.max_percent, b.min_percent, b.target_percent].filter((v): v is number => v !== undefined),
  );
  const yTop =
    s.quantity === 'R' ? Math.max(1, Math.ceil(Math.max(...s.valuesPercent, ...limits) * 1.25 * 2) / 2) : 100;
  const yBottom =
    s.quantity === 'R' ? 0 : Math.max(0, Math.floor(Math.min(...s.valuesPercent, ...limits) / 5) * 5 - 5);
  const px = (wl: number) => x + ((wl - x0) / (x1 - x0)) * w;
  const py = (v: number) => y + h - ((Math.min(Math.max(v, yBottom), yTop) - yBottom) / (yTop - yBottom)) * h;
  doc.save();
  doc.lineWidth(0.4).strokeColor(GRID);
  for (let i = 0; i <= 5; i++) {
    const gy = y + (h * i) / 5;
    doc
      .moveTo(x, gy)
      .lineTo(x + w, gy)
      .stroke();
    doc
      .fillColor(INK)
      .fontSize(7)
      .text((yTop - ((yTop - yBottom) * i) / 5).toFixed(2), x - 30, gy - 3, { width: 26, align: 'right' });
  }
  for (let i = 0; i <= 6; i++) {
    const gx = x + (w * i) / 6;
    doc
      .moveTo(gx, y)
      .lineTo(gx, y + h)
      .stroke();
    doc
      .fillColor(INK)
      .fontSize(7)
      .text((x0 + ((x1 - x0) * i) / 6).toFixed(0), gx - 15, y + h + 3, { width: 30, align: 'center' });
  }
  // Forbidden regions of each band.
  doc.fillColor(FORBIDDEN).fillOpacity(0.18);
  for (const b of s.bands) {
    const left = px(b.from_nm);
    const width = Math.max(1, px(b.to_nm) - left);
    if (b.max_percent !== undefined) doc.rect(left, y, width, py(b.max_percent) - y).fill();
    if (b.min_percent !== undefined)
      doc.rect(left, py(b.min_percent), width, y + h - py(b.min_percent)).fill();
    if (b.target_percent !== undefined) {
      const hi = b.target_percent + (b.tolerance_percent ?? 0);
      const lo = b.target_percent - (b.tolerance_percent ?? 0);
      doc.rect(left, y, width, py(hi) - y).fill();
      doc.rect(left, py(lo), width, y + h - py(lo)).fill();
    }
  }
  doc.fillOpacity(1);
  doc.lineWidth(1.1).strokeColor(CURVE);
  xs.forEach((wl, i) => {
    const cx = px(wl);
    const cy = py(s.valuesPercent[i]);
    if (i === 0) doc.moveTo(cx, cy);
    else doc.lineTo(cx, cy);
  });
  doc.stroke();
  doc.lineWidth(0.6).strokeColor(INK).rect(x, y, w, h).stroke();
  doc
    .fillColor(INK)
    .fontSize(8)
    .text('Wavelength (nm)', x, y + h + 14, { width: w, align: 'center' });
  doc.fontSize(8).text(`${s.quantity} (%)`, x - 34, y - 12);
  doc
    .fontSize(9)
    .font('Helvetica-Bold')
    .text(s.title, x, y - 24, { width: w });
  doc.font('Helvetica');
  doc.restore();
}

/** The compliance report as a PDF (A4). */
export function renderReportPdf(r: ReportDocument): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    margin: 40,
    info: { Title: `Spec compliance — ${r.part} v${r.version}` },
  });
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks))));

  doc.fillColor(INK).font('Helvetica-Bold').fontSize(16).text('Spec compliance report');
  doc.font('Helvetica').fontSize(10);
  doc.text(`${r.shop}`);
  doc.text(`Customer: ${r.customer}    Part: ${r.part}    Design version: ${r.version}`);
  doc.text(`Spec mask: ${r.mask}    Date: ${r.date}`);
  doc.moveDown(0.3).fontSize(9).fillColor('#44545c').text(r.statement);
  doc.fillColor(INK);
  const overall = r.summary.pass === null ? 'NOT FULLY EVALUATED' : r.summary.pass ? 'PASS' : 'FAIL';
  doc
    .moveDown(0.4)
    .font('Helvetica-Bold')
    .fontSize(12)
    .text(`Overall: ${overall}    Worst margin: ${fmt(r.summary.worstMargin)} percentage points`);
  doc.font('Helvetica');

  let y = doc.y + 40;
  for (const plot of r.plots) {
    if (y + 190 > 800) {
      doc.addPage();
      y = 70;
    }
    drawPlot(doc, plot, 80, y, 440, 150);
    y += 210;
  }
  doc.y = y - 20;
  if (doc.y > 640) doc.addPage();
  doc.font('Helvetica-Bold').fontSize(10).text('Limit bands', 40);
  doc.font('Helvetica').fontSize(8);
  const cols = [40, 70, 170, 255, 305, 360, 420, 480];
  let ty = doc.y + 4;
  ['Band', 'Rule', 'Angles', 'Pol.', 'Value %', 'At nm', 'Margin pp', 'Result'].forEach((h, i) =>
    doc.font('Helvetica-Bold').text(h, cols[i], ty, { lineBreak: false }),
  );
  doc.font('Helvetica');
  ty += 12;
  for (const b of r.summary.bands) {
    if (ty > 790) {
      doc.addPage();
      ty = 40;
    }
    const result = !b.evaluated ? 'not evaluated' : b.pass ? 'PASS' : 'FAIL';
    [
      String(b.band + 1),
      b.rule,
      b.angles,
      b.polarisation,
      fmt(b.valuePercent),
      fmt(b.worstAtNm, 1),
      fmt(b.worstMargin),
      result,
    ].forEach((v, i) =>
      doc.text(v, cols[i], ty, { lineBreak: false, width: (cols[i + 1] ?? 560) - cols[i] - 4 }),
    );
    ty += 12;
  }
  doc.y = ty + 8;
  if (r.summary.colour) {
    const c = r.summary.colour;
    doc
      .fontSize(9)
      .text(
        `Reflected colour at normal incidence (CIE 1931 2°, D65): L* ${c.L.toFixed(2)}, a* ${c.a.toFixed(2)}, b* ${c.b.toFixed(2)}; luminous reflectance Rv ${(c.Rv * 100).toFixed(3)} %`,
        40,
      );
  }
  if (r.layers) {
    doc.moveDown(0.6).font('Helvetica-Bold').fontSize(10).text('Layers (incident side first)', 40);
    doc.font('Helvetica').fontSize(8);
    r.layers.forEach((l, i) => doc.text(`${i + 1}. ${l.material} — ${l.thicknessNm.toFixed(2)} nm`, 40));
  } else {
    doc.moveDown(0.6).fontSize(8).text('The layer design is not disclosed in this report.', 40);
  }
  doc.end();
  return done;
}
