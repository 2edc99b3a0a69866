// QR label PDFs. A label is 105 × 74 mm (eight to an A4 sheet, the common label-stock layout): the QR code on the
// left, refrigerant and full charge on the right, and the container number in large white-on-black type along the
// bottom, readable from a metre away. Pure black on white for contrast in poor light and on dirty labels.
import { rgb, type PDFPage } from 'pdf-lib';
import { A4, BLACK, MM, WHITE, drawMark, drawQr, fitSize, newDocument, type Fonts } from '../../lib/pdf/pdf-parts';
import { findRefrigerant, formatContainerNumber } from '../../../shared/domain';

export type LabelContent = {
  containerNumber: string;
  refrigerant: string;
  nominalChargeKg: number;
  /** What the QR code encodes: `<public URL>/u/<token>`. */
  url: string;
};

export const LABEL_WIDTH = 105 * MM;
export const LABEL_HEIGHT = 74.25 * MM;
const COLUMNS = 2;
const ROWS = 4;
export const LABELS_PER_SHEET = COLUMNS * ROWS;
// Most office printers cannot print the outer 4–5 mm; keep everything inside this inset.
const INSET = 6 * MM;

const GUIDE = rgb(0.8, 0.8, 0.8);

export function labelUrl(publicUrl: string, qrToken: string): string {
  return `${publicUrl}/u/${qrToken}`;
}

const formatKg = (kg: number) => `${Number(kg.toFixed(2))} kg`;

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
  const marking = refrigerantMarking(label.refrigerant);
  if (marking) {
    page.drawText(marking, {
      x: colX,
      y: bottom + bandHeight + 6.5 * MM,
      size: fitSize(fonts.bold, marking, colWidth, 8),
      font: fonts.bold,
      color: BLACK,
    });
  }
  page.drawText('Scan for the service record', {
    x: colX,
    y: bottom + bandHeight + 2.5 * MM,
    size: 6.5,
    font: fonts.regular,
    color: BLACK,
  });
}

/**
 * The hazard a technician must know before opening the unit, printed on its label: flammable (safety class A2L) or
 * CO2 at very high pressure. Source: ISO 817 / ASHRAE Standard 34 safety classes; CO2's pressures: common practice,
 * no published source. Local regulations and the maker's marking rules take precedence.
 */
export function refrigerantMarking(refrigerant: string): string | null {
  const r = findRefrigerant(refrigerant);
  if (r?.flammable) return 'A2L - FLAMMABLE';
  if (r?.highPressure) return 'CO2 - HIGH PRESSURE';
  return null;
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
