// A Y4M video for Chromium's fake camera (--use-file-for-fake-video-capture) showing one QR code, drawn from the
// qrcode module matrix: black modules on white with a quiet zone, centred in a 640×480 frame.
import { writeFileSync } from 'node:fs';
import { BinaryBitmap, HybridBinarizer, QRCodeReader, RGBLuminanceSource } from '@zxing/library';
import QRCode from 'qrcode';

const WIDTH = 640;
const HEIGHT = 480;

/** The frame's luma plane (one byte a pixel), the label's code drawn as the app prints it (error correction Q). */
function qrFrameLuma(text: string): Uint8ClampedArray {
  const { modules } = QRCode.create(text, { errorCorrectionLevel: 'Q' });
  const quiet = 4;
  const cells = modules.size + 2 * quiet;
  const scale = Math.floor((Math.min(WIDTH, HEIGHT) * 0.8) / cells);
  const left = Math.floor((WIDTH - cells * scale) / 2);
  const top = Math.floor((HEIGHT - cells * scale) / 2);
  const y = new Uint8ClampedArray(WIDTH * HEIGHT).fill(200); // light grey background around the white label
  for (let py = 0; py < cells * scale; py++) {
    for (let px = 0; px < cells * scale; px++) {
      const row = Math.floor(py / scale) - quiet;
      const col = Math.floor(px / scale) - quiet;
      const dark = row >= 0 && col >= 0 && row < modules.size && col < modules.size && modules.get(row, col);
      y[(top + py) * WIDTH + left + px] = dark ? 16 : 235;
    }
  }
  return y;
}

export function writeQrY4m(file: string, text: string, frames = 10) {
  const y = qrFrameLuma(text);
  const chroma = Buffer.alloc((WIDTH / 2) * (HEIGHT / 2) * 2, 128);
  const header = Buffer.from(`YUV4MPEG2 W${WIDTH} H${HEIGHT} F10:1 Ip A1:1 C420jpeg\n`);
  const frame = Buffer.concat([Buffer.from('FRAME\n'), Buffer.from(y.buffer), chroma]);
  writeFileSync(file, Buffer.concat([header, ...Array.from({ length: frames }, () => frame)]));
}

/** Whether zxing's QR reader (the scanner's first reader) decodes the frame writeQrY4m draws for this text. */
export function zxingReadsFrame(text: string): boolean {
  try {
    const source = new RGBLuminanceSource(qrFrameLuma(text), WIDTH, HEIGHT);
    return new QRCodeReader().decode(new BinaryBitmap(new HybridBinarizer(source))).getText() === text;
  } catch {
    return false;
  }
}
