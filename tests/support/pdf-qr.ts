// Reads back the QR codes a label PDF draws: finds each marked QR block in the page content, rebuilds the module
// grid from its rectangles, rasterises it and decodes it with jsQR, as a phone camera would see the printed label.
import { inflateSync } from 'node:zlib';
import jsQR from 'jsqr';
import { PDFArray, PDFDocument, PDFName, PDFRawStream, type PDFObject } from 'pdf-lib';
import { QR_MARK, QR_QUIET_ZONE } from '../../server/lib/pdf/pdf-parts';

function streamText(doc: PDFDocument, obj: PDFObject | undefined): string {
  if (obj === undefined) return '';
  const o = doc.context.lookup(obj);
  if (o instanceof PDFArray)
    return o
      .asArray()
      .map((x) => streamText(doc, x))
      .join('\n');
  if (o instanceof PDFRawStream) {
    const flate = o.dict.get(PDFName.of('Filter')) === PDFName.of('FlateDecode');
    return (flate ? inflateSync(o.contents) : Buffer.from(o.contents)).toString('latin1');
  }
  return '';
}

/** Per page, the text each QR code decodes to ("(unreadable)" when jsQR cannot read it). */
export async function decodePdfQrCodes(pdf: Uint8Array): Promise<string[][]> {
  const doc = await PDFDocument.load(pdf);
  const blockRe = new RegExp(`/${QR_MARK} BMC([\\s\\S]*?)EMC`, 'g');
  return doc.getPages().map((page) => {
    const content = streamText(doc, page.node.get(PDFName.of('Contents')));
    return [...content.matchAll(blockRe)].map(([, block]) => {
      const rects = [...block.matchAll(/(-?[\d.]+) (-?[\d.]+) (-?[\d.]+) (-?[\d.]+) re/g)].map((m) =>
        m.slice(1, 5).map(Number),
      );
      return decodeRects(rects);
    });
  });
}

function decodeRects(rects: number[][]): string {
  const m = Math.min(...rects.map((r) => r[3]));
  const left = Math.min(...rects.map((r) => r[0]));
  const top = Math.max(...rects.map((r) => r[1] + r[3]));
  const n = Math.round((Math.max(...rects.map((r) => r[0] + r[2])) - left) / m);
  const scale = 6;
  const side = (n + 2 * QR_QUIET_ZONE) * scale;
  const data = new Uint8ClampedArray(side * side * 4).fill(255);
  for (const [x, y, w, h] of rects) {
    const col = Math.round((x - left) / m);
    const row = Math.round((top - (y + h)) / m);
    const len = Math.round(w / m);
    for (let py = (row + QR_QUIET_ZONE) * scale; py < (row + 1 + QR_QUIET_ZONE) * scale; py++) {
      for (let px = (col + QR_QUIET_ZONE) * scale; px < (col + len + QR_QUIET_ZONE) * scale; px++) {
        const i = (py * side + px) * 4;
        data[i] = data[i + 1] = data[i + 2] = 0;
      }
    }
  }
  return jsQR(data, side, side)?.data ?? '(unreadable)';
}
