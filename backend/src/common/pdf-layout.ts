/*
 * Layout pieces of the PDFs the shop hands out (compliance reports, run sheets): the embedded
 * font, colours, wrapping tables, label–value fields, the header with the shop's name and logo,
 * and the "Page n of m" footer.
 */
import { fileURLToPath } from 'node:url';
import PDFDocument from 'pdfkit';
import { elementAt } from '@quietglass/shared/checked';

/*
 * DejaVu Sans (Bitstream Vera licence, backend/assets/fonts/LICENSE-DejaVu.txt) has every symbol
 * the report prints: ≤ ≥ ± ° µ λ θ Δ – —. The PDF's standard fonts have no ≤ or ≥. The path is
 * the same from src/common and dist/common.
 */
const FONT_REGULAR = fileURLToPath(new URL('../../assets/fonts/DejaVuSans.ttf', import.meta.url));
const FONT_BOLD = fileURLToPath(new URL('../../assets/fonts/DejaVuSans-Bold.ttf', import.meta.url));
export const REGULAR = 'Body';
export const BOLD = 'Body-Bold';

export const INK = '#1d2b33';
export const MUTED = '#4f5f67';
export const GRID = '#d5dde1';
export const CURVE = '#1f6f78';
export const LIMIT = '#b2432c';
export const FORBIDDEN = '#c8553d';
export const RULE_LINE = '#9aa8ae';

export const MARGIN = 40;
/** Space kept free at the foot of each page for the footer line, pt. */
export const FOOTER_SPACE = 28;
export const CELL_PAD = 3;

/** A value with a true minus sign (U+2212), or a dash when there is none. */
export function fmt(v: number | null | undefined, digits = 3): string {
  return v === null || v === undefined || !Number.isFinite(v) ? '—' : v.toFixed(digits).replace(/^-/, '−');
}

export type Doc = PDFKit.PDFDocument;

export function pageBottom(doc: Doc): number {
  return doc.page.height - MARGIN - FOOTER_SPACE;
}

/** Starts a new page when `height` pt do not fit below `y`; returns where to draw. */
export function room(doc: Doc, y: number, height: number): number {
  if (y + height <= pageBottom(doc)) return y;
  doc.addPage();
  return MARGIN;
}

export interface Column {
  title: string;
  width: number;
  align?: 'left' | 'right';
}

/** Height of a table row whose cells wrap inside their columns, pt. */
export function rowHeight(doc: Doc, cols: Column[], cells: string[], font: string, size: number): number {
  doc.font(font).fontSize(size);
  let h = 0;
  cells.forEach((c, i) => {
    h = Math.max(
      h,
      doc.heightOfString(c, { width: elementAt(cols, i, 'the table columns').width - 2 * CELL_PAD }),
    );
  });
  return h + 2 * CELL_PAD;
}

export function drawRow(
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
    const col = elementAt(cols, i, 'the table columns');
    doc.text(c, cx + CELL_PAD, y + CELL_PAD, {
      width: col.width - 2 * CELL_PAD,
      align: col.align ?? 'left',
    });
    cx += col.width;
  });
}

/** Extra table options: taller rows to write in, and rules between the columns. */
export interface TableOptions {
  /** Font size, pt. */
  size?: number;
  /** Least height of a body row, pt (room for handwriting). */
  minRowHeight?: number;
  /** Vertical rules between columns, for tables that are filled in by hand. */
  columnRules?: boolean;
}

/**
 * A table whose cells wrap within their columns: each row is as tall as its tallest cell, so no
 * text runs into the next column or row. The header row repeats after a page break. Returns the y
 * below the table.
 */
export function drawTable(
  doc: Doc,
  cols: Column[],
  rows: string[][],
  x: number,
  y: number,
  options: TableOptions | number = {},
): number {
  const {
    size = 8,
    minRowHeight = 0,
    columnRules = false,
  } = typeof options === 'number' ? { size: options } : options;
  const width = cols.reduce((s, c) => s + c.width, 0);
  const header = cols.map((c) => c.title);
  const headerH = rowHeight(doc, cols, header, BOLD, size);
  const rules = (from: number, to: number) => {
    if (!columnRules) return;
    doc.save().lineWidth(0.4).strokeColor(GRID);
    let cx = x;
    for (const c of cols.slice(0, -1)) {
      cx += c.width;
      doc.moveTo(cx, from).lineTo(cx, to).stroke();
    }
    doc.restore();
  };
  const drawHeader = (at: number) => {
    doc.save().rect(x, at, width, headerH).fill('#eef2f4').restore();
    drawRow(doc, cols, header, x, at, BOLD, size);
    rules(at, at + headerH);
    return at + headerH;
  };
  y = drawHeader(room(doc, y, headerH + Math.max(16, minRowHeight)));
  for (const row of rows) {
    const h = Math.max(minRowHeight, rowHeight(doc, cols, row, REGULAR, size));
    const at = room(doc, y, h);
    y = at === y ? y : drawHeader(at);
    drawRow(doc, cols, row, x, y, REGULAR, size);
    rules(y, y + h);
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
export function fill(total: number, cols: (Column | Omit<Column, 'width'>)[]): Column[] {
  const fixed = cols.reduce((s, c) => s + ('width' in c ? c.width : 0), 0);
  const flexible = cols.filter((c) => !('width' in c)).length;
  return cols.map((c) => ('width' in c ? c : { ...c, width: (total - fixed) / flexible }));
}

/** Label–value pairs in two columns, values wrapping. Returns the y below. */
export function drawFields(
  doc: Doc,
  fields: [string, string][],
  x: number,
  y: number,
  width: number,
): number {
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

/** A new A4 document with the embedded font registered and its bytes collected. */
export function newDocument(options: PDFKit.PDFDocumentOptions): { doc: Doc; done: Promise<Buffer> } {
  const doc = new PDFDocument({ size: 'A4', margin: MARGIN, bufferPages: true, ...options });
  doc.registerFont(REGULAR, FONT_REGULAR);
  doc.registerFont(BOLD, FONT_BOLD);
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks))));
  return { doc, done };
}

/** Logo box in the header, pt: wide logos are scaled to fit it, keeping their proportions. */
export const LOGO_BOX = { width: 120, height: 36 } as const;

/**
 * The header of every document: the shop's logo (when uploaded) at the left, the title and the
 * shop's name beside it, a reference (document number, recipe) at the right, then a rule across.
 * Returns the y of the rule.
 */
export function drawDocumentHeader(
  doc: Doc,
  h: { title: string; shopName: string; logo: Buffer | null; reference: string },
): number {
  const width = doc.page.width - 2 * MARGIN;
  let x = MARGIN;
  let height = 40;
  if (h.logo) {
    doc.image(h.logo, MARGIN, MARGIN, { fit: [LOGO_BOX.width, LOGO_BOX.height], valign: 'center' });
    x += LOGO_BOX.width + 12;
    height = Math.max(height, LOGO_BOX.height + 6);
  }
  const refWidth = 200;
  doc
    .font(BOLD)
    .fontSize(16)
    .fillColor(INK)
    .text(h.title, x, MARGIN, { width: MARGIN + width - refWidth - x, lineBreak: false });
  doc
    .font(BOLD)
    .fontSize(10)
    .text(h.reference, MARGIN + width - refWidth, MARGIN + 4, { width: refWidth, align: 'right' });
  doc
    .font(REGULAR)
    .fontSize(10)
    .fillColor(MUTED)
    .text(h.shopName, x, MARGIN + 22, { width: MARGIN + width - refWidth - x, lineBreak: false });
  const y = MARGIN + height;
  doc
    .save()
    .lineWidth(0.8)
    .strokeColor(INK)
    .moveTo(MARGIN, y)
    .lineTo(MARGIN + width, y)
    .stroke()
    .restore();
  return y;
}

/** "Page n of m" and a line naming the document on every page, written once all pages exist. */
export function drawFooters(doc: Doc, label: string): void {
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
    doc.text(label, MARGIN, y, { width: (w * 2) / 3, lineBreak: false });
    doc.text(`Page ${i - range.start + 1} of ${range.count}`, MARGIN + (w * 2) / 3, y, {
      width: w / 3,
      align: 'right',
      lineBreak: false,
    });
    doc.page.margins.bottom = bottom;
  }
}
