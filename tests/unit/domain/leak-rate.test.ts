import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  annualizedLeakRatePct,
  calendarYearSharePct,
  DomainError,
  groupVisits,
  madeUpRefrigerantKg,
  rollingLeakRatePct,
  type UnitEvent,
} from '../../../shared/domain';
import { D, day } from './helpers';

describe('annualized leak rate', () => {
  it('gives 82.95 % for 1.5 lb added to an 11 lb unit 60 days after the last addition', () => {
    // Source: 40 CFR 82.152 definition, EPA worked example
    expect(annualizedLeakRatePct(1.5, 11, 60)).toBeCloseTo(82.95, 2);
  });

  it('counts at least one day and at most a year', () => {
    // Our arithmetic: 0.1/5 × 365/1 × 100 = 730 %; 1/5 × 365/365 × 100 = 20 %
    expect(annualizedLeakRatePct(0.1, 5, 0)).toBeCloseTo(730, 9);
    expect(annualizedLeakRatePct(1, 5, 900)).toBeCloseTo(20, 9);
  });

  it('refuses a full charge of zero, negative made-up and negative days', () => {
    expect(() => annualizedLeakRatePct(1, 0, 10)).toThrow(DomainError);
    expect(() => annualizedLeakRatePct(-1, 5, 10)).toThrow(/0 kg or more/);
    expect(() => annualizedLeakRatePct(1, 5, -2)).toThrow(/0 or more/);
  });
});

describe('made-up refrigerant of a visit', () => {
  it('counts top-ups plus what a recharge put back beyond what was recovered', () => {
    // Our worked example (DOMAIN.md §4 rule): recovered 4.2 kg, recharged 5.0 kg, topped up 0.3 kg
    // → 0.3 + max(0, 5.0 − 4.2) = 0.3 + 0.8 = 1.1 kg
    const [v] = groupVisits([
      { kind: 'recovery', at: '2025-03-01T09:00:00Z', kg: 4.2 },
      { kind: 'recharge', at: '2025-03-01T11:00:00Z', kg: 5.0 },
      { kind: 'top_up', at: '2025-03-01T12:00:00Z', kg: 0.3 },
    ]);
    expect(v.madeUpKg).toBeCloseTo(1.1, 12);
    expect(madeUpRefrigerantKg({ toppedUpKg: 0, rechargedKg: 5, recoveredKg: 4.2 })).toBeCloseTo(0.8, 12);
  });

  it('counts nothing when more was recovered than recharged', () => {
    // Our worked example: recovered 5.0, recharged 4.5 → max(0, 4.5 − 5.0) = 0
    expect(madeUpRefrigerantKg({ toppedUpKg: 0, rechargedKg: 4.5, recoveredKg: 5 })).toBe(0);
  });

  it('does not count a retrofit charge or a first fill', () => {
    // Source: 40 CFR 82.157(b) (charge after a retrofit or into a new installation does not count)
    const [v] = groupVisits([
      { kind: 'recovery', at: '2025-03-01', kg: 5.1 },
      { kind: 'recharge', at: '2025-03-01', kg: 4.6, excluded: true },
    ]);
    expect(v.madeUpKg).toBe(0);
    expect(v.excludedKg).toBe(4.6);
    expect(v.added).toBe(true);
  });
});

describe('visit rule', () => {
  it('groups events by visit id, even across days', () => {
    const visits = groupVisits([
      { kind: 'top_up', at: '2025-03-01T23:50:00Z', kg: 0.5, visitId: 'a' },
      { kind: 'leak_check', at: '2025-03-02T00:10:00Z', leakFound: false, visitId: 'a' },
    ]);
    expect(visits).toHaveLength(1);
    expect(visits[0]).toMatchObject({ visitId: 'a', date: '2025-03-01', at: '2025-03-01T23:50:00Z' });
  });

  it('groups events without an id by UTC calendar day', () => {
    const visits = groupVisits([
      { kind: 'top_up', at: '2025-03-01T08:00:00Z', kg: 0.5 },
      { kind: 'top_up', at: '2025-03-01T17:00:00+02:00', kg: 0.25 },
      // 23:30 at UTC−2 is 01:30 UTC the next day
      { kind: 'top_up', at: '2025-03-01T23:30:00-02:00', kg: 0.1 },
    ]);
    expect(visits.map((v) => [v.date, v.madeUpKg])).toEqual([
      ['2025-03-01', 0.75],
      ['2025-03-02', 0.1],
    ]);
  });

  it('does not trust the order it is given', () => {
    const visits = groupVisits([
      { kind: 'top_up', at: '2025-05-01', kg: 1 },
      { kind: 'top_up', at: '2025-01-01', kg: 2 },
    ]);
    expect(visits.map((v) => v.date)).toEqual(['2025-01-01', '2025-05-01']);
  });
});

describe('rolling rate', () => {
  // The unit of DOMAIN.md §6: full charge 5 kg; 1.0 kg on D−300, 1.2 kg on D−150 (verified repair), 0.8 kg on D−40.
  const dayNumber = (k: number) => Date.parse(day(k)) / 86_400_000;
  const visits = [
    { day: dayNumber(-300), madeUpKg: 1.0, verifiedRepair: false },
    { day: dayNumber(-150), madeUpKg: 1.2, verifiedRepair: true },
    { day: dayNumber(-40), madeUpKg: 0.8, verifiedRepair: false },
  ];

  it('starts after a verified repair: 0.8 kg of 5 kg is 16 %', () => {
    // Our definition (DOMAIN.md §6 example): only D−40 counts → 0.8 / 5 × 100 = 16 %
    expect(rollingLeakRatePct(visits, D, 5)).toBeCloseTo(16, 9);
  });

  it('counts the whole 365 days without a repair: 3.0 kg of 5 kg is 60 %', () => {
    // Source: 40 CFR 82.152 rolling method; our arithmetic (1.0 + 1.2 + 0.8) / 5 × 100 = 60 %
    expect(
      rollingLeakRatePct(
        visits.map((v) => ({ ...v, verifiedRepair: false })),
        D,
        5,
      ),
    ).toBeCloseTo(60, 9);
  });

  it('leaves out additions older than 365 days and visits after the day', () => {
    // Our arithmetic: as of D+100 the D−300 visit is 400 days old; as of D−200 only D−300 has happened
    expect(
      rollingLeakRatePct(
        visits.map((v) => ({ ...v, verifiedRepair: false })),
        day(100),
        5,
      ),
    ).toBeCloseTo(40, 9);
    expect(rollingLeakRatePct(visits, day(-200), 5)).toBeCloseTo(20, 9);
  });

  it('never falls when more refrigerant is added', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 0, max: 3, noNaN: true }), { minLength: 3, maxLength: 3 }),
        fc.integer({ min: 0, max: 2 }),
        fc.double({ min: 0, max: 3, noNaN: true }),
        (kgs, i, extra) => {
          const base = visits.map((v, k) => ({ ...v, madeUpKg: kgs[k] }));
          const more = base.map((v, k) => (k === i ? { ...v, madeUpKg: v.madeUpKg + extra } : v));
          expect(rollingLeakRatePct(more, D, 5)).toBeGreaterThanOrEqual(rollingLeakRatePct(base, D, 5));
        },
      ),
    );
  });
});

describe('calendar-year share', () => {
  it('adds up the made-up refrigerant of one calendar year', () => {
    // Source: 40 CFR 82.157(m) (≥ 125 % of full charge in a calendar year is chronic); our arithmetic:
    // (3.5 + 3.0) / 5 × 100 = 130 %
    const events: UnitEvent[] = [
      { kind: 'top_up', at: '2024-12-31', kg: 4 },
      { kind: 'top_up', at: '2025-02-01', kg: 3.5 },
      { kind: 'top_up', at: '2025-09-01', kg: 3.0 },
    ];
    expect(calendarYearSharePct(groupVisits(events), 2025, 5)).toBeCloseTo(130, 9);
    expect(calendarYearSharePct(groupVisits(events), 2024, 5)).toBeCloseTo(80, 9);
  });
});
