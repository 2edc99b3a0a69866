// zxing's finder-pattern search misses some codes outright: when the data area holds runs shaped like a finder
// pattern it settles on those, the same way on every frame (about one label in ten in our tests, however sharp
// the picture). jsQR locates codes its own way and reads them, so the scanner hands it every few frames zxing misses.
import jsQR from 'jsqr';

const MISSES_PER_TRY = 4;
/** Frames are scaled down to this long side first: jsQR's time grows with the pixels, and labels stay readable. */
const MAX_SIDE_PX = 960;

/**
 * Returns a reader to call on each frame zxing missed; it tries jsQR on every few of them and gives the text. It
 * never throws: zxing calls it from inside its scan loop, which stops for good on an exception it does not expect.
 */
export function createQrFallbackReader() {
  let misses = 0;
  let canvas: HTMLCanvasElement | null = null;
  return (video: HTMLVideoElement | null): string | null => {
    if (!video || video.videoWidth === 0 || ++misses % MISSES_PER_TRY !== 0) return null;
    try {
      const scale = Math.min(1, MAX_SIDE_PX / Math.max(video.videoWidth, video.videoHeight));
      const width = Math.round(video.videoWidth * scale);
      const height = Math.round(video.videoHeight * scale);
      canvas ??= document.createElement('canvas');
      if (canvas.width !== width || canvas.height !== height) Object.assign(canvas, { width, height });
      const context = canvas.getContext('2d', { willReadFrequently: true });
      if (!context) return null;
      context.drawImage(video, 0, 0, width, height);
      const frame = context.getImageData(0, 0, width, height);
      return jsQR(frame.data, width, height, { inversionAttempts: 'dontInvert' })?.data ?? null;
    } catch {
      return null;
    }
  };
}
