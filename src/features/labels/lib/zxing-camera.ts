// The camera read by zxing, where the browser has no barcode detector of its own: this file pulls in @zxing/browser
// (large), so the scanner imports it only then (qr-engine.ts).
import { BrowserQRCodeReader } from '@zxing/browser';
import { createQrFallbackReader } from './qr-fallback-reader';
import type { CameraRun } from './camera-run';

export async function startZxingCamera(
  constraints: MediaStreamConstraints,
  video: HTMLVideoElement,
  onText: (text: string) => void,
): Promise<CameraRun> {
  const reader = new BrowserQRCodeReader(undefined, { delayBetweenScanAttempts: 120 });
  const readMissedFrame = createQrFallbackReader();
  const controls = await reader.decodeFromConstraints(constraints, video, (result) => {
    const text = result ? result.getText() : readMissedFrame(video);
    if (text) onText(text);
  });
  return { stop: () => controls.stop() };
}
