// The camera read by the browser's own barcode detector (qr-engine.ts), and what both readers hand back.
import type { BarcodeDetectorLike } from './qr-engine';

export type CameraRun = { stop: () => void };

const FRAME_EVERY_MS = 120;

/**
 * Opens the camera into `video` and reads each frame with `detector`. `onBroken` is called, with the camera already
 * stopped, when the detector throws instead of answering (some builds list QR codes but cannot read them): the
 * scanner then starts zxing. (The second reader, jsQR, stays with zxing: it is there for zxing's way of placing codes.)
 */
export async function startNativeCamera(
  constraints: MediaStreamConstraints,
  video: HTMLVideoElement,
  detector: BarcodeDetectorLike,
  onText: (text: string) => void,
  onBroken: () => void,
): Promise<CameraRun> {
  const stream = await navigator.mediaDevices.getUserMedia(constraints);
  let stopped = false;
  let timer: number | undefined;
  const stop = () => {
    stopped = true;
    window.clearTimeout(timer);
    for (const track of stream.getTracks()) track.stop();
    video.srcObject = null;
  };
  video.srcObject = stream;
  await video.play().catch(() => undefined);
  const next = () => {
    if (!stopped) timer = window.setTimeout(() => void read(), FRAME_EVERY_MS);
  };
  const read = async () => {
    if (stopped) return;
    if (video.readyState < HTMLMediaElement.HAVE_CURRENT_DATA) return next();
    try {
      const [found] = await detector.detect(video);
      if (found?.rawValue && !stopped) onText(found.rawValue);
    } catch {
      stop();
      onBroken();
      return;
    }
    next();
  };
  next();
  return { stop };
}
