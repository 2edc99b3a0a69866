import { describe, expect, it } from 'vitest';
import { DEFAULT_UNIT_PREFS } from '../../src/features/history/utils/unit-prefs';
import {
  emptyEntry,
  parseTyped,
  toVisitEvent,
  visitFormSchema,
} from '../../src/features/history/utils/visit-form-model';

const entry = (kind: Parameters<typeof emptyEntry>[0], fields: Partial<ReturnType<typeof emptyEntry>> = {}) => ({
  ...emptyEntry(kind, DEFAULT_UNIT_PREFS),
  ...fields,
});

describe('the visit form model', () => {
  it('reads a decimal comma, a typographic minus and blanks', () => {
    expect(parseTyped('0,9')).toBe(0.9);
    expect(parseTyped(' −25,5 ')).toBe(-25.5);
    expect(parseTyped('')).toBeUndefined();
    expect(parseTyped('1.2.3')).toBeNaN();
  });

  it('sends a top-up typed in pounds as kilograms and keeps what was typed', () => {
    const e = toVisitEvent(entry('top_up', { kg: '1.5', massUnit: 'lb', cylinder: ' CYL-9 ' }));
    // 1 lb = 0.45359237 kg exactly (NIST SP 811): 1.5 lb = 0.680388555 kg, stored to 0.1 g.
    expect(e).toMatchObject({ kind: 'top_up', kg: 0.6804, enteredAs: { value: 1.5, unit: 'lb' }, cylinder: 'CYL-9' });
  });

  it('sends pressures in psi as kPa gauge and temperatures in °F as °C', () => {
    const e = toVisitEvent(
      entry('pressure', {
        pressureUnit: 'psi',
        temperatureUnit: 'F',
        dischargeKPaG: '125',
        suctionKPaG: '18',
        ambientC: '77',
        setPointC: '-13',
      }),
    );
    // 125 psi = 861.8447 kPa with the NIST SP 811 factor (DOMAIN.md §1: 861.85), kept to 0.01 kPa; 77 °F = 25 °C.
    expect(e).toMatchObject({
      kind: 'pressure',
      dischargeKPaG: 861.84,
      ambientC: 25,
      setPointC: -25,
      enteredAs: { pressureUnit: 'psi', temperatureUnit: 'F' },
    });
  });

  it('puts the shared schema’s errors on the fields that were typed into', () => {
    const r = visitFormSchema(7).safeParse({
      occurredAt: '2026-05-01T09:30',
      events: [entry('leak_check', { method: 'uv_dye', leakFound: 'yes' }), entry('top_up', { kg: '', cylinder: '' })],
    });
    expect(r.success).toBe(false);
    const paths = r.error!.issues.map((i) => i.path.join('.'));
    expect(paths).toEqual(expect.arrayContaining(['events.0.location', 'events.1.kg', 'events.1.cylinder']));
  });

  it('turns a complete form into the API input for the unit', () => {
    const r = visitFormSchema(7).safeParse({
      occurredAt: '2026-05-01T09:30',
      events: [
        entry('pti', { passed: 'pass' }),
        entry('repair', { location: 'other', locationOther: 'Drain line', action: 'tightened', verified: true }),
      ],
    });
    expect(r.success).toBe(true);
    expect(r.data).toMatchObject({
      unitId: 7,
      events: [
        { kind: 'pti', passed: true },
        { kind: 'repair', location: 'other', locationOther: 'Drain line', action: 'tightened', verified: true },
      ],
    });
    expect(r.data!.occurredAt).toMatch(/^2026-05-01T\d\d:30:00\.000Z$/);
  });
});
