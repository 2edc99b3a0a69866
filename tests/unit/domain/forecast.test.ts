import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computeUnitStats, DomainError, forecastNextTopUp, naiveForecastDay } from '../../../shared/domain';
import { D, day, historyArb, section6Events, unitArb } from './helpers';

describe('next top-up forecast, DOMAIN.md §7 example', () => {
  it('forecasts D+70 with no range for the §6 unit', () => {
    // Our definition (DOMAIN.md §7): only the D−40 visit counts; interval D−150 → D−40 = 110 days;
    // λ = 0.8/110, a = 0.8 → a/λ = 110 → D−40 + 110 = D+70; one interval → no range
    const s = computeUnitStats(
      { refrigerant: 'R-134a', nominalChargeKg: 5, commissionedOn: day(-2000) },
      section6Events,
      D,
    );
    expect(s.forecast).toMatchObject({
      date: day(70),
      earliest: null,
      latest: null,
      overdue: false,
      intervalDays: 110,
      expectedKg: 0.8,
    });
    expect(s.forecast?.basisIntervals).toEqual([{ from: day(-150), to: day(-40), days: 110, madeUpKg: 0.8 }]);
    expect(s.forecastReason).toBeNull();
  });
});

describe('next top-up forecast, our worked examples', () => {
  it('uses the last three intervals and gives a range', () => {
    // Our worked example, days after D−300 with made-up kg: 0: 1.0, 100: 1.0, 160: 0.6, 260: 0.9, 300: 0.5.
    // Last 3 intervals: 100→160 (60 d, 0.6 kg), 160→260 (100 d, 0.9 kg), 260→300 (40 d, 0.5 kg).
    // λ = (0.6 + 0.9 + 0.5) / (60 + 100 + 40) = 2.0/200 = 0.01 kg/day; a = median(0.6, 0.9, 0.5) = 0.6 kg
    // forecast = day 300 + 0.6/0.01 = day 360 → D+60
    // λᵢ = 0.01, 0.009, 0.0125 → earliest 300 + 0.6/0.0125 = 348 → D+48; latest 300 + 0.6/0.009 = 366.67 → 367 → D+67
    const visits = [
      { at: day(-300), madeUpKg: 1.0 },
      { at: day(-200), madeUpKg: 1.0 },
      { at: day(-140), madeUpKg: 0.6 },
      { at: day(-40), madeUpKg: 0.9 },
      { at: day(0), madeUpKg: 0.5 },
    ];
    const { forecast, reason } = forecastNextTopUp(visits, day(-400), D);
    expect(reason).toBeNull();
    expect(forecast).toMatchObject({
      date: day(60),
      earliest: day(48),
      latest: day(67),
      intervalDays: 60,
      expectedKg: 0.6,
      lastAdditionDate: day(0),
    });
    expect(forecast?.basisIntervals.map((i) => i.days)).toEqual([60, 100, 40]);
  });

  it('runs a single interval from commissioning when there is no repair', () => {
    // Our worked example: commissioned D−200, one top-up of 1.2 kg on D−80 → interval 120 days,
    // a/λ = 1.2 / (1.2/120) = 120 → D−80 + 120 = D+40
    const { forecast } = forecastNextTopUp([{ at: day(-80), madeUpKg: 1.2 }], day(-200), D);
    expect(forecast).toMatchObject({ date: day(40), earliest: null, latest: null });
  });

  it('is overdue when the date has passed', () => {
    // Our worked example: additions on D−300 and D−200 (0.5 kg each) → 100-day interval → D−100, before D
    const { forecast } = forecastNextTopUp(
      [
        { at: day(-300), madeUpKg: 0.5 },
        { at: day(-200), madeUpKg: 0.5 },
      ],
      day(-400),
      D,
    );
    expect(forecast).toMatchObject({ date: day(-100), overdue: true });
  });

  it('gives no forecast without made-up refrigerant', () => {
    // Our definition (DOMAIN.md §7): no leak evidence → no forecast
    expect(forecastNextTopUp([{ at: day(-10), madeUpKg: 0 }], day(-100), D)).toEqual({
      forecast: null,
      reason: 'no_leak_evidence',
    });
  });

  it('clears the forecast after a verified repair, but not after an unverified one', () => {
    // Our definition (DOMAIN.md §7): a verified repair after the last addition clears it
    const verified = forecastNextTopUp(
      [
        { at: day(-100), madeUpKg: 1 },
        { at: day(-50), madeUpKg: 0, verifiedRepair: true },
      ],
      day(-300),
      D,
    );
    expect(verified).toEqual({ forecast: null, reason: 'repaired_since_last_addition' });
    const unverified = forecastNextTopUp(
      [
        { at: day(-100), madeUpKg: 1 },
        { at: day(-50), madeUpKg: 0, verifiedRepair: false },
      ],
      day(-300),
      D,
    );
    expect(unverified.forecast?.date).toBe(day(100));
  });

  it('counts the repair visit’s own top-up as the leak before it', () => {
    // Our definition (DOMAIN.md §4, §7): 1 kg added in the verified repair visit itself → nothing after it → cleared
    expect(forecastNextTopUp([{ at: day(-50), madeUpKg: 1, verifiedRepair: true }], day(-300), D).reason).toBe(
      'repaired_since_last_addition',
    );
  });

  it('refuses negative made-up refrigerant and bad dates', () => {
    expect(() => forecastNextTopUp([{ at: day(-1), madeUpKg: -1 }], day(-10), D)).toThrow(DomainError);
    expect(() => forecastNextTopUp([{ at: 'yesterday', madeUpKg: 1 }], day(-10), D)).toThrow(/not a valid date/);
  });

  it('offers the naive forecast "the last interval repeats"', () => {
    // Our definition (DOMAIN.md §7, the yardstick): additions on days 10 and 40 → 40 + 30 = 70
    expect(naiveForecastDay([10, 40])).toBe(70);
    expect(naiveForecastDay([10])).toBeNull();
  });
});

describe('next top-up forecast, properties', () => {
  const unit = { refrigerant: 'R-134a', nominalChargeKg: 5, commissionedOn: day(-2000) };

  it('is cleared by a verified repair with nothing after it', () => {
    fc.assert(
      fc.property(historyArb, (events) => {
        const withRepair = [...events, { kind: 'repair' as const, at: `${day(1)}T12:00:00Z`, verified: true }];
        const s = computeUnitStats(unit, withRepair, day(1));
        expect(s.forecast).toBeNull();
        expect(s.forecastReason).not.toBeNull();
      }),
      { numRuns: 300 },
    );
  });

  it('is never before the last addition', () => {
    fc.assert(
      fc.property(unitArb, historyArb, (u, events) => {
        const s = computeUnitStats(u, events, D);
        if (!s.forecast) return;
        const lastAddition = [...s.visits].reverse().find((v) => v.madeUpKg > 0);
        expect(lastAddition).toBeDefined();
        expect(s.forecast.date >= s.forecast.lastAdditionDate).toBe(true);
        expect(s.forecast.lastAdditionDate <= (lastAddition?.date ?? '')).toBe(true);
        if (s.forecast.earliest) expect(s.forecast.earliest >= s.forecast.lastAdditionDate).toBe(true);
        if (s.forecast.latest) expect(s.forecast.latest >= s.forecast.date).toBe(true);
      }),
      { numRuns: 300 },
    );
  });
});
