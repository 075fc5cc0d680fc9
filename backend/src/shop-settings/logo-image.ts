import PDFDocument from 'pdfkit';
import type { LogoType } from '@quietglass/shared/shop';

/** Largest logo side, pixels: a header logo is a few centimetres wide. */
export const LOGO_MAX_PIXELS = 4000;

/**
 * Width and height of a PNG (IHDR chunk, ISO/IEC 15948 §11.2.2) or a baseline/progressive JPEG
 * (first SOFn segment, ITU-T T.81 Annex B), or null when the bytes are not such a file.
 */
export function imageSize(data: Buffer, type: LogoType): { width: number; height: number } | null {
  if (type === 'image/png') {
    const signature = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    if (data.length < 24 || !data.subarray(0, 8).equals(signature)) return null;
    if (data.subarray(12, 16).toString('latin1') !== 'IHDR') return null;
    return { width: data.readUInt32BE(16), height: data.readUInt32BE(20) };
  }
  if (data.length < 4 || data[0] !== 0xff || data[1] !== 0xd8) return null;
  let at = 2;
  while (at + 9 < data.length) {
    if (data[at] !== 0xff) return null;
    const marker = data.readUInt8(at + 1);
    const length = data.readUInt16BE(at + 2);
    // SOF0–SOF15 except DHT (C4), JPG (C8) and DAC (CC).
    if (marker >= 0xc0 && marker <= 0xcf && marker !== 0xc4 && marker !== 0xc8 && marker !== 0xcc) {
      return { height: data.readUInt16BE(at + 5), width: data.readUInt16BE(at + 7) };
    }
    at += 2 + length;
  }
  return null;
}

/** Whether pdfkit can embed the image: it is drawn into a throwaway document. */
export async function embeds(data: Buffer): Promise<boolean> {
  try {
    const doc = new PDFDocument({ size: 'A6' });
    const done = new Promise<void>((resolve, reject) => {
      doc.on('end', resolve);
      doc.on('error', reject);
    });
    doc.on('data', () => undefined);
    doc.image(data, 10, 10, { fit: [100, 40] });
    doc.end();
    await done;
    return true;
  } catch {
    return false;
  }
}
