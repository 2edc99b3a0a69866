import { PDFDocument, StandardFonts } from 'pdf-lib';
import { describe, expect, it } from 'vitest';
import { pdfText } from '../../server/features/handover/handover-pdf';

describe('text written into the handover PDF', () => {
  it('turns every character the standard font cannot encode into something it can (control and C1 characters, emoji)', async () => {
    const doc = await PDFDocument.create();
    const font = await doc.embedFont(StandardFonts.Helvetica);
    // Source: the WinAnsi (Windows-1252) encoding of the PDF standard fonts, ISO 32000-1 Annex D.2.
    const nasty = 'a\u0000b\u007fc\u0080d\u008ae\u009ff\u00e9g\u20ach😀i\u00a0j';
    const safe = pdfText(nasty);
    expect(() => font.widthOfTextAtSize(safe, 10)).not.toThrow();
    expect(safe).toContain('é');
    expect(safe).toContain('€');
    for (let code = 0; code < 0x300; code++) {
      expect(() => font.widthOfTextAtSize(pdfText(String.fromCodePoint(code)), 10)).not.toThrow();
    }
  });
});
