// QR label PDFs. A label is 105 × 74 mm (eight to an A4 sheet, the common label-stock layout): the QR code on the
// left, refrigerant and full charge on the right, and the container number in large white-on-black type along the
// bottom, readable from a metre away. Pure black on white for contrast in poor light and on dirty labels.
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
import { formatContainerNumber } from '../../../shared/domain';

export type LabelContent = {
  containerNumber: string;
  refrigerant: string;
  nominalChargeKg: number;
  /** What the QR code encodes: `<public URL>/u/<token>`. */
  url: string;
};

const MM = 72 / 25.4;
export const LABEL_WIDTH = 105 * MM;
export const LABEL_HEIGHT = 74.25 * MM;
const A4 = { width: 210 * MM, height: 297 * MM };
const COLUMNS = 2;
const ROWS = 4;
export const LABELS_PER_SHEET = COLUMNS * ROWS;
// Most office printers cannot print the outer 4–5 mm; keep everything inside this inset.
const INSET = 6 * MM;

const BLACK = rgb(0, 0, 0);
const WHITE = rgb(1, 1, 1);
const GUIDE = rgb(0.8, 0.8, 0.8);

export function labelUrl(publicUrl: string, qrToken: string): string {
  return `${publicUrl}/u/${qrToken}`;
}

/** Marked-content tag around each QR code's drawing, so tests can find it in the page. */
export const QR_MARK = 'TightloopQR';
/** Modules of white margin around the code, as the QR standard asks. */
export const QR_QUIET_ZONE = 4;

/**
 * The QR code as vector squares (one rectangle per horizontal run of dark modules): sharp at any printer resolution
 * and fast to write. Level Q survives a scratched or dirty quarter of the label.
 */
function drawQr(page: PDFPage, text: string, x: number, y: number, side: number) {
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

const formatKg = (kg: number) => `${Number(kg.toFixed(2))} kg`;

function fitSize(font: PDFFont, text: string, maxWidth: number, maxSize: number): number {
  return Math.min(maxSize, maxWidth / font.widthOfTextAtSize(text, 1));
}

type Fonts = { bold: PDFFont; regular: PDFFont };

/** The product mark of the app (components/ui/logo.tsx), in black and white: a nearly closed ring and a dot on a tile. */
function drawMark(page: PDFPage, fonts: Fonts, x: number, yTop: number) {
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

function drawLabel(page: PDFPage, fonts: Fonts, label: LabelContent, x0: number, y0: number, guides: boolean) {
  if (guides) {
    page.drawRectangle({
      x: x0,
      y: y0,
      width: LABEL_WIDTH,
      height: LABEL_HEIGHT,
      borderColor: GUIDE,
      borderWidth: 0.4,
      borderDashArray: [2, 3],
    });
  }
  const left = x0 + INSET;
  const right = x0 + LABEL_WIDTH - INSET;
  const top = y0 + LABEL_HEIGHT - INSET;
  const bottom = y0 + INSET;

  // Bottom band: the container number, check digit boxed as ISO 6346 marks it.
  const bandHeight = 15 * MM;
  page.drawRectangle({ x: left, y: bottom, width: right - left, height: bandHeight, color: BLACK });
  const [owner, serial, check] = formatContainerNumber(label.containerNumber).split(' ');
  const numberText = `${owner} ${serial}`;
  const boxGap = 6;
  const maxNumberWidth = right - left - 12;
  const size = fitSize(fonts.bold, `${numberText} 0`, maxNumberWidth - boxGap - 6, 30);
  const numberWidth = fonts.bold.widthOfTextAtSize(numberText, size);
  const digitWidth = fonts.bold.widthOfTextAtSize(check ?? '', size);
  const boxWidth = digitWidth + 6;
  const total = numberWidth + boxGap + boxWidth;
  const textX = left + (right - left - total) / 2;
  const capHeight = size * 0.72;
  const baseline = bottom + (bandHeight - capHeight) / 2;
  page.drawText(numberText, { x: textX, y: baseline, size, font: fonts.bold, color: WHITE });
  if (check) {
    const boxX = textX + numberWidth + boxGap;
    page.drawRectangle({
      x: boxX,
      y: baseline - 3.5,
      width: boxWidth,
      height: capHeight + 7,
      borderColor: WHITE,
      borderWidth: 1.6,
    });
    page.drawText(check, { x: boxX + 3, y: baseline, size, font: fonts.bold, color: WHITE });
  }

  // QR code, square, filling the height above the band (its own white quiet zone is inside the image).
  const qrSide = top - (bottom + bandHeight) - 2 * MM;
  drawQr(page, label.url, left - 2 * MM, top - qrSide + 1 * MM, qrSide);

  // Right column: mark, refrigerant, charge.
  const colX = left + qrSide;
  const colWidth = right - colX;
  drawMark(page, fonts, colX, top - 1);
  let y = top - 11 * MM;
  const caption = (text: string) => page.drawText(text, { x: colX, y, size: 7.5, font: fonts.regular, color: BLACK });
  const value = (text: string) => {
    const s = fitSize(fonts.bold, text, colWidth, 22);
    page.drawText(text, { x: colX, y: y - s * 0.95, size: s, font: fonts.bold, color: BLACK });
  };
  caption('REFRIGERANT');
  y -= 1.5 * MM;
  value(label.refrigerant);
  y -= 14 * MM;
  caption('FULL CHARGE');
  y -= 1.5 * MM;
  value(formatKg(label.nominalChargeKg));
  page.drawText('Scan for the service record', {
    x: colX,
    y: bottom + bandHeight + 2.5 * MM,
    size: 6.5,
    font: fonts.regular,
    color: BLACK,
  });
}

async function newDocument(title: string) {
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

/** A4 sheets of eight labels, left to right, top to bottom, with faint cut guides for plain paper. */
export async function renderLabelSheet(labels: LabelContent[]): Promise<Uint8Array> {
  const { doc, fonts } = await newDocument(`Tightloop labels (${labels.length})`);
  const marginX = (A4.width - COLUMNS * LABEL_WIDTH) / 2;
  const marginY = (A4.height - ROWS * LABEL_HEIGHT) / 2;
  let page: PDFPage | null = null;
  for (let i = 0; i < labels.length; i++) {
    const slot = i % LABELS_PER_SHEET;
    if (slot === 0) page = doc.addPage([A4.width, A4.height]);
    const col = slot % COLUMNS;
    const row = Math.floor(slot / COLUMNS);
    const x = marginX + col * LABEL_WIDTH;
    const y = A4.height - marginY - (row + 1) * LABEL_HEIGHT;
    drawLabel(page!, fonts, labels[i], x, y, true);
  }
  return doc.save();
}

/** One label on a page of its own size, for label printers. */
export async function renderSingleLabel(label: LabelContent): Promise<Uint8Array> {
  const { doc, fonts } = await newDocument(`Tightloop label ${formatContainerNumber(label.containerNumber)}`);
  const page = doc.addPage([LABEL_WIDTH, LABEL_HEIGHT]);
  drawLabel(page, fonts, label, 0, 0, false);
  return doc.save();
}
