// A cylinder's own QR label, 105 × 74 mm like a unit's: the QR code (its register address) on the left, refrigerant,
// kind and the maker's marked maximum fill on the right, and the cylinder number white on black along the bottom.

import { BLACK, MM, WHITE, drawMark, drawQr, fitSize, newDocument } from '../../lib/pdf/pdf-parts';
import { CYLINDER_KIND_LABELS, type CylinderKind } from '../../../shared/schemas/cylinders';

export type CylinderLabelContent = {
  code: string;
  kind: CylinderKind;
  refrigerant: string;
  tareKg: number;
  capacityKg: number;
  url: string;
};

const WIDTH = 105 * MM;
const HEIGHT = 74.25 * MM;
const INSET = 6 * MM;
const kg = (v: number) => `${Number(v.toFixed(2))} kg`;

export async function renderCylinderLabel(label: CylinderLabelContent): Promise<Uint8Array> {
  const { doc, fonts } = await newDocument(`Tightloop cylinder ${label.code}`);
  const page = doc.addPage([WIDTH, HEIGHT]);
  const left = INSET;
  const right = WIDTH - INSET;
  const top = HEIGHT - INSET;
  const bottom = INSET;
  const band = 15 * MM;
  page.drawRectangle({ x: left, y: bottom, width: right - left, height: band, color: BLACK });
  const size = fitSize(fonts.bold, label.code, right - left - 12, 28);
  const w = fonts.bold.widthOfTextAtSize(label.code, size);
  page.drawText(label.code, {
    x: left + (right - left - w) / 2,
    y: bottom + (band - size * 0.72) / 2,
    size,
    font: fonts.bold,
    color: WHITE,
  });
  const qrSide = top - (bottom + band) - 2 * MM;
  drawQr(page, label.url, left - 2 * MM, top - qrSide + 1 * MM, qrSide);
  const x = left + qrSide;
  const colWidth = right - x;
  drawMark(page, fonts, x, top - 1);
  let y = top - 10 * MM;
  const line = (caption: string, value: string) => {
    page.drawText(caption, { x, y, size: 6.5, font: fonts.regular, color: BLACK });
    const s = fitSize(fonts.bold, value, colWidth, 15);
    page.drawText(value, { x, y: y - s - 1, size: s, font: fonts.bold, color: BLACK });
    y -= 10 * MM;
  };
  line('CYLINDER', CYLINDER_KIND_LABELS[label.kind].toUpperCase());
  line('REFRIGERANT', label.refrigerant);
  line('TARE / MAX FILL', `${kg(label.tareKg)} / ${kg(label.capacityKg)}`);
  return doc.save();
}
