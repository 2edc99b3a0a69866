// Forecast accuracy on the simulated fleet, where the true leak processes are known: at many cut-off days, the
// engine's next top-up forecast from the history up to the cut-off against the next top-up the simulation actually
// recorded, beside the naive forecast "the last interval between additions repeats" (DOMAIN.md §7).
import { computeUnitStats, naiveForecastDay } from '../../shared/domain';
import type { Settings } from '../../shared/schemas/settings';
import { engineUnit } from '../../server/features/history/stats.service';
import { simulateFleetUnit, type Fleet } from './fleet';
import { rowsForUnit } from './rows';
import { DAY_MS } from './unit-sim';

export type BacktestResult = {
  /** Units with at least one hidden leak that were looked at. */
  units: number;
  /** Cut-offs at which the engine gave a forecast, the naive one existed and a later top-up is on record. */
  cases: number;
  forecastMaeDays: number;
  naiveMaeDays: number;
  /** Share of cases where the engine's forecast was closer than the naive one (ties count half). */
  forecastCloserShare: number;
  forecastMedianErrorDays: number;
  naiveMedianErrorDays: number;
  stepDays: number;
  /** The same, split by what the case was like (the truth is known here). */
  breakdown: { group: string; cases: number; forecastMaeDays: number; naiveMaeDays: number; forecastBiasDays: number; naiveBiasDays: number }[];
};

const GROUPS = [
  ['basis1', 'one interval since the last verified repair (both then use that same interval)'],
  ['basis2', 'two intervals'],
  ['basis3', 'three intervals'],
  ['newLeak', 'a new hidden leak began before the next top-up (neither can know)'],
] as const;

const dayOfIso = (s: string) => Math.floor(Date.parse(s.length === 10 ? `${s}T00:00:00Z` : s) / DAY_MS);

function median(xs: number[]): number {
  if (!xs.length) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/**
 * Runs the backtest over units [from, to) of the fleet. Each cut-off is the end of a day; the history up to it is
 * what the server would have held then, and the engine is asked for its forecast as of that moment.
 */
export function backtestForecast(fleet: Fleet, settings: Settings, opts: { from?: number; to: number; stepDays?: number }): BacktestResult {
  const stepDays = opts.stepDays ?? 30;
  const errF: number[] = [];
  const errN: number[] = [];
  const groups = new Map<string, { f: number[]; n: number[] }>(GROUPS.map(([g]) => [g, { f: [], n: [] }]));
  let closer = 0;
  let units = 0;
  const siteIds = fleet.sites.map((_, i) => i + 1);
  for (let i = opts.from ?? 0; i < opts.to; i++) {
    const sim = simulateFleetUnit(fleet, i);
    if (!sim.truth.leaks.length) continue;
    units++;
    const rows = rowsForUnit(fleet, sim, siteIds, { unit: 1, visit: 1, event: 1 }, settings);
    const unit = engineUnit({
      refrigerant: sim.unit.refrigerant,
      nominalChargeKg: sim.unit.nominalChargeKg,
      commissionedOn: sim.unit.commissionedOn,
      createdAt: new Date(sim.unit.createdMs),
    });
    // The engine's own view of the full history: the visits with made-up refrigerant are the "actual" top-ups.
    const full = rows.visitStats;
    const additionDays = full.filter((v) => v.madeUpKg > 0).map((v) => dayOfIso(v.date));
    if (additionDays.length < 3) continue;
    const events = rows.engineEvents;
    const firstDay = dayOfIso(events[0].at);
    let k = 0; // events[0..k) are on or before the cut-off
    let a = 0; // additionDays[0..a) are on or before the cut-off
    for (let cut = firstDay + 180; cut < fleet.ctx.todayDay; cut += stepDays) {
      const cutEndMs = (cut + 1) * DAY_MS - 1;
      while (k < events.length && Date.parse(events[k].at) <= cutEndMs) k++;
      while (a < additionDays.length && additionDays[a] <= cut) a++;
      if (a >= additionDays.length || a < 2) continue;
      const actual = additionDays[a];
      const r = computeUnitStats(unit, events.slice(0, k), new Date(cutEndMs).toISOString(), settings);
      if (!r.forecast) continue;
      const naive = naiveForecastDay(additionDays.slice(0, a));
      if (naive === null) continue;
      const fSigned = dayOfIso(r.forecast.date) - actual;
      const nSigned = naive - actual;
      const f = Math.abs(fSigned);
      const n = Math.abs(nSigned);
      errF.push(f);
      errN.push(n);
      const lastAddition = additionDays[a - 1];
      const newLeak = sim.truth.leaks.some((l) => l.onDay > lastAddition && l.onDay < actual);
      const g = groups.get(newLeak ? 'newLeak' : `basis${Math.min(3, r.forecast.basisIntervals.length)}`)!;
      g.f.push(fSigned);
      g.n.push(nSigned);
      closer += f < n ? 1 : f === n ? 0.5 : 0;
    }
  }
  const mean = (xs: number[]) => (xs.length ? xs.reduce((s, x) => s + x, 0) / xs.length : NaN);
  const r1 = (x: number) => Math.round(x * 10) / 10;
  const breakdown = GROUPS.map(([g, label]) => {
    const { f, n } = groups.get(g)!;
    return {
      group: label,
      cases: f.length,
      forecastMaeDays: r1(mean(f.map(Math.abs))),
      naiveMaeDays: r1(mean(n.map(Math.abs))),
      forecastBiasDays: r1(mean(f)),
      naiveBiasDays: r1(mean(n)),
    };
  });
  return {
    units,
    cases: errF.length,
    forecastMaeDays: mean(errF),
    naiveMaeDays: mean(errN),
    forecastCloserShare: errF.length ? closer / errF.length : NaN,
    forecastMedianErrorDays: median(errF),
    naiveMedianErrorDays: median(errN),
    stepDays,
    breakdown,
  };
}
