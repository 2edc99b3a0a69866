import { PDFDocument, StandardFonts } from 'pdf-lib';
import { describe, expect, it } from 'vitest';
import { decisionAssumptions, eventSummary, figureRows, pdfText } from '../../server/features/handover/handover-pdf';
import type { HandoverEvent, HandoverExport } from '../../shared/schemas/handover';

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

describe('numbers written into the handover PDF', () => {
  it('follows the screens’ rules and words: a whole leak rate without ".0", kilograms to 10 g, a true minus made plain later', () => {
    const x = {
      record: {
        figures: {
          rollingLeakRatePct: 34,
          calendarYearSharePct: 12.04,
          score: 61,
          scoreBand: 'watch',
          leakCheckIntervalMonths: null,
          nextLeakCheckDue: null,
          ptiPassed: null,
          ptiValidUntil: null,
          pressureFlag: 'ok',
          forecast: null,
          computedAt: '2026-06-01T12:00:00.000Z',
          computeError: null,
          detail: { score: { factors: { afterRepair: { points: 20, explanation: 'A leak came back.' } } } },
        },
      },
    } as unknown as HandoverExport;
    const rows = Object.fromEntries(figureRows(x));
    expect(rows['Rolling leak rate']).toBe('34 % of the full charge over 365 days');
    expect(rows['Calendar-year share']).toBe('12 %');
    // The screens' words, not the engine's codes.
    expect(rows['Repeat-leak score']).toBe('61 of 100 (Slipping)');
    expect(rows['  Back after a repair']).toBe('20 points: A leak came back.');
    expect(rows['Pressure health']).toBe('Charge looks right');

    const topUp = { kind: 'top_up', kg: 0.125, details: {}, note: null } as unknown as HandoverEvent;
    expect(eventSummary(topUp)).toBe('Added 0.13 kg');
    const reading = {
      kind: 'pressure',
      suctionKPaG: 1234.4,
      ambientC: -5,
      details: {},
      note: null,
    } as unknown as HandoverEvent;
    expect(eventSummary(reading)).toBe('suction 1,234 kPa(g); ambient −5 °C');
  });
});

describe('a recorded decision in the handover PDF', () => {
  it('lists its assumptions in the decision page’s words with units, never the engine’s keys', () => {
    const decision = {
      kind: 'decision',
      details: {
        option: 'repair',
        currency: 'EUR',
        assumptions: {
          discountRatePct: 8,
          designLifeYears: 15,
          remainingYears: 7,
          visitsPerYear: 2.4,
          madeUpKgPerVisit: 1.25,
          refrigerantPricePerKg: 12,
          labourPerVisit: 120,
          downtimePerVisit: 80,
          repairCost: 450,
          leakLocation: 'service_valve',
          recurrence: 0.3,
          recurrenceSource: 'default',
          newUnitCost: 30000,
          machineryCost: 9000,
          residualValue: 4000,
          notes: ['Costs are yearly.'],
        },
      },
      note: null,
    } as unknown as HandoverEvent;
    const text = decisionAssumptions(decision)!;
    expect(text).toBe(
      'Assumed: Leak to repair: Service valve; Top-ups a year: 2.4; Refrigerant per top-up: 1.25 kg; ' +
        'Refrigerant price: €12 per kg; Labour per visit: €120; Downtime per visit: €80; ' +
        'Repair at service valve: €450; New machinery: €9,000; New unit: €30,000; Residual value now: €4,000; ' +
        'Discount rate: 8 %; Design life: 15 years; Remaining life: 7 years; ' +
        'Leaks again after repair: 30 % (default: fewer than 5 fleet repairs here)',
    );
    expect(text).not.toMatch(/discountRatePct|leakLocation|service_valve|recurrenceSource|[a-z][A-Z]/);
    expect(decisionAssumptions({ kind: 'decision', details: {}, note: null } as unknown as HandoverEvent)).toBeNull();
  });
});
