import { describe, expect, it } from 'vitest';
import {
  buildCaseBase,
  computeUnitStats,
  decodeCaseBase,
  encodeCaseBase,
  forecastCases,
  forecastState,
  FORECAST_FEATURES,
  learnCaseBase,
  caseTableOf,
  type ForecastCase,
  type ForecastTimeline,
  type TimelineVisit,
  type UnitEvent,
} from '../../../shared/domain';
import { D, day } from './helpers';

const unit = { refrigerant: 'R-134a', nominalChargeKg: 5, commissionedOn: day(-2000) };
const topUp = (k: number, kg = 1, extra: Partial<UnitEvent> = {}): UnitEvent =>
  ({ kind: 'top_up', at: day(k), kg, visitId: `v${k}`, ...extra }) as UnitEvent;
const repair = (k: number, verified: boolean): UnitEvent => ({
  kind: 'repair',
  at: day(k),
  location: 'brazed_joint',
  verified,
  visitId: `v${k}`,
});
const dayNo = (iso: string) => Math.round(Date.parse(`${iso}T00:00:00Z`) / 86_400_000);
const D_DAY = dayNo(D);
const feature = (x: Float64Array, name: (typeof FORECAST_FEATURES)[number]) => x[FORECAST_FEATURES.indexOf(name)];

/**
 * A made-up fleet for the tests (our construction, no published source): units topped up at a call every `I`
 * days, each interval I × a factor from 0.7 to 1.6 (a fixed sequence), so a unit that has waited past I is still
 * expected, and later the longer it waits.
 */
function syntheticFleet(units: number): ForecastCase[] {
  const cases: ForecastCase[] = [];
  const factors = [1, 0.7, 1.3, 0.9, 1.6, 1.1, 0.8, 1.2, 1.45, 0.95];
  for (let u = 0; u < units; u++) {
    const I = 60 + (u % 9) * 15;
    const visits: TimelineVisit[] = [];
    let d = 0;
    for (let j = 0; j < 14; j++) {
      d += Math.round(I * factors[(u + j) % factors.length]);
      visits.push({
        day: d,
        madeUpKg: 0.5,
        verifiedRepair: false,
        repaired: false,
        pti: true,
        approachK: Number.NaN,
        approachAfterFillK: Number.NaN,
      });
    }
    const t: ForecastTimeline = { startDay: -I, fullKg: 5, visits };
    cases.push(...forecastCases(t, { fromDay: (u * 7) % 15, toDay: d + 200, stepDays: 15, unitKey: u }));
  }
  return cases;
}
const fleetCases = syntheticFleet(300);
const caseBase = learnCaseBase(caseTableOf(fleetCases), { builtAt: '2025-06-30T00:00:00Z', k: 100 });

describe('learned forecast (DOMAIN.md §7b): situations on hand-made histories', () => {
  it('has nothing to forecast after a repair that held (a verified repair after the last top-up)', () => {
    // Our definition (DOMAIN.md §7a/§7b): a verified repair after the last addition clears rhythm and forecast
    const s = computeUnitStats(unit, [topUp(-400), topUp(-300), repair(-200, true)], D, undefined, caseBase);
    expect(s.rhythm).toBeNull();
    expect(s.forecast).toBeNull();
    expect(s.forecastReason).toBe('repaired_since_last_addition');
  });

  it('says "first top-up after the repair" when a verified repair did not hold, with the repair date and dates in order', () => {
    // Our definition (DOMAIN.md §7b): one addition after the last verified repair → situation after_repair
    const s = computeUnitStats(
      unit,
      [topUp(-500), topUp(-400), repair(-300, true), topUp(-100)],
      D,
      undefined,
      caseBase,
    );
    expect(s.rhythm).toMatchObject({ date: day(100), intervalDays: 200 });
    expect(s.forecast).toMatchObject({
      situation: 'after_repair',
      repairDate: day(-300),
      lastAdditionDate: day(-100),
      waitedDays: 100,
    });
    const f = s.forecast!;
    expect(dayNo(f.date)).toBeGreaterThan(D_DAY);
    if (f.earliest && f.latest) expect(f.earliest <= f.date && f.date <= f.latest).toBe(true);
  });

  it('says "an unverified repair since the last top-up" when the repair was not checked', () => {
    // Our definition (DOMAIN.md §7b): an unverified repair at or after the last top-up's visit sets the situation
    const s = computeUnitStats(
      unit,
      [topUp(-300), topUp(-200), topUp(-100), repair(-50, false)],
      D,
      undefined,
      caseBase,
    );
    expect(s.forecast).toMatchObject({ situation: 'unverified_repair', repairDate: day(-50) });
    // The unverified repair does not clear the rhythm (DOMAIN.md §7a).
    expect(s.rhythm?.date).toBe(day(0));
  });

  it('names the situation by the count of intervals since the last verified repair', () => {
    // Our definition (DOMAIN.md §7b)
    const at = (events: UnitEvent[]) => computeUnitStats(unit, events, D, undefined, caseBase).forecast?.situation;
    expect(at([topUp(-100)])).toBe('first_top_up');
    expect(at([topUp(-200), topUp(-100)])).toBe('one_interval');
    expect(at([topUp(-300), topUp(-200), topUp(-100)])).toBe('two_intervals');
    expect(at([topUp(-400), topUp(-300), topUp(-200), topUp(-100)])).toBe('three_or_more');
  });

  it('never shows a date already past: a unit waiting past its median is "likely within" a date that moves on as it waits', () => {
    // Our worked example on the made-up fleet: additions every 100 days until D−160, so its own rhythm said D−60.
    const events = [topUp(-460), topUp(-360), topUp(-260), topUp(-160)];
    const now = computeUnitStats(unit, events, D, undefined, caseBase);
    const later = computeUnitStats(unit, events, day(60), undefined, caseBase);
    expect(now.rhythm).toMatchObject({ date: day(-60), overdue: true });
    expect(now.forecast).toMatchObject({ basis: 'cases', pastRhythm: true, overdue: false });
    expect(dayNo(now.forecast!.date)).toBeGreaterThan(D_DAY);
    expect(dayNo(later.forecast!.date)).toBeGreaterThan(D_DAY + 60);
    expect(later.forecast!.date > now.forecast!.date).toBe(true);
    for (const f of [now.forecast!, later.forecast!]) expect(f.earliest! <= f.date && f.date <= f.latest!).toBe(true);
  });
});

describe('learned forecast (DOMAIN.md §7b): features', () => {
  const v = (d: number, kg: number, o: Partial<TimelineVisit> = {}): TimelineVisit => ({
    day: d,
    madeUpKg: kg,
    verifiedRepair: false,
    repaired: false,
    pti: true,
    approachK: Number.NaN,
    approachAfterFillK: Number.NaN,
    ...o,
  });

  it('reads the routine calls, the fill readings and how the last top-up came from the record up to D', () => {
    // Our worked example: calls every 90 days from day 100 (a 1 kg top-up, 9.2 K after the fill); a 1.5 kg top-up at
    // an alarm (no PTI) on day 200, 9 K after the fill; calls on 280 and 370 without a top-up, the latest reading
    // 7.5 K → drift 7.5 − median(9.2, 9) = −1.6 K; D = 400.
    const t: ForecastTimeline = {
      startDay: 0,
      fullKg: 5,
      visits: [
        v(100, 1, { approachAfterFillK: 9.2 }),
        v(190, 0),
        v(200, 1.5, { pti: false, approachAfterFillK: 9, approachK: 9 }),
        v(280, 0, { approachK: 8.4 }),
        v(370, 0, { approachK: 7.5 }),
      ],
    };
    const { state } = forecastState(t, 400);
    expect(state?.situation).toBe('one_interval');
    const x = state!.features;
    expect(feature(x, 'logRhythmDays')).toBeCloseTo(Math.log(100), 6); // 1.5 kg / (1.5 kg / 100 d)
    expect(feature(x, 'logWaitedDays')).toBeCloseTo(Math.log(201), 6);
    expect(feature(x, 'callsSinceTopUp')).toBeCloseTo(Math.log(3), 6); // two calls since day 200
    expect(feature(x, 'lastTopUpWithoutCall')).toBe(1);
    expect(feature(x, 'logCallSpacingDays')).toBeCloseTo(Math.log(90), 6);
    expect(feature(x, 'callPhase')).toBeCloseTo(30 / 90, 6);
    expect(feature(x, 'approachDriftK')).toBeCloseTo(7.5 - 9.1, 6); // median of the fill readings 9.2 and 9
    expect(feature(x, 'lastKgShare')).toBeCloseTo(0.3, 6);
    expect(feature(x, 'minCallKgShare')).toBeCloseTo(0.2, 6); // the call top-up of 1 kg
  });

  it('sees nothing after D', () => {
    const t: ForecastTimeline = { startDay: 0, fullKg: 5, visits: [v(100, 1), v(200, 1), v(300, 1)] };
    const before = forecastState(t, 250).state!;
    const cut: ForecastTimeline = { ...t, visits: t.visits.slice(0, 2) };
    expect(Array.from(forecastState(cut, 250).state!.features)).toEqual(Array.from(before.features));
  });
});

describe('learned forecast (DOMAIN.md §7b): case base', () => {
  it('keeps its cases, levels and accuracy through its stored form', () => {
    const back = decodeCaseBase(encodeCaseBase(caseBase));
    expect(back.accuracy).toEqual(caseBase.accuracy);
    const a = caseBase.situations.three_or_more!;
    const b = back.situations.three_or_more!;
    expect(b).toMatchObject({ n: a.n, total: a.total, levels: a.levels, ratio: a.ratio });
    expect(Array.from(b.y)).toEqual(Array.from(a.y));
    for (let i = 0; i < a.x.length; i += 97) expect(Math.abs(b.x[i] - a.x[i])).toBeLessThanOrEqual(1 / 4096);
  });

  it('falls back to the rhythm scaled by the fleet when a situation has too few cases, and says so', () => {
    // Our definition (DOMAIN.md §7b): fewer than 100 cases → basis "rhythm"
    const small = buildCaseBase(fleetCases.slice(0, 40), { builtAt: '2025-06-30T00:00:00Z' });
    const s = computeUnitStats(unit, [topUp(-300), topUp(-200), topUp(-100)], D, undefined, small);
    expect(s.forecast).toMatchObject({ basis: 'rhythm', coveragePct: null });
    expect(dayNo(s.forecast!.date)).toBeGreaterThan(D_DAY);
  });

  it('without any case base forecasts the rhythm date, and never a past one', () => {
    // Our definition (DOMAIN.md §7b): no fleet record → ratio 1; a rhythm date already past → the day after D
    expect(computeUnitStats(unit, [topUp(-250), topUp(-100)], D).forecast).toMatchObject({
      basis: 'rhythm',
      date: day(50),
      withinDays: 50,
    });
    expect(computeUnitStats(unit, [topUp(-300), topUp(-200)], D).forecast).toMatchObject({
      basis: 'rhythm',
      date: day(1),
      earliest: null,
      latest: null,
    });
  });

  it('measures itself on the fleet it learned from, by situation', () => {
    const acc = caseBase.accuracy!;
    expect(acc.k).toBe(100);
    expect(acc.cases).toBeGreaterThan(500);
    expect(acc.coveragePct).toBeGreaterThan(60);
    expect(acc.bySituation.map((s) => s.situation)).toContain('three_or_more');
  });
});
