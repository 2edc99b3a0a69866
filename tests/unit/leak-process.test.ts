import { describe, expect, it } from 'vitest';
import { LeakProcess, type LeakSpec } from '../../seed/simulator/leak-process';
import { createRng } from '../../seed/simulator/prng';

// The demo fleet's hidden leak process on its own, driven by the seeded random stream: the same seed always gives
// the same leaks, so every figure below is exact or a bound that holds for these seeds.
const START = 20_000;
const spec = (over: Partial<LeakSpec> = {}): LeakSpec => ({
  fullKg: 5,
  leakClass: 'slow',
  weakSpot: 'brazed_joint',
  permeationKgPerDay: 0.001,
  hazardPerYear: 0,
  commissionDay: START,
  recordStartDay: START,
  todayDay: START + 6 * 365,
  newInRecord: true,
  sightGlassAt: 0.1,
  initialLeaks: [],
  holdMultiplier: 1,
  ...over,
});
/** One leak of 36.5 % of a 5 kg charge a year (5 g a day), `daysBeforeStart` before the record starts. */
const oneLeak = (daysBeforeStart = 10) => [
  { location: 'service_valve' as const, ratePctPerYear: 36.5, daysBeforeStart },
];

describe('leak process', () => {
  it('draws the same leaks and the same start from the same seed, and others from another seed', () => {
    const make = (seed: number) =>
      new LeakProcess(
        createRng(seed),
        spec({ leakClass: 'chronic', hazardPerYear: 0.7, initialLeaks: undefined, newInRecord: false }),
      );
    const a = make(7);
    const b = make(7);
    expect(b.leaks).toEqual(a.leaks);
    expect(b.deficitKg).toBe(a.deficitKg);
    expect(a.leaks.length).toBeGreaterThan(0);
    expect(make(8).leaks).not.toEqual(a.leaks);
  });

  it('loses permeation alone when the unit has no leak', () => {
    const p = new LeakProcess(createRng(1), spec());
    expect(p.leaks).toEqual([]);
    expect(p.lostBetween(START, START + 100)).toBeCloseTo(0.1, 10);
  });

  it('loses each open leak at its rate from the day it starts', () => {
    const started = new LeakProcess(createRng(1), spec({ initialLeaks: oneLeak(10) }));
    expect(started.rateAt(START)).toBeCloseTo(0.006, 10);
    expect(started.lostBetween(START, START + 100)).toBeCloseTo(0.6, 10);
    // A leak that starts 50 days into the record adds its 5 g a day from then on only.
    const later = new LeakProcess(createRng(1), spec({ initialLeaks: oneLeak(-50) }));
    expect(later.rateAt(START + 49)).toBeCloseTo(0.001, 10);
    expect(later.lostBetween(START, START + 100)).toBeCloseTo(0.1 + 0.25, 10);
  });

  it('finds the first day the deficit reaches a level, the day the loss says it does', () => {
    const p = new LeakProcess(createRng(1), spec({ initialLeaks: oneLeak() }));
    const day = p.dayDeficitReaches(1, START, START + 1000);
    expect(day).toBe(START + Math.ceil(1 / 0.006));
    expect(p.lostBetween(START, day! - 1)).toBeLessThan(1);
    expect(p.lostBetween(START, day!)).toBeGreaterThanOrEqual(1);
    expect(p.dayDeficitReaches(1, START, START + 100)).toBeNull();
  });

  it('never loses more than 90 % of the charge', () => {
    const p = new LeakProcess(createRng(1), spec({ initialLeaks: oneLeak() }));
    p.advance(START, START + 3650);
    expect(p.deficitKg).toBeCloseTo(4.5, 10);
  });

  it('takes made-up refrigerant off the deficit, and a recharge fills it', () => {
    const p = new LeakProcess(createRng(1), spec({ initialLeaks: oneLeak() }));
    p.advance(START, START + 100);
    p.madeUp(0.25);
    expect(p.deficitKg).toBeCloseTo(0.35, 10);
    p.madeUp(1);
    expect(p.deficitKg).toBe(0);
    p.advance(START + 100, START + 200);
    p.madeUp();
    expect(p.deficitKg).toBe(0);
  });

  it('stops a leak whose repair holds', () => {
    const p = new LeakProcess(createRng(1), spec({ initialLeaks: oneLeak(), repairOutcome: 'hold' }));
    expect(p.repair(p.leaks, START + 30, 0.5)).toBe(true);
    expect(p.rateAt(START + 31)).toBeCloseTo(0.001, 10);
    expect(p.active(START + 31)).toEqual([]);
  });

  it('reopens a leak whose repair fails, after the given days and at the given share of its rate', () => {
    const p = new LeakProcess(
      createRng(1),
      spec({ initialLeaks: oneLeak(), repairOutcome: 'fail', reopen: { afterDays: 30, rateFactor: 0.5 } }),
    );
    expect(p.repair(p.leaks, START + 30, 0.9)).toBe(false);
    // Quiet for a week plus the 30 days, then 2.5 g a day.
    expect(p.rateAt(START + 66)).toBeCloseTo(0.001, 10);
    expect(p.rateAt(START + 67)).toBeCloseTo(0.0035, 10);
  });

  it('finds nothing that is fixed or has not started, and a big open leak with most checks', () => {
    const p = new LeakProcess(createRng(3), spec({ initialLeaks: oneLeak(-50) }));
    expect(p.detect(START + 10, 'uv_dye')).toEqual([]);
    const checks = Array.from({ length: 400 }, () => p.detect(START + 60, 'uv_dye').length);
    const share = checks.reduce((s, n) => s + n, 0) / checks.length;
    // UV dye finds a leak with 72 % sensitivity times min(1, 0.5 + its yearly share of the charge) = 0.72 × 0.865.
    expect(share).toBeGreaterThan(0.55);
    expect(share).toBeLessThan(0.7);
    p.leaks[0].fixed = true;
    expect(p.detect(START + 60, 'uv_dye')).toEqual([]);
  });

  it('brings new leaks at the hazard rate, rising with age', () => {
    // 0.5 a year at age 0, × (1 + age / 15): over six years from new about 3.6 leaks.
    const counts = Array.from(
      { length: 300 },
      (_, seed) => new LeakProcess(createRng(seed), spec({ hazardPerYear: 0.5 })).leaks.length,
    );
    const mean = counts.reduce((s, n) => s + n, 0) / counts.length;
    expect(mean).toBeGreaterThan(3.2);
    expect(mean).toBeLessThan(4);
  });

  it('reports each leak in the truth as a yearly share of the charge', () => {
    const p = new LeakProcess(createRng(1), spec({ initialLeaks: oneLeak(10) }));
    expect(p.truth()).toEqual([{ location: 'service_valve', ratePctPerYear: 36.5, onDay: START - 10, fixed: false }]);
  });
});
