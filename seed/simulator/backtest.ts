// Forecast accuracy on simulated fleets, where the true leak processes are known (DOMAIN.md §7b "Measure it"): a case
// base learned from a training fleet, then at many cut-off days of a test fleet simulated from another seed, the
// learned forecast, the unit's rhythm (§7a) and the naive "the last interval repeats" against the next top-up the
// simulation actually recorded.
import {
  appendCases,
  createCaseTable,
  learnCaseBase,
  forecastCases,
  forecastState,
  learnedForecast,
  naiveForecastDay,
  unitForecastTimeline,
  FORECAST_SITUATIONS,
  type ForecastCase,
  type ForecastCaseBase,
  type CaseTable,
  type ForecastSituation,
  type ForecastTimeline,
} from '../../shared/domain';
import type { Settings } from '../../shared/schemas/settings';
import { engineUnit } from '../../server/lib/record/stats';
import { simulateFleetUnit, type Fleet } from './fleet';
import { rowsForUnit } from './rows';

export const SITUATION_TITLES: Record<ForecastSituation, string> = {
  first_top_up: 'first top-up on record, nothing to compare',
  after_repair: 'first top-up after a verified repair',
  one_interval: 'one interval',
  two_intervals: 'two intervals',
  three_or_more: 'three or more intervals',
  unverified_repair: 'an unverified repair since the last top-up',
};

/** One simulated unit as the forecast reads it, with the days its top-ups actually came. */
export type SimulatedRecord = {
  index: number;
  timeline: ForecastTimeline;
  additionDays: number[];
  firstDay: number;
  todayDay: number;
};

/** The records of units [from, to) of a fleet (units without any top-up are skipped: they give no case). */
export function* simulatedRecords(
  fleet: Fleet,
  settings: Settings,
  range: { from?: number; to: number },
): Generator<SimulatedRecord> {
  const siteIds = fleet.sites.map((_, i) => i + 1);
  const asOf = new Date(fleet.ctx.nowMs).toISOString();
  for (let i = range.from ?? 0; i < range.to; i++) {
    const sim = simulateFleetUnit(fleet, i);
    if (!sim.truth.leaks.length) continue;
    const rows = rowsForUnit(fleet, sim, siteIds, { unit: 1, visit: 1, event: 1 }, settings);
    const additionDays = rows.visitStats.filter((v) => v.madeUpKg > 0).map((v) => v.day);
    if (!additionDays.length || !rows.engineEvents.length) continue;
    const unit = engineUnit({
      refrigerant: sim.unit.refrigerant,
      nominalChargeKg: sim.unit.nominalChargeKg,
      commissionedOn: sim.unit.commissionedOn,
      createdAt: new Date(sim.unit.createdMs),
    });
    const timeline = unitForecastTimeline(unit, rows.engineEvents, asOf, settings);
    yield { index: i, timeline, additionDays, firstDay: rows.visitStats[0].day, todayDay: fleet.ctx.todayDay };
  }
}

/** Cut-offs for the case base: every `stepDays` over the whole record, from a per-unit phase. */
export function casesOfRecord(r: SimulatedRecord, stepDays: number): ForecastCase[] {
  const phase = (r.index * 7919) % stepDays;
  return forecastCases(r.timeline, { fromDay: r.firstDay + phase, toDay: r.todayDay, stepDays, unitKey: r.index });
}

/** Every cut-off of a simulated fleet's units [0, units), as the case-base job collects them from the database. */
export function simulatedCaseTable(fleet: Fleet, settings: Settings, units: number, stepDays = 30): CaseTable {
  const table = createCaseTable();
  for (const r of simulatedRecords(fleet, settings, { to: units })) appendCases(table, casesOfRecord(r, stepDays));
  return table;
}

/** The case base learned (and measured on itself, as the job does) from a simulated fleet's units [0, units). */
export function simulatedCaseBase(
  fleet: Fleet,
  settings: Settings,
  units: number,
  stepDays = 30,
): { caseBase: ForecastCaseBase; cases: number } {
  const table = simulatedCaseTable(fleet, settings, units, stepDays);
  const caseBase = learnCaseBase(table, {
    builtAt: new Date(fleet.ctx.nowMs).toISOString(),
    k: settings.forecast.neighbours,
  });
  let cases = 0;
  for (let i = 0; i < table.n; i++) if (!Number.isNaN(table.days[i])) cases++;
  return { caseBase, cases };
}

type Tally = {
  n: number;
  fAbs: number;
  fSigned: number;
  covered: number;
  pinball: number;
  rAbs: number;
  rRanged: number;
  rCovered: number;
  rPinball: number;
  rBefore: number;
  nAbs: number;
  nCount: number;
  fBefore: number;
  closer: number;
};
const tally = (): Tally => ({
  n: 0,
  fAbs: 0,
  fSigned: 0,
  covered: 0,
  pinball: 0,
  rAbs: 0,
  rRanged: 0,
  rCovered: 0,
  rPinball: 0,
  rBefore: 0,
  nAbs: 0,
  nCount: 0,
  fBefore: 0,
  closer: 0,
});

/** Pinball (quantile) loss of quantile τ at q for outcome y. */
const pinball = (y: number, q: number, tau: number) => (y >= q ? tau * (y - q) : (1 - tau) * (q - y));

export type BacktestRow = {
  situation: ForecastSituation | 'all';
  title: string;
  cases: number;
  forecastMaeDays: number;
  forecastBiasDays: number;
  rhythmMaeDays: number;
  /** null where no case has two top-ups before it (the naive forecast needs them). */
  naiveMaeDays: number | null;
  /** Share of cases whose 80 % range held the next top-up. */
  coverage80: number;
  pinball1090Days: number;
  /** The rhythm's own range (fastest–slowest interval), where it has one. */
  rhythmRangeShare: number;
  rhythmCoverage: number | null;
  rhythmPinball1090Days: number | null;
  /** Share of rhythm dates already before the cut-off when shown. */
  rhythmBeforeCutoff: number;
  /** Learned forecast dates before the cut-off (must be 0). */
  forecastBeforeCutoff: number;
  forecastCloserShare: number;
};

export type BacktestResult = {
  trainSeed: number;
  testSeed: number;
  trainUnits: number;
  testUnits: number;
  /** Units of the test fleet with at least one top-up that were looked at. */
  unitsWithTopUps: number;
  /** Training cut-offs with a known next top-up (the case base before sampling). */
  caseBaseCases: number;
  k: number;
  stepDays: number;
  /** Test cut-offs with a rhythm, two top-ups before (so the naive forecast exists) and a later top-up on record. */
  cases: number;
  all: BacktestRow;
  bySituation: BacktestRow[];
  /** Cut-offs with only one top-up before them: no naive forecast, so outside the comparison; shown apart. */
  withoutNaive: BacktestRow;
  /** What the training fleet's own measurement (the job's) said. */
  selfMeasured: ForecastCaseBase['accuracy'];
  caseBaseMs: number;
  testMs: number;
};

function row(situation: BacktestRow['situation'], title: string, t: Tally): BacktestRow {
  const r1 = (x: number) => Math.round(x * 10) / 10;
  const r3 = (x: number) => Math.round(x * 1000) / 1000;
  const n = Math.max(1, t.n);
  return {
    situation,
    title,
    cases: t.n,
    forecastMaeDays: r1(t.fAbs / n),
    forecastBiasDays: r1(t.fSigned / n),
    rhythmMaeDays: r1(t.rAbs / n),
    naiveMaeDays: t.nCount ? r1(t.nAbs / t.nCount) : null,
    coverage80: r3(t.covered / n),
    pinball1090Days: r1(t.pinball / n),
    rhythmRangeShare: r3(t.rRanged / n),
    rhythmCoverage: t.rRanged ? r3(t.rCovered / t.rRanged) : null,
    rhythmPinball1090Days: t.rRanged ? r1(t.rPinball / t.rRanged) : null,
    rhythmBeforeCutoff: r3(t.rBefore / n),
    forecastBeforeCutoff: t.fBefore,
    forecastCloserShare: r3(t.closer / n),
  };
}

/**
 * Trains on `trainUnits` units of `train`, tests on `testUnits` units of `test` (a fleet from another seed). Test
 * cut-offs are the end of every `stepDays`-th day from 180 days into each record.
 */
export function backtestForecast(opts: {
  train: Fleet;
  test: Fleet;
  trainUnits: number;
  testUnits: number;
  settings: Settings;
  stepDays?: number;
  caseBase?: ForecastCaseBase;
}): BacktestResult {
  const stepDays = opts.stepDays ?? 30;
  const k = opts.settings.forecast.neighbours;
  const t0 = performance.now();
  const built = opts.caseBase
    ? {
        caseBase: opts.caseBase,
        cases: Object.values(opts.caseBase.situations).reduce((s, c) => s + (c?.total ?? 0), 0),
      }
    : simulatedCaseBase(opts.train, opts.settings, opts.trainUnits, stepDays);
  const t1 = performance.now();
  const all = tally();
  const by = new Map<ForecastSituation, Tally>(FORECAST_SITUATIONS.map((s) => [s, tally()]));
  const withoutNaive = tally();
  let units = 0;
  for (const r of simulatedRecords(opts.test, opts.settings, { to: opts.testUnits })) {
    units++;
    const days = r.additionDays;
    let a = 0; // days[0..a) are on or before the cut-off
    for (let cut = r.firstDay + 180; cut < r.todayDay; cut += stepDays) {
      while (a < days.length && days[a] <= cut) a++;
      if (a >= days.length || a < 1) continue;
      const actual = days[a];
      const { state, rhythm } = forecastState(r.timeline, cut);
      if (!state || !rhythm) continue;
      const f = learnedForecast(state, built.caseBase, k);
      const y = actual - cut;
      const mid = f.withinDays;
      const lo = f.earliestDays ?? mid;
      const hi = f.latestDays ?? mid;
      const rhythmDay = Math.round(Date.parse(`${rhythm.date}T00:00:00Z`) / 86_400_000);
      const naive = naiveForecastDay(days.slice(0, a));
      const targets = naive === null ? [withoutNaive] : [all, by.get(state.situation)!];
      for (const t of targets) {
        t.n++;
        t.fAbs += Math.abs(mid - y);
        t.fSigned += mid - y;
        if (y >= lo && y <= hi) t.covered++;
        t.pinball += (pinball(y, lo, 0.1) + pinball(y, hi, 0.9)) / 2;
        if (mid < 1) t.fBefore++;
        t.rAbs += Math.abs(rhythmDay - actual);
        if (rhythmDay < cut) t.rBefore++;
        if (rhythm.earliest && rhythm.latest) {
          const rl = Math.round(Date.parse(`${rhythm.earliest}T00:00:00Z`) / 86_400_000);
          const rh = Math.round(Date.parse(`${rhythm.latest}T00:00:00Z`) / 86_400_000);
          t.rRanged++;
          if (actual >= rl && actual <= rh) t.rCovered++;
          t.rPinball += (pinball(actual, rl, 0.1) + pinball(actual, rh, 0.9)) / 2;
        }
        if (naive !== null) {
          const ne = Math.abs(naive - actual);
          t.nAbs += ne;
          t.nCount++;
          const fe = Math.abs(mid - y);
          t.closer += fe < ne ? 1 : fe === ne ? 0.5 : 0;
        }
      }
    }
  }
  const t2 = performance.now();
  const bySituation = FORECAST_SITUATIONS.filter((s) => by.get(s)!.n > 0).map((s) =>
    row(s, SITUATION_TITLES[s], by.get(s)!),
  );
  return {
    trainSeed: opts.train.ctx.seed,
    testSeed: opts.test.ctx.seed,
    trainUnits: opts.trainUnits,
    testUnits: opts.testUnits,
    unitsWithTopUps: units,
    caseBaseCases: built.cases,
    k,
    stepDays,
    cases: all.n,
    all: row('all', 'all cases', all),
    bySituation,
    withoutNaive: row('all', 'one top-up before the cut-off (no naive forecast)', withoutNaive),
    selfMeasured: built.caseBase.accuracy,
    caseBaseMs: Math.round(t1 - t0),
    testMs: Math.round(t2 - t1),
  };
}
