// Pieces every PDF Tightloop prints is made of: the page measures, the product mark, QR codes drawn as vectors,
// fitted type and a new document with the standard fonts. Label sheets, cylinder labels and the handover pack use them.
import {
  LineCapStyle,
  PDFDocument,
  StandardFonts,
  beginMarkedContent,
  endMarkedContent,
  fill,
  popGraphicsState,
  pushGraphicsState,
  rectangle,
  rgb,
  setFillingGrayscaleColor,
  type PDFFont,
  type PDFOperator,
  type PDFPage,
} from 'pdf-lib';
import QRCode from 'qrcode';
import type { Response } from 'express';

export const MM = 72 / 25.4;
export const A4 = { width: 210 * MM, height: 297 * MM };
export const BLACK = rgb(0, 0, 0);
export const WHITE = rgb(1, 1, 1);

export type Fonts = { bold: PDFFont; regular: PDFFont };

/** Marked-content tag around each QR code's drawing, so tests can find it in the page. */
export const QR_MARK = 'TightloopQR';
/** Modules of white margin around the code, as the QR standard asks. */
export const QR_QUIET_ZONE = 4;

/**
 * The QR code as vector squares (one rectangle per horizontal run of dark modules): sharp at any printer resolution
 * and fast to write. Level Q survives a scratched or dirty quarter of the label.
 */
export function drawQr(page: PDFPage, text: string, x: number, y: number, side: number) {
  const { modules } = QRCode.create(text, { errorCorrectionLevel: 'Q' });
  const n = modules.size;
  const m = side / (n + 2 * QR_QUIET_ZONE);
  const ops: PDFOperator[] = [beginMarkedContent(QR_MARK), pushGraphicsState(), setFillingGrayscaleColor(0)];
  for (let row = 0; row < n; row++) {
    let col = 0;
    while (col < n) {
      if (!modules.get(row, col)) {
        col++;
        continue;
      }
      const start = col;
      while (col < n && modules.get(row, col)) col++;
      ops.push(
        rectangle(x + (QR_QUIET_ZONE + start) * m, y + side - (QR_QUIET_ZONE + row + 1) * m, (col - start) * m, m),
      );
    }
  }
  ops.push(fill(), popGraphicsState(), endMarkedContent());
  page.pushOperators(...ops);
}

export function fitSize(font: PDFFont, text: string, maxWidth: number, maxSize: number): number {
  return Math.min(maxSize, maxWidth / font.widthOfTextAtSize(text, 1));
}

/** The product mark of the app (components/ui/logo.tsx), in black and white: a nearly closed ring and a dot on a tile. */
export function drawMark(page: PDFPage, fonts: Fonts, x: number, yTop: number) {
  const tile = 13;
  // The logo is drawn on a 32-unit grid; drawSvgPath puts the path's origin at (x, y) with y pointing down.
  const k = tile / 32;
  page.drawSvgPath('M8 0H24A8 8 0 0 1 32 8V24A8 8 0 0 1 24 32H8A8 8 0 0 1 0 24V8A8 8 0 0 1 8 0Z', {
    x,
    y: yTop,
    scale: k,
    color: BLACK,
  });
  page.drawSvgPath('M22.01 9.99A8.5 8.5 0 1 1 16 7.5', {
    x,
    y: yTop,
    scale: k,
    borderColor: WHITE,
    borderWidth: 4,
    borderLineCap: LineCapStyle.Round,
  });
  page.drawCircle({ x: x + 16 * k, y: yTop - 16 * k, size: 2.75 * k, color: WHITE });
  page.drawText('TIGHTLOOP', { x: x + tile + 4, y: yTop - tile + 3, size: 9.5, font: fonts.bold, color: BLACK });
}

export async function newDocument(title: string) {
  const doc = await PDFDocument.create();
  doc.setTitle(title);
  doc.setCreator('Tightloop');
  doc.setProducer('Tightloop');
  const fonts = {
    bold: await doc.embedFont(StandardFonts.HelveticaBold),
    regular: await doc.embedFont(StandardFonts.Helvetica),
  };
  return { doc, fonts };
}

/** Sends a PDF the browser may show inline; never cached (it may hold a unit's record). */
export function sendPdf(
  res: Response,
  pdf: Uint8Array,
  fileName: string,
  disposition: 'inline' | 'attachment' = 'inline',
) {
  res.setHeader('Content-Type', 'application/pdf');
  res.setHeader('Content-Disposition', `${disposition}; filename="${fileName}"`);
  res.setHeader('Cache-Control', 'no-store');
  res.end(Buffer.from(pdf));
}
