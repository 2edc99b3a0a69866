import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computeUnitStats, DomainError, isDomainError, type UnitEvent } from '../../../shared/domain';
import { settingsSchema } from '../../../shared/schemas/settings';
import { D, day, historyArb, nonFinitePaths, section6Events, unitArb } from './helpers';

const unit = { refrigerant: 'R-134a', nominalChargeKg: 5, commissionedOn: day(-2000) };

describe('computeUnitStats on the DOMAIN.md §6 unit', () => {
  const s = computeUnitStats(unit, section6Events, D);

  it('starts the rolling window at the verified repair: 16 %', () => {
    // Our definition (DOMAIN.md §6): 0.8 kg / 5 kg × 100 = 16 %
    expect(s.rollingLeakRatePct).toBe(16);
    expect(s.rollingSince).toBe(day(-149));
    expect(s.rollingSinceRepair).toBe(true);
    expect(s.totalMadeUpKg365).toBe(3);
    expect(s.leakRateAboveThreshold).toBe(false);
  });

  it('rates each visit against the previous addition', () => {
    // Source: 40 CFR 82.152 method. Our arithmetic: D−300 (1700 days after commissioning, capped at 365):
    // 1.0/5 × 365/365 × 100 = 20 %; D−150: 1.2/5 × 365/150 × 100 = 58.40 %; D−40: 0.8/5 × 365/110 × 100 = 53.09 %
    expect(s.visits.map((v) => v.annualizedRatePct)).toEqual([20, 58.4, 53.09]);
    expect(s.visits.map((v) => v.daysSincePreviousAddition)).toEqual([1700, 150, 110]);
    // The repair visit's own 1.2 kg belongs to the leak before it, so the rolling rate that day is 0
    expect(s.visits.map((v) => v.rollingRatePct)).toEqual([20, 0, 16]);
  });

  it('scores 64, lists its 3 missed re-checks without weighing them, and forecasts D+70', () => {
    // Source: DOMAIN.md §6 and §7 worked examples; missed re-checks are evidence in the reasons, no points
    expect(s.score).toMatchObject({ value: 64, band: 'chronic' });
    expect(s.score.missedRechecks.items).toHaveLength(3);
    expect(s.forecast?.date).toBe(day(70));
  });

  it('keeps the open leak at the service valve', () => {
    expect(s.openLeak).toEqual({ foundAt: day(-40), location: 'service_valve' });
  });

  it('counts what it saw', () => {
    expect(s.counts).toEqual({ events: 6, visits: 3, topUps: 3, repairs: 1, leakChecks: 2, afterAsOf: 0, ignored: 0 });
    expect(s.co2eTonnes).toBe(7.15);
    expect(s.leakCheckIntervalMonths).toBe(12);
  });
});

describe('made-up refrigerant in the unit statistics', () => {
  it('counts a recovery and recharge in one visit as the difference', () => {
    // Our worked example (DOMAIN.md §4 rule): 5 kg unit. Visit "v9" recovers 3.6 kg and recharges 5.0 kg
    // → made-up = max(0, 5.0 − 3.6) = 1.4 kg; 300 days since commissioning →
    // annualized 1.4/5 × 365/300 × 100 = 34.07 %; rolling 1.4/5 = 28 %
    const s = computeUnitStats(
      { ...unit, commissionedOn: day(-310) },
      [
        { kind: 'recovery', at: `${day(-10)}T08:00:00Z`, kg: 3.6, visitId: 'v9' },
        { kind: 'recharge', at: `${day(-9)}T09:00:00Z`, kg: 5.0, visitId: 'v9' },
      ],
      D,
    );
    expect(s.visits).toHaveLength(1);
    expect(s.visits[0]).toMatchObject({ visitId: 'v9', madeUpKg: 1.4, recoveredKg: 3.6, annualizedRatePct: 34.07 });
    expect(s.rollingLeakRatePct).toBe(28);
  });

  it('does not let gram-level rounding invent a leak', () => {
    // Our worked example: recharged 0.1 + 0.2 kg, recovered 0.3 kg → 0 kg made-up (in floating point 0.1 + 0.2 > 0.3)
    const s = computeUnitStats(
      unit,
      [
        { kind: 'recovery', at: day(-5), kg: 0.3 },
        { kind: 'recharge', at: day(-5), kg: 0.1 },
        { kind: 'recharge', at: day(-5), kg: 0.2 },
      ],
      D,
    );
    expect(s.visits[0].madeUpKg).toBe(0);
    expect(s.forecastReason).toBe('no_leak_evidence');
  });

  it('leaves out retrofit charges and flags a chronic calendar year', () => {
    // Source: 40 CFR 82.157(b) (retrofit charge excluded) and 82.157(m) (≥ 125 % in a calendar year).
    // Our arithmetic: 2025 top-ups 3.5 + 3.0 = 6.5 kg of 5 kg = 130 %; the 4.8 kg retrofit fill does not count
    const s = computeUnitStats(
      unit,
      [
        { kind: 'recharge', at: '2025-01-10', kg: 4.8, excluded: true },
        { kind: 'top_up', at: '2025-02-01', kg: 3.5 },
        { kind: 'top_up', at: '2025-05-01', kg: 3.0 },
      ],
      '2025-06-30',
    );
    expect(s.calendarYearSharePct).toBe(130);
    expect(s.chronicallyLeaking).toBe(true);
    expect(s.visits[0]).toMatchObject({ madeUpKg: 0, excludedKg: 4.8, annualizedRatePct: null });
    // the first top-up counts from the retrofit fill: 22 days
    expect(s.visits[1].daysSincePreviousAddition).toBe(22);
  });
});

describe('leak checks and PTI', () => {
  it('sets the next leak check 12 months after the last one', () => {
    // Source: Reg. (EU) 2024/573: 7.15 t CO2e → every 12 months
    const s = computeUnitStats(unit, [{ kind: 'leak_check', at: '2025-03-15T10:00:00Z', leakFound: false }], D);
    expect(s.lastLeakCheckAt).toBe('2025-03-15T10:00:00Z');
    expect(s.nextLeakCheckDue).toBe('2026-03-15');
    expect(s.leakCheckOverdue).toBe(false);
  });

  it('asks for a re-check within a month of a repair', () => {
    // Source: Reg. (EU) 2024/573 (synopsis): re-check within 1 month of a repair
    const s = computeUnitStats(
      unit,
      [
        { kind: 'leak_check', at: '2025-01-31', leakFound: true, location: 'brazed_joint' },
        { kind: 'repair', at: '2025-01-31', location: 'brazed_joint', action: 'rebrazed', verified: false },
      ],
      D,
    );
    expect(s.nextLeakCheckDue).toBe('2025-02-28');
    expect(s.leakCheckOverdue).toBe(true);
    expect(s.openLeak).toBeNull();
    const rechecked = computeUnitStats(
      unit,
      [
        { kind: 'repair', at: '2025-01-31', location: 'brazed_joint', verified: true },
        { kind: 'leak_check', at: '2025-02-20', leakFound: false },
      ],
      D,
    );
    expect(rechecked.nextLeakCheckDue).toBe('2026-02-20');
  });

  it('counts from commissioning when the unit was never checked, and sets none below 5 t', () => {
    // Source: Reg. (EU) 2024/573 bands; our arithmetic: R-744 5 kg = 0.005 t → none
    expect(computeUnitStats({ ...unit, commissionedOn: '2025-01-01' }, [], D).nextLeakCheckDue).toBe('2026-01-01');
    expect(computeUnitStats({ ...unit, refrigerant: 'R-744' }, [], D)).toMatchObject({
      leakCheckIntervalMonths: null,
      nextLeakCheckDue: null,
    });
    expect(computeUnitStats({ ...unit, leakDetection: true }, [], D).leakCheckIntervalMonths).toBe(24);
  });

  it('keeps a passed PTI valid for the configured days', () => {
    // Our definition: valid until PTI day + 90 days (setting); 2025-06-01 + 90 days = 2025-08-30
    const s = computeUnitStats(unit, [{ kind: 'pti', at: '2025-06-01T07:00:00Z', passed: true }], D);
    expect(s).toMatchObject({
      ptiPassed: true,
      ptiValidUntil: '2025-08-30',
      ptiValid: true,
      lastPtiAt: '2025-06-01T07:00:00Z',
    });
    const short = computeUnitStats(
      unit,
      [{ kind: 'pti', at: '2025-06-01', passed: true }],
      D,
      settingsSchema.parse({ ptiValidityDays: 30 }),
    );
    expect(short).toMatchObject({ ptiValidUntil: '2025-07-01', ptiValid: true });
    const failed = computeUnitStats(
      unit,
      [
        { kind: 'pti', at: '2025-06-01', passed: true },
        { kind: 'pti', at: '2025-06-20', passed: false },
      ],
      D,
    );
    expect(failed).toMatchObject({ ptiPassed: false, ptiValidUntil: null, ptiValid: false });
  });
});

describe('open leak', () => {
  it('is cleared by a repair in the same visit, whatever the order of entry', () => {
    const s = computeUnitStats(
      unit,
      [
        { kind: 'repair', at: day(-3), location: 'sight_glass', verified: false, visitId: 'x' },
        { kind: 'leak_check', at: day(-3), leakFound: true, location: 'sight_glass', visitId: 'x' },
      ],
      D,
    );
    expect(s.openLeak).toBeNull();
  });

  it('keeps the first unrepaired find and fills in its location from a later one', () => {
    const s = computeUnitStats(
      unit,
      [
        { kind: 'leak_check', at: day(-30), leakFound: true },
        { kind: 'leak_check', at: day(-3), leakFound: true, location: 'compressor' },
      ],
      D,
    );
    expect(s.openLeak).toEqual({ foundAt: day(-30), location: 'compressor' });
  });
});

describe('policies', () => {
  it('applies the US reference policy', () => {
    // Source: 89 FR 82682 (2024): no duty below 15 lb (a 5 kg unit)
    const s = computeUnitStats(unit, section6Events, D, settingsSchema.parse({ policy: 'US' }));
    expect(s.leakCheckIntervalMonths).toBeNull();
    expect(s.nextLeakCheckDue).toBeNull();
  });

  it('uses the AR5 basis when set', () => {
    // Our arithmetic: 5 kg × 1300 / 1000 = 6.5 t
    expect(computeUnitStats(unit, [], D, settingsSchema.parse({ gwpBasis: 'AR5' })).co2eTonnes).toBe(6.5);
  });
});

describe('history edges', () => {
  it('gives a quiet unit zeros and nulls', () => {
    const s = computeUnitStats({ ...unit, commissionedOn: null }, [], D);
    expect(s).toMatchObject({
      rollingLeakRatePct: 0,
      calendarYearSharePct: 0,
      totalMadeUpKg365: 0,
      forecast: null,
      forecastReason: 'no_leak_evidence',
      rollingSinceRepair: false,
      openLeak: null,
      lastLeakCheckAt: null,
      ptiPassed: null,
      score: { value: 0, band: 'tight' },
      pressureHealth: { latest: null, flag: 'unknown' },
    });
  });

  it('leaves out events after the "as of" moment and kinds it does not use', () => {
    const events = [
      { kind: 'top_up', at: day(-10), kg: 1 },
      { kind: 'top_up', at: `${D}T23:59:00Z`, kg: 1 },
      { kind: 'top_up', at: day(5), kg: 1 },
      { kind: 'note', at: day(-1), note: 'checked the plug', visitId: 12 },
    ] as unknown as UnitEvent[];
    const s = computeUnitStats(unit, events, D);
    // a date-only "as of" means the end of that day
    expect(s.counts).toMatchObject({ events: 2, afterAsOf: 1, ignored: 1, topUps: 2 });
    expect(computeUnitStats(unit, events, `${D}T12:00:00Z`).counts.afterAsOf).toBe(2);
  });

  it('orders events given out of order, keeping ties in the order they were entered', () => {
    // Whole-second times (the fast sort) and millisecond times (the comparator sort) must agree.
    for (const stamp of ['T10:00:00Z', 'T10:00:00.250Z']) {
      const s = computeUnitStats(
        unit,
        [
          { kind: 'pti', at: `${day(-1)}${stamp}`, passed: true },
          { kind: 'pti', at: `${day(-1)}${stamp}`, passed: false },
          { kind: 'pti', at: `${day(-20)}${stamp}`, passed: true },
          { kind: 'top_up', at: `${day(-30)}${stamp}`, kg: 0.4 },
        ],
        D,
      );
      expect(s.ptiPassed).toBe(false);
      expect(s.visits.map((v) => v.date)).toEqual([day(-30), day(-20), day(-1)]);
    }
  });

  it('reads timestamps with offsets and without a zone', () => {
    const s = computeUnitStats(
      unit,
      [
        { kind: 'top_up', at: '2025-06-01T01:30:00+03:00', kg: 0.5 },
        { kind: 'top_up', at: '2025-06-10 12:00', kg: 0.5 },
        { kind: 'top_up', at: '2025-06-12T12:00:00.123456Z', kg: 0.5 },
      ],
      D,
    );
    expect(s.visits.map((v) => v.date)).toEqual(['2025-05-31', '2025-06-10', '2025-06-12']);
  });
});

describe('bad input', () => {
  const expectError = (fn: () => unknown, field: string, message: RegExp) => {
    try {
      fn();
    } catch (e) {
      expect(isDomainError(e)).toBe(true);
      expect((e as DomainError).field).toBe(field);
      expect((e as DomainError).message).toMatch(message);
      return;
    }
    throw new Error('expected a DomainError');
  };

  it('names a negative or missing charge', () => {
    expectError(() => computeUnitStats({ ...unit, nominalChargeKg: -1 }, [], D), 'nominalChargeKg', /more than 0 kg/);
    expectError(
      () => computeUnitStats({ ...unit, nominalChargeKg: Number.NaN }, [], D),
      'nominalChargeKg',
      /more than 0 kg/,
    );
    expect(() => computeUnitStats(null as unknown as typeof unit, [], D)).toThrow(/unit is missing/);
  });

  it('names an unknown refrigerant', () => {
    expectError(
      () => computeUnitStats({ ...unit, refrigerant: 'R-22' }, [], D),
      'refrigerant',
      /Unknown refrigerant "R-22"/,
    );
  });

  it('names bad dates', () => {
    expectError(() => computeUnitStats(unit, [], 'tomorrow'), 'asOf', /not a valid date/);
    expectError(
      () => computeUnitStats({ ...unit, commissionedOn: '2025-02-30' }, [], D),
      'commissionedOn',
      /not a valid date/,
    );
    expectError(
      () => computeUnitStats(unit, [{ kind: 'top_up', at: '01/02/2025', kg: 1 }], D),
      'events[0].at',
      /Entry 1 date/,
    );
    for (const bad of [
      '2025-13-01',
      '1850-01-01',
      '2025-06-01T25:00:00Z',
      '2025-06-01T10:00:00+0x:00',
      '2025-06-01T10:00:00Q',
      '2025-06-01T10:00:61Z',
      '2025-06-01T10:00:00.Z',
    ]) {
      expect(() => computeUnitStats(unit, [{ kind: 'pti', at: bad, passed: true }], D)).toThrow(/not a valid date/);
    }
    expect(computeUnitStats(unit, [{ kind: 'pti', at: '2025-06-01T10:00:00+0200', passed: true }], D).lastPtiAt).toBe(
      '2025-06-01T10:00:00+0200',
    );
  });

  it('names negative amounts, readings below vacuum and unknown words', () => {
    expectError(() => computeUnitStats(unit, [{ kind: 'top_up', at: D, kg: -0.5 }], D), 'events[0].kg', /0 kg or more/);
    expectError(
      () => computeUnitStats(unit, [{ kind: 'pressure', at: D, suctionKPaG: -120 }], D),
      'events[0].suctionKPaG',
      /below a perfect vacuum/,
    );
    expectError(
      () => computeUnitStats(unit, [{ kind: 'pressure', at: D, dischargeKPaG: -200 }], D),
      'events[0].dischargeKPaG',
      /discharge reading/,
    );
    expectError(
      () => computeUnitStats(unit, [{ kind: 'pressure', at: D, dischargeKPaG: Number.NaN }], D),
      'events[0]',
      /must be numbers/,
    );
    expectError(
      () => computeUnitStats(unit, [{ kind: 'pressure', at: D, ambientC: -300 }], D),
      'events[0].ambientC',
      /absolute zero/,
    );
    expectError(
      () => computeUnitStats(unit, [{ kind: 'pressure', at: D, sightGlass: 'cloudy' as 'full' }], D),
      'events[0].sightGlass',
      /sight-glass/,
    );
    expectError(
      () => computeUnitStats(unit, [{ kind: 'leak_check', at: D, leakFound: true, location: 'roof' as 'other' }], D),
      'events[0].location',
      /leak location/,
    );
    expectError(
      () => computeUnitStats(unit, [{ kind: 'leak_check', at: D } as unknown as UnitEvent], D),
      'events[0].leakFound',
      /leak was found/,
    );
    expectError(
      () => computeUnitStats(unit, [{ kind: 'repair', at: D, verified: true, location: 'roof' as 'other' }], D),
      'events[0].location',
      /leak location/,
    );
    expectError(
      () => computeUnitStats(unit, [{ kind: 'repair', at: D, verified: true, action: 'glued' as 'other' }], D),
      'events[0].action',
      /repair action/,
    );
    expectError(
      () => computeUnitStats(unit, [{ kind: 'pti', at: D } as unknown as UnitEvent], D),
      'events[0].passed',
      /PTI passed/,
    );
    expectError(
      () => computeUnitStats(unit, [{ kind: 'pti', at: D, passed: true, visitId: 7 as unknown as string }], D),
      'events[0].visitId',
      /must be text/,
    );
    expectError(() => computeUnitStats(unit, 'none' as unknown as UnitEvent[], D), 'events', /list of events/);
  });
});

describe('properties', () => {
  it('never puts NaN or Infinity in the output for any valid history', () => {
    fc.assert(
      fc.property(unitArb, historyArb, (u, events) => {
        expect(nonFinitePaths(computeUnitStats(u, events, D))).toEqual([]);
      }),
      { numRuns: 500 },
    );
  });

  it('gives the same figures whatever order the events come in', () => {
    // Events at distinct moments, so no tie is left to the order of entry.
    const distinct = historyArb.map((events) =>
      events.filter((e, i) => events.findIndex((x) => Date.parse(x.at) === Date.parse(e.at)) === i),
    );
    const withShuffle = distinct.chain((events) =>
      fc.tuple(
        fc.constant(events),
        fc.shuffledSubarray(events, { minLength: events.length, maxLength: events.length }),
      ),
    );
    fc.assert(
      fc.property(unitArb, withShuffle, (u, [events, shuffled]) => {
        expect(computeUnitStats(u, shuffled, D)).toEqual(computeUnitStats(u, events, D));
      }),
      { numRuns: 200 },
    );
  });
});
