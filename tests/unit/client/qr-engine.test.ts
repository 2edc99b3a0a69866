// The camera reader uses the browser's own barcode detector where it reads QR codes, and zxing everywhere else.
import { describe, expect, it } from 'vitest';
import { chooseQrEngine } from '../../../src/features/labels/lib/qr-engine';

function detectorWith(formats: string[] | (() => Promise<string[]>)) {
  const created: unknown[] = [];
  class FakeDetector {
    static getSupportedFormats = typeof formats === 'function' ? formats : async () => formats;
    constructor(options: unknown) {
      created.push(options);
    }
    async detect() {
      return [];
    }
  }
  return { scope: { BarcodeDetector: FakeDetector }, created };
}

describe('choosing the QR reader', () => {
  it('uses the browser detector, for QR codes only, when it lists qr_code', async () => {
    const { scope, created } = detectorWith(['code_128', 'qr_code']);
    const engine = await chooseQrEngine(scope);
    expect(engine.kind).toBe('native');
    expect(created).toEqual([{ formats: ['qr_code'] }]);
  });

  it('uses zxing when the browser has no barcode detector', async () => {
    expect((await chooseQrEngine({})).kind).toBe('zxing');
  });

  it('uses zxing when the detector cannot read QR codes', async () => {
    expect((await chooseQrEngine(detectorWith(['ean_13', 'code_128']).scope)).kind).toBe('zxing');
  });

  it('uses zxing when asking the detector for its formats fails', async () => {
    const failing = detectorWith(() => Promise.reject(new Error('NotSupportedError')));
    expect((await chooseQrEngine(failing.scope)).kind).toBe('zxing');
  });
});
