// A Y4M video for Chromium's fake camera (--use-file-for-fake-video-capture) showing one QR code, drawn from the
// qrcode module matrix: black modules on white with a quiet zone, centred in a 640×480 frame.
import { writeFileSync } from 'node:fs';
import QRCode from 'qrcode';

export function writeQrY4m(
  file: string,
  text: string,
  opts: { width?: number; height?: number; frames?: number } = {},
) {
  const width = opts.width ?? 640;
  const height = opts.height ?? 480;
  const { modules } = QRCode.create(text, { errorCorrectionLevel: 'Q' });
  const quiet = 4;
  const cells = modules.size + 2 * quiet;
  const scale = Math.floor((Math.min(width, height) * 0.8) / cells);
  const left = Math.floor((width - cells * scale) / 2);
  const top = Math.floor((height - cells * scale) / 2);
  const y = Buffer.alloc(width * height, 200); // light grey background around the white label
  for (let py = 0; py < cells * scale; py++) {
    for (let px = 0; px < cells * scale; px++) {
      const row = Math.floor(py / scale) - quiet;
      const col = Math.floor(px / scale) - quiet;
      const dark = row >= 0 && col >= 0 && row < modules.size && col < modules.size && modules.get(row, col);
      y[(top + py) * width + left + px] = dark ? 16 : 235;
    }
  }
  const chroma = Buffer.alloc((width / 2) * (height / 2) * 2, 128);
  const header = Buffer.from(`YUV4MPEG2 W${width} H${height} F10:1 Ip A1:1 C420jpeg\n`);
  const frame = Buffer.concat([Buffer.from('FRAME\n'), y, chroma]);
  writeFileSync(file, Buffer.concat([header, ...Array.from({ length: opts.frames ?? 10 }, () => frame)]));
}
