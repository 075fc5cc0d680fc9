/*
 * A PDF as a reader sees it, through Debian's poppler-utils: the text of each page (pdftotext),
 * the box of every word (pdftotext -bbox) and each page as a PNG (pdftoppm).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

export interface WordBox {
  page: number;
  text: string;
  xMin: number;
  yMin: number;
  xMax: number;
  yMax: number;
}

function withFile<T>(pdf: Buffer, fn: (file: string, dir: string) => T): T {
  const dir = mkdtempSync(path.join(tmpdir(), 'qg-pdf-'));
  try {
    const file = path.join(dir, 'doc.pdf');
    writeFileSync(file, pdf);
    return fn(file, dir);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** The text of each page, in reading order (pdftotext -layout), split at form feeds. */
export function pageTexts(pdf: Buffer): string[] {
  return withFile(pdf, (file) => {
    const out = execFileSync('pdftotext', ['-layout', '-enc', 'UTF-8', file, '-'], { encoding: 'utf8' });
    return out.split('\f').slice(0, -1);
  });
}

const decode = (s: string) =>
  s
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&quot;/g, '"')
    .replace(/&amp;/g, '&');

/** Every word with its box in pt, origin top left (pdftotext -bbox). */
export function wordBoxes(pdf: Buffer): WordBox[] {
  return withFile(pdf, (file) => {
    const html = execFileSync('pdftotext', ['-bbox', '-enc', 'UTF-8', file, '-'], { encoding: 'utf8' });
    const words: WordBox[] = [];
    html.split('<page ').forEach((chunk, i) => {
      if (i === 0) return;
      const re = /<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)<\/word>/g;
      for (const m of chunk.matchAll(re)) {
        words.push({
          page: i,
          xMin: Number(m[1]),
          yMin: Number(m[2]),
          xMax: Number(m[3]),
          yMax: Number(m[4]),
          text: decode(m[5]!),
        });
      }
    });
    return words;
  });
}

/**
 * Pairs of words whose boxes overlap by more than `tolerance` pt both ways. Glyph boxes of
 * neighbouring words on one line touch; anything more is text printed over text.
 */
export function overlappingWords(words: WordBox[], tolerance = 0.6): [WordBox, WordBox][] {
  const out: [WordBox, WordBox][] = [];
  for (const [i, a] of words.entries()) {
    for (const b of words.slice(i + 1)) {
      if (a.page !== b.page) continue;
      const dx = Math.min(a.xMax, b.xMax) - Math.max(a.xMin, b.xMin);
      const dy = Math.min(a.yMax, b.yMax) - Math.max(a.yMin, b.yMin);
      if (dx > tolerance && dy > tolerance) out.push([a, b]);
    }
  }
  return out;
}

/** Each page as a PNG (pdftoppm at `dpi`). */
export function pagePngs(pdf: Buffer, dpi = 80): Buffer[] {
  return withFile(pdf, (file, dir) => {
    execFileSync('pdftoppm', ['-png', '-r', String(dpi), file, path.join(dir, 'page')]);
    return readdirSync(dir)
      .filter((f) => f.endsWith('.png'))
      .sort()
      .map((f) => readFileSync(path.join(dir, f)));
  });
}

/**
 * True when every value is a multiple of one step that is 1, 2 or 5 × 10^k and the values are
 * evenly spaced by it: the round labels of P. S. Heckbert, "Nice numbers for graph labels",
 * Graphics Gems (1990).
 */
export function isRoundTickRow(values: number[]): boolean {
  if (values.length < 3) return false;
  const step = values[1]! - values[0]!;
  if (!(step > 0)) return false;
  const mantissa = step / 10 ** Math.floor(Math.log10(step) + 1e-9);
  if (![1, 2, 5].some((m) => Math.abs(mantissa - m) < 1e-6)) return false;
  return values.every(
    (v, i) =>
      Math.abs(v - values[0]! - i * step) < step * 1e-6 && Math.abs(v / step - Math.round(v / step)) < 1e-6,
  );
}

/** A page as grey pixels (pdftoppm -gray, binary PGM): 0 black … 255 white, row by row. */
export interface GreyPage {
  width: number;
  height: number;
  pixels: Uint8Array;
}

/** Each page as grey pixels at `dpi`, to measure where ink lies. */
export function pageGreys(pdf: Buffer, dpi = 72): GreyPage[] {
  return withFile(pdf, (file, dir) => {
    execFileSync('pdftoppm', ['-gray', '-r', String(dpi), file, path.join(dir, 'page')]);
    return readdirSync(dir)
      .filter((f) => f.endsWith('.pgm'))
      .sort()
      .map((f) => {
        const data = readFileSync(path.join(dir, f));
        // Header: "P5\n<width> <height>\n<max>\n", then one byte per pixel.
        const header = /^P5\s+(\d+)\s+(\d+)\s+(\d+)\s/.exec(data.subarray(0, 40).toString('latin1'));
        if (!header) throw new Error('pdftoppm did not write a binary PGM');
        const width = Number(header[1]);
        const height = Number(header[2]);
        return {
          width,
          height,
          pixels: new Uint8Array(data.subarray(header[0].length, header[0].length + width * height)),
        };
      });
  });
}

/** The box of everything darker than `threshold` on a page, px; null for a blank page. */
export function inkBox(
  page: GreyPage,
  threshold = 250,
): { left: number; top: number; right: number; bottom: number } | null {
  let left = page.width;
  let top = page.height;
  let right = -1;
  let bottom = -1;
  for (let y = 0; y < page.height; y++) {
    for (let x = 0; x < page.width; x++) {
      if (page.pixels[y * page.width + x]! < threshold) {
        if (x < left) left = x;
        if (x > right) right = x;
        if (y < top) top = y;
        if (y > bottom) bottom = y;
      }
    }
  }
  return right < 0 ? null : { left, top, right, bottom };
}
