// Which reader the camera uses. The browser's own barcode detector (Chrome on Android, Safari 17+ behind a flag, the
// shape detection API) reads QR codes in native code and costs no download; zxing (~110 KB compressed) is fetched
// only where that detector is missing, does not list QR codes, or fails on the first frame.

/** The part of the shape detection API this app uses. */
export type BarcodeDetectorLike = { detect(source: CanvasImageSource): Promise<{ rawValue: string }[]> };
type BarcodeDetectorClass = {
  new (options?: { formats: string[] }): BarcodeDetectorLike;
  getSupportedFormats?: () => Promise<string[]>;
};

export type QrEngine = { kind: 'native'; detector: BarcodeDetectorLike } | { kind: 'zxing' };

/** `scope` is the browser's global object; tests hand in a stand-in. */
export async function chooseQrEngine(scope: object = globalThis): Promise<QrEngine> {
  const Detector = (scope as { BarcodeDetector?: BarcodeDetectorClass }).BarcodeDetector;
  if (typeof Detector !== 'function') return { kind: 'zxing' };
  try {
    const formats = (await Detector.getSupportedFormats?.()) ?? [];
    if (!formats.includes('qr_code')) return { kind: 'zxing' };
    return { kind: 'native', detector: new Detector({ formats: ['qr_code'] }) };
  } catch {
    return { kind: 'zxing' };
  }
}
