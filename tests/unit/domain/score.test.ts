import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computeUnitStats, DomainError, repeatLeakScore, scoreBand } from '../../../shared/domain';
import { settingsSchema } from '../../../shared/schemas/settings';
import { fmtIsoDay } from '../../../shared/format-dates';
import { D, day, historyArb, section6Events, unitArb } from './helpers';

const unit = { refrigerant: 'R-134a', nominalChargeKg: 5, commissionedOn: day(-2000) };

describe('repeat-leak score, DOMAIN.md §6 example', () => {
  it('scores the §6 unit 64, chronic, and lists the re-checks its record shows missed', () => {
    // Source: DOMAIN.md §6 worked example: f_rate 0.8/5 = 16 % → 0.32; f_count (3−1)/3 = 0.667; f_after_repair 1
    // (110 days); f_same_spot 1 → round(100 × (0.128 + 0.1667 + 0.2 + 0.15)) = round(64.47) = 64, "chronic".
    // The history has no reading the day after any top-up and no leak check within 30 days of the repair: 3 re-checks
    // missed (due D−299, D−120, D−39), listed as evidence, no points.
    const s = computeUnitStats(unit, section6Events, D).score;
    expect(s.value).toBe(64);
    expect(s.missedRechecks.items).toHaveLength(3);
    expect(s.missedRechecks.explanation).toBe(
      '3 re-checks after a top-up or repair missed in the last 365 days — listed as evidence; they do not change the score.',
    );
    expect(s.band).toBe('chronic');
    expect(s.factors.rate).toMatchObject({ value: 0.32, weight: 0.4, points: 12.8 });
    expect(s.factors.count).toMatchObject({ value: 0.6667, weight: 0.25, points: 16.7 });
    expect(s.factors.afterRepair).toMatchObject({ value: 1, weight: 0.2, points: 20 });
    expect(s.factors.sameSpot).toMatchObject({ value: 1, weight: 0.15, points: 15 });
    expect(s.factors.afterRepair.explanation).toContain('110 days');
    expect(s.factors.sameSpot.explanation).toContain('service valve on 2 visits');
    expect(s.factors.rate.explanation).toContain(`since the verified repair on ${fmtIsoDay(day(-150))}`);
  });

  it('gives the same figure from the inputs alone', () => {
    // Our definition (DOMAIN.md §6), same arithmetic as above
    const s = repeatLeakScore({
      rollingLeakRatePct: 16,
      visitsWithMadeUp: 3,
      daysFromRepairToRecurrence: 110,
      sameSpot: { location: 'service_valve', visits: 2 },
    });
    expect(s.value).toBe(64);
  });
});

describe('repeat-leak score, our worked examples', () => {
  it('scores a unit with one small top-up 8, tight, and lists its missed re-check', () => {
    // Our worked example: 5 kg unit, 0.5 kg on D−200, nothing else.
    // rate 0.5/5 = 10 % → 10/50 = 0.2 → 0.40 × 0.2 = 0.08; count (1−1)/3 = 0; after repair 0; same spot 0
    // → round(100 × 0.08) = 8, "tight"; nobody came back the next day: one missed re-check, listed, no points
    const s = computeUnitStats(unit, [{ kind: 'top_up', at: day(-200), kg: 0.5 }], D).score;
    expect(s).toMatchObject({ value: 8, band: 'tight' });
    expect(s.missedRechecks.items).toEqual([
      `Re-check after the top-up of ${fmtIsoDay(day(-200))} missed (due ${fmtIsoDay(day(-199))}, not done).`,
    ]);
    expect(s.factors.count.explanation).toContain('1 visit with');
    expect(s.factors.afterRepair.explanation).toContain('No leak came back');
    expect(s.factors.sameSpot.explanation).toContain('No leak location found twice');
  });

  it('gives half the after-repair factor for a leak back 181–365 days after a repair', () => {
    // Our worked example: 4 kg unit. D−330 verified repair at a brazed joint (nothing added);
    // D−100 1.0 kg + leak at a brazed joint; D−20 1.0 kg + leak at the condenser coil.
    // rate (1.0 + 1.0)/4 = 50 % → min(1, 50/50) = 1 → 40 points
    // count (2−1)/3 = 0.3333 → 25 × 0.3333 = 8.33 points
    // after repair: first recurrence 230 days after the repair → 0.5 → 10 points
    // same spot: brazed joint and condenser coil differ → 0
    // → round(40 + 8.33 + 10) = 58, "watch"; re-checks missed: the repair's (due D−300, leak check only on D−100) and
    // both top-ups' (the next day) → 3, listed as evidence, no points
    const s = computeUnitStats(
      { refrigerant: 'R-134a', nominalChargeKg: 4, commissionedOn: day(-1000) },
      [
        { kind: 'repair', at: day(-330), location: 'brazed_joint', action: 'rebrazed', verified: true },
        { kind: 'top_up', at: day(-100), kg: 1 },
        { kind: 'leak_check', at: day(-100), leakFound: true, location: 'brazed_joint' },
        { kind: 'top_up', at: day(-20), kg: 1 },
        { kind: 'leak_check', at: day(-20), leakFound: true, location: 'condenser_coil' },
      ],
      D,
    ).score;
    expect(s.factors.rate.value).toBe(1);
    expect(s.factors.count.value).toBeCloseTo(0.3333, 4);
    expect(s.factors.afterRepair.value).toBe(0.5);
    expect(s.factors.sameSpot.value).toBe(0);
    expect(s).toMatchObject({ value: 58, band: 'watch' });
    expect(s.missedRechecks.items).toHaveLength(3);
  });

  it('does not count two leaks at "other" as the same spot', () => {
    // Our definition: "other" names no place, so it never repeats
    const s = repeatLeakScore({
      rollingLeakRatePct: 0,
      visitsWithMadeUp: 0,
      daysFromRepairToRecurrence: null,
      sameSpot: null,
    });
    expect(s.factors.sameSpot.value).toBe(0);
    const stats = computeUnitStats(
      unit,
      [
        { kind: 'leak_check', at: day(-100), leakFound: true, location: 'other' },
        { kind: 'leak_check', at: day(-10), leakFound: true, location: 'other' },
      ],
      D,
    );
    expect(stats.score.factors.sameSpot.value).toBe(0);
  });

  it('gives no after-repair points for a leak more than a year after the repair', () => {
    // Our definition (DOMAIN.md §6): > 365 days → 0
    expect(
      repeatLeakScore({ rollingLeakRatePct: 0, visitsWithMadeUp: 1, daysFromRepairToRecurrence: 400, sameSpot: null })
        .factors.afterRepair.value,
    ).toBe(0);
  });

  it('puts the band edges at 30 and 60', () => {
    // Our definition (DOMAIN.md §6): 0–29 tight, 30–59 watch, 60–100 chronic
    expect([0, 29, 30, 59, 60, 100].map((v) => scoreBand(v))).toEqual([
      'tight',
      'tight',
      'watch',
      'watch',
      'chronic',
      'chronic',
    ]);
  });

  it('follows the weights and cap in settings', () => {
    // Our arithmetic: rate only, weight 1, cap 20 % → 16/20 = 0.8 → 80, chronic
    const settings = settingsSchema.parse({
      score: { weights: { rate: 1, count: 0, afterRepair: 0, sameSpot: 0 }, rateCapPct: 20 },
    });
    const s = repeatLeakScore(
      { rollingLeakRatePct: 16, visitsWithMadeUp: 3, daysFromRepairToRecurrence: 10, sameSpot: null },
      settings,
    );
    expect(s).toMatchObject({ value: 80, band: 'chronic' });
  });

  it('refuses inputs that cannot be', () => {
    const ok = { rollingLeakRatePct: 1, visitsWithMadeUp: 1, daysFromRepairToRecurrence: null, sameSpot: null };
    expect(() => repeatLeakScore({ ...ok, rollingLeakRatePct: -1 })).toThrow(DomainError);
    expect(() => repeatLeakScore({ ...ok, visitsWithMadeUp: 1.5 })).toThrow(/whole number/);
    expect(() => repeatLeakScore({ ...ok, daysFromRepairToRecurrence: Number.NaN })).toThrow(/0 or more/);
  });
});

describe('repeat-leak score, missed re-checks as evidence', () => {
  it('lists each missed re-check with its days, newest first, and adds no points for them', () => {
    const s = computeUnitStats(
      unit,
      [
        { kind: 'top_up', at: `${day(-60)}T10:00:00Z`, kg: 0.3, visitId: 'a' },
        { kind: 'repair', at: `${day(-50)}T10:00:00Z`, location: 'service_valve', verified: false, visitId: 'b' },
      ],
      D,
    ).score;
    expect(s.missedRechecks.items).toEqual([
      `Leak check after the repair of ${fmtIsoDay(day(-50))} missed (due ${fmtIsoDay(day(-20))}, not done).`,
      `Re-check after the top-up of ${fmtIsoDay(day(-60))} missed (due ${fmtIsoDay(day(-59))}, not done).`,
    ]);
    expect(s.missedRechecks.explanation).toBe(
      '2 re-checks after a top-up or repair missed in the last 365 days — listed as evidence; they do not change the score.',
    );
    expect(s.missedRechecks).not.toHaveProperty('points');
    const factorSum = Object.values(s.factors).reduce((sum, f) => sum + 100 * f.weight * f.value, 0);
    expect(s.value).toBe(Math.round(factorSum));
  });

  it('counts nothing when the re-check came in time, and says when one came late', () => {
    const inTime = computeUnitStats(
      unit,
      [
        { kind: 'top_up', at: `${day(-60)}T10:00:00Z`, kg: 0.3, visitId: 'a' },
        { kind: 'pressure', at: `${day(-59)}T09:00:00Z`, visitId: 'b', sightGlass: 'full' },
      ],
      D,
    ).score;
    expect(inTime.missedRechecks.items).toEqual([]);
    expect(inTime.missedRechecks.explanation).toBe('No re-check missed in the last 365 days.');
    const late = computeUnitStats(
      unit,
      [
        { kind: 'top_up', at: `${day(-60)}T10:00:00Z`, kg: 0.3, visitId: 'a' },
        { kind: 'leak_check', at: `${day(-40)}T09:00:00Z`, visitId: 'b', leakFound: false },
      ],
      D,
    ).score;
    expect(late.missedRechecks.items).toEqual([
      `Re-check after the top-up of ${fmtIsoDay(day(-60))} missed (due ${fmtIsoDay(day(-59))}, done ${fmtIsoDay(day(-40))}).`,
    ]);
    expect(late.missedRechecks.explanation).toContain('it does not change the score');
    expect(late.value).toBe(inTime.value);
  });

  it('leaves out re-checks due before the trailing window and a top-up fixed in its visit', () => {
    const s = computeUnitStats(
      unit,
      [
        { kind: 'top_up', at: `${day(-400)}T10:00:00Z`, kg: 0.3, visitId: 'old' },
        { kind: 'leak_check', at: `${day(-30)}T10:00:00Z`, leakFound: true, location: 'service_valve', visitId: 'f' },
        { kind: 'repair', at: `${day(-30)}T10:05:00Z`, location: 'service_valve', verified: true, visitId: 'f' },
        { kind: 'top_up', at: `${day(-30)}T10:10:00Z`, kg: 0.5, visitId: 'f' },
      ],
      D,
    ).score;
    // The repair's own re-check is due D+0 (30 days): not missed yet; the old top-up's was due before the window.
    expect(s.missedRechecks.items).toEqual([]);
  });

  it('gives a unit with 2 missed re-checks the same score as the same unit with them done, and lists both', () => {
    // Our definition (DOMAIN.md §6): the score is the four factors only; a pressure reading moves none of them.
    const topUps = [
      { kind: 'top_up' as const, at: `${day(-90)}T10:00:00Z`, kg: 0.6, visitId: 'a' },
      { kind: 'top_up' as const, at: `${day(-30)}T10:00:00Z`, kg: 0.4, visitId: 'b' },
    ];
    const missed = computeUnitStats(unit, topUps, D).score;
    const done = computeUnitStats(
      unit,
      [
        ...topUps,
        { kind: 'pressure', at: `${day(-89)}T09:00:00Z`, visitId: 'c', sightGlass: 'full' },
        { kind: 'pressure', at: `${day(-29)}T09:00:00Z`, visitId: 'd', sightGlass: 'full' },
      ],
      D,
    ).score;
    expect(done.missedRechecks.items).toEqual([]);
    expect(missed.missedRechecks.items).toEqual([
      `Re-check after the top-up of ${fmtIsoDay(day(-30))} missed (due ${fmtIsoDay(day(-29))}, not done).`,
      `Re-check after the top-up of ${fmtIsoDay(day(-90))} missed (due ${fmtIsoDay(day(-89))}, not done).`,
    ]);
    expect(missed.value).toBeGreaterThan(0);
    expect(missed.value).toBe(done.value);
    expect(missed.band).toBe(done.band);
    expect(missed.factors).toEqual(done.factors);
  });

  it('gives the same figure from the inputs with or without missed re-checks, capped at 100', () => {
    const inputs = {
      rollingLeakRatePct: 80,
      visitsWithMadeUp: 5,
      daysFromRepairToRecurrence: 10,
      sameSpot: { location: 'service_valve' as const, visits: 3 },
    };
    const s = repeatLeakScore({
      ...inputs,
      missedRechecks: [
        { reason: 'top_up', sourceOn: day(-10), dueOn: day(-9), doneOn: null },
        { reason: 'repair', sourceOn: day(-100), dueOn: day(-70), doneOn: null },
      ],
    });
    expect(s.value).toBe(100);
    expect(s.value).toBe(repeatLeakScore(inputs).value);
    expect(s.missedRechecks.items).toHaveLength(2);
    const middling = { rollingLeakRatePct: 16, visitsWithMadeUp: 1, daysFromRepairToRecurrence: null, sameSpot: null };
    expect(
      repeatLeakScore({
        ...middling,
        missedRechecks: [{ reason: 'top_up', sourceOn: day(-10), dueOn: day(-9), doneOn: null }],
      }).value,
    ).toBe(repeatLeakScore(middling).value);
  });
});

describe('repeat-leak score, properties', () => {
  it('never falls when a top-up is larger', () => {
    fc.assert(
      fc.property(
        unitArb,
        historyArb,
        fc.nat(),
        fc.double({ min: 0, max: 5, noNaN: true }),
        (u, events, pick, extra) => {
          const movements = events.map((e, i) => [e, i] as const).filter(([e]) => e.kind === 'top_up');
          if (movements.length === 0) return;
          const [, i] = movements[pick % movements.length];
          const more = events.map((e, k) => (k === i && e.kind === 'top_up' ? { ...e, kg: e.kg + extra } : e));
          const a = computeUnitStats(u, events, D);
          const b = computeUnitStats(u, more, D);
          expect(b.score.value).toBeGreaterThanOrEqual(a.score.value);
          expect(b.rollingLeakRatePct).toBeGreaterThanOrEqual(a.rollingLeakRatePct);
        },
      ),
      { numRuns: 300 },
    );
  });
});
