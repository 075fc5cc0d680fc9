import { runSheetCalibrationLine } from '@quietglass/shared/calibration';
import { formatToolingFactor, processLines } from '@quietglass/shared/chambers';
import { niceTicks } from '@quietglass/shared/plots/nice-ticks';
import { SIDES_LABELS, type RunSheetView } from '@quietglass/shared/runsheet';
import { monitorPlotData } from '@quietglass/shared/runsheet-signal';
import {
  BOLD,
  type Doc,
  drawDocumentHeader,
  drawFields,
  drawFooters,
  drawTable,
  fill,
  GRID,
  INK,
  LIMIT,
  MARGIN,
  MUTED,
  newDocument,
  pageBottom,
  REGULAR,
  room,
  RULE_LINE,
} from '../common/pdf-layout.js';
import { elementAt } from '@quietglass/shared/checked';

/** One colour per material in the monitor chart, in the order materials first appear. */
const MATERIAL_COLOURS = ['#1f6f78', '#b2432c', '#5b4a9e', '#7a8a1f', '#a8632a', '#2d5c8f'];

/** Least and most height of the chart's plot area, pt; it takes what the page has between. */
const CHART_MIN_H = 170;
const CHART_MAX_H = 300;
/** What the chart needs besides its plot area: title, note, axis labels and legend, pt. */
const CHART_FRAME_H = 80;
/** Body rows of the layer table leave room to write the actual values by hand, pt. */
const WRITING_ROW_H = 24;

const fixed = (v: number, digits: number) => v.toFixed(digits).replace(/^-/, '−');

/** Number of a layer's monitor-QWOT column: 'Monitor QWOT at 550 nm'. */
export function qwotColumnTitle(monitorWavelengthNm: number): string {
  return `Monitor QWOT at ${monitorWavelengthNm} nm`;
}

/**
 * The expected monitor signal of the whole run across the page width: one curve per layer coloured
 * by material, dashed rules where layers stop, diamonds at turning points, round ticks on both axes
 * (Heckbert, Graphics Gems, 1990). `y` is the top of the title.
 */
function drawMonitorChart(doc: Doc, sheet: RunSheetView, x: number, y: number, w: number, h: number): void {
  const { traces, turningPoints, layerEnds } = monitorPlotData(sheet.layers);
  const top = y + 32;
  const allY = traces.flatMap((t) => t.y);
  const xt = niceTicks(0, sheet.totals.monitorThicknessNm, 12);
  const yt = niceTicks(Math.min(...allY), Math.max(...allY), 6);
  const px = (v: number) => x + ((v - xt.min) / (xt.max - xt.min)) * w;
  const py = (v: number) => top + h - ((v - yt.min) / (yt.max - yt.min)) * h;
  const lambda = sheet.monitorWavelengthNm;

  doc.save();
  doc
    .font(BOLD)
    .fontSize(10)
    .fillColor(INK)
    .text('Expected monitor signal', x - 40, y, { width: w + 40 });
  doc
    .font(REGULAR)
    .fontSize(7.5)
    .fillColor(MUTED)
    .text(
      `Transmittance through the monitor chip at λ = ${lambda} nm against the thickness deposited on the monitor; dashed rules where each layer stops (step numbers above), diamonds at turning points.`,
      x - 40,
      y + 13,
      { width: w + 40 },
    );
  doc.fillColor(INK).text('T (%)', x - 40, top - 2, { width: 34, align: 'right', lineBreak: false });

  doc.lineWidth(0.4).strokeColor(GRID);
  for (const t of yt.ticks) {
    doc
      .moveTo(x, py(t))
      .lineTo(x + w, py(t))
      .stroke();
    if (t !== yt.max)
      doc.text(t.toFixed(yt.decimals), x - 40, py(t) - 3.5, { width: 34, align: 'right', lineBreak: false });
  }
  for (const t of xt.ticks) {
    doc
      .moveTo(px(t), top)
      .lineTo(px(t), top + h)
      .stroke();
    doc.text(t.toFixed(xt.decimals), px(t) - 20, top + h + 5, {
      width: 40,
      align: 'center',
      lineBreak: false,
    });
  }

  // Layer ends: dashed rules, with the step number centred over each layer where it fits.
  doc.save().lineWidth(0.6).strokeColor(RULE_LINE).dash(2, { space: 2 });
  for (const end of layerEnds.x) {
    doc
      .moveTo(px(end), top)
      .lineTo(px(end), top + h)
      .stroke();
  }
  doc.undash().restore();
  doc.font(REGULAR).fontSize(6.5).fillColor(MUTED);
  let start = 0;
  let lastRight = -Infinity;
  sheet.layers.forEach((l, i) => {
    const end = elementAt(layerEnds.x, i, 'the layer ends');
    const centre = px((start + end) / 2);
    const label = String(l.step);
    const half = doc.widthOfString(label) / 2;
    if (centre - half > lastRight + 2) {
      doc.text(label, centre - half, top + 3, { lineBreak: false });
      lastRight = centre + half;
    }
    start = end;
  });

  doc.save();
  doc.rect(x, top, w, h).clip();
  const materials = [...new Set(traces.map((t) => t.material))];
  const colour = (m: string) =>
    elementAt(MATERIAL_COLOURS, materials.indexOf(m) % MATERIAL_COLOURS.length, 'the material colours');
  for (const t of traces) {
    doc.lineWidth(1.3).strokeColor(colour(t.material));
    t.x.forEach((v, i) => {
      const y = elementAt(t.y, i, 'the monitor trace');
      if (i === 0) doc.moveTo(px(v), py(y));
      else doc.lineTo(px(v), py(y));
    });
    doc.stroke();
  }
  doc.fillColor(LIMIT);
  turningPoints.x.forEach((v, i) => {
    const cx = px(v);
    const cy = py(elementAt(turningPoints.y, i, 'the turning points'));
    doc
      .moveTo(cx, cy - 3)
      .lineTo(cx + 3, cy)
      .lineTo(cx, cy + 3)
      .lineTo(cx - 3, cy)
      .closePath()
      .fill();
  });
  doc.restore();

  doc.lineWidth(0.6).strokeColor(INK).rect(x, top, w, h).stroke();
  doc
    .font(REGULAR)
    .fontSize(8)
    .fillColor(INK)
    .text('Thickness deposited on the monitor (nm)', x, top + h + 16, { width: w, align: 'center' });

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
  for (const m of materials) {
    entry(m, () =>
      doc
        .lineWidth(1.3)
        .strokeColor(colour(m))
        .moveTo(lx, ly)
        .lineTo(lx + 16, ly)
        .stroke(),
    );
  }
  entry('Turning point', () =>
    doc
      .fillColor(LIMIT)
      .moveTo(lx + 8, ly - 3)
      .lineTo(lx + 11, ly)
      .lineTo(lx + 8, ly + 3)
      .lineTo(lx + 5, ly)
      .closePath()
      .fill(),
  );
  doc.restore();
}

/** Sign-off lines for the operator and the checker: name, signature, date and time. */
function drawSignOff(doc: Doc, x: number, y: number, w: number): number {
  const half = (w - 20) / 2;
  doc.font(BOLD).fontSize(10).fillColor(INK).text('Sign-off', x, y, { width: w });
  const top = doc.y + 6;
  (['Run by (operator)', 'Checked by'] as const).forEach((who, i) => {
    const cx = x + i * (half + 20);
    doc.font(BOLD).fontSize(8).fillColor(INK).text(who, cx, top, { width: half });
    (['Name', 'Signature', 'Date and time'] as const).forEach((field, j) => {
      const fy = top + 24 + j * 22;
      doc
        .font(REGULAR)
        .fontSize(7.5)
        .fillColor(MUTED)
        .text(field, cx, fy - 8, { width: 70, lineBreak: false });
      doc
        .save()
        .lineWidth(0.5)
        .strokeColor(INK)
        .moveTo(cx + 72, fy)
        .lineTo(cx + half, fy)
        .stroke()
        .restore();
    });
  });
  return top + 24 + 3 * 22;
}

/**
 * The run sheet as a PDF (A4 landscape): header with the shop, what the run coats, the cautions,
 * the layers with process settings per layer and columns to write the actual values in, totals,
 * sign-off lines and the expected monitor signal sized to the page; "Page n of m" on every page.
 */
export function renderRunSheetPdf(
  sheet: RunSheetView,
  extra: { logo: Buffer | null; printedOn: string },
): Promise<Buffer> {
  const { recipe } = sheet;
  const { doc, done } = newDocument({
    layout: 'landscape',
    info: { Title: `Run sheet ${recipe.name} v${recipe.number}`, Author: sheet.shop.name },
  });
  const width = doc.page.width - 2 * MARGIN;
  const lambda = sheet.monitorWavelengthNm;
  let y = drawDocumentHeader(doc, {
    title: 'Run sheet',
    shopName: sheet.shop.name,
    logo: extra.logo,
    reference: `${recipe.name} · version ${recipe.number}`,
  });
  const { substrate, job } = sheet;
  const thickness =
    substrate.thicknessMm === substrate.designThicknessMm
      ? `${substrate.thicknessMm} mm`
      : `${substrate.thicknessMm} mm (design: ${substrate.designThicknessMm} mm)`;
  y = drawFields(
    doc,
    [
      ['Customer', recipe.customer],
      ['Recipe', `${recipe.name}, version ${recipe.number} (released)`],
      ['Part', job.part || '—'],
      ['Quantity', job.quantity === null ? '—' : `${job.quantity} pcs`],
      ['Substrate', `${substrate.material}, ${thickness} thick`],
      ['Sides to coat', SIDES_LABELS[job.sides]],
      ['Chamber', sheet.chamber.name],
      ['Monitor', `λ = ${lambda} nm, transmittance through the monitor chip`],
      ['Printed', extra.printedOn],
      ['Lot / run no.', '________________________'],
    ],
    MARGIN,
    y + 8,
    width,
  );
  doc
    .font(REGULAR)
    .fontSize(7.5)
    .fillColor(MUTED)
    .text(
      `${sheet.convention} Step 1 goes on the substrate first; the last step is the outermost layer.`,
      MARGIN,
      y + 2,
      { width },
    );
  y = doc.y + 6;
  doc.text(
    runSheetCalibrationLine(
      sheet.calibration,
      sheet.layers.map((l) => l.material),
    ),
    MARGIN,
    y - 4,
    { width },
  );
  y = doc.y + 6;

  doc.font(BOLD).fontSize(9).fillColor(LIMIT).text('Safety', MARGIN, y, { width });
  doc.font(REGULAR).fontSize(7).fillColor(INK);
  for (const c of sheet.cautions) doc.text(`•  ${c}`, MARGIN, doc.y + 1, { width });
  y = doc.y + 8;

  const cols = fill(width, [
    { title: 'Step', width: 26 },
    { title: 'Material', width: 58 },
    { title: 'Part thickness (nm)', width: 48, align: 'right' },
    { title: 'Tooling factor', width: 40, align: 'right' },
    { title: 'Monitor thickness (nm)', width: 50, align: 'right' },
    { title: qwotColumnTitle(lambda), width: 50, align: 'right' },
    { title: 'Rate (nm/s)', width: 36, align: 'right' },
    { title: 'Time (s)', width: 34, align: 'right' },
    { title: 'Turning points (monitor nm into layer)', width: 64 },
    { title: 'Process settings', width: 176 },
    { title: 'Actual end thickness (nm)', width: 54 },
    { title: 'Actual rate (nm/s)', width: 58 },
    { title: 'Remarks' },
  ]);
  y = drawTable(
    doc,
    cols,
    sheet.layers.map((l) => [
      String(l.step),
      l.material,
      fixed(l.partThicknessNm, 2),
      formatToolingFactor(l.toolingFactor),
      fixed(l.monitorThicknessNm, 2),
      fixed(l.qwotAtMonitor, 3),
      fixed(l.rateNmPerS, 2),
      fixed(l.timeS, 0),
      l.turningPointsNm.map((t) => t.toFixed(1)).join(', ') || '—',
      l.process ? processLines(l.process).join('\n') : 'none kept for this material on this chamber',
      '',
      '',
      '',
    ]),
    MARGIN,
    y,
    { size: 7, minRowHeight: WRITING_ROW_H, columnRules: true },
  );
  const minutes = sheet.totals.timeS / 60;
  const totals = `Totals: ${fixed(sheet.totals.partThicknessNm, 1)} nm on the part (${fixed(sheet.totals.partThicknessNm / 1000, 3)} µm), ${fixed(sheet.totals.monitorThicknessNm, 1)} nm on the monitor, ${fixed(minutes, 1)} min deposition at the rates above (pump-down, heating and venting not included).`;
  doc.font(BOLD).fontSize(8);
  y = room(doc, y + 6, doc.heightOfString(totals, { width }));
  doc.fillColor(INK).text(totals, MARGIN, y, { width });
  y = doc.y + 12;

  y = room(doc, y, 110);
  y = drawSignOff(doc, MARGIN, y, width) + 14;

  y = room(doc, y, CHART_MIN_H + CHART_FRAME_H);
  const chartH = Math.min(CHART_MAX_H, pageBottom(doc) - y - CHART_FRAME_H);
  // The last x tick label is centred on the right edge of the plot: keep half a label inside the margin.
  drawMonitorChart(doc, sheet, MARGIN + 40, y, width - 40 - 12, chartH);

  drawFooters(doc, `${sheet.shop.name} · Run sheet ${recipe.name} v${recipe.number} · ${sheet.chamber.name}`);
  doc.end();
  return done;
}
