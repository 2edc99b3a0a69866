// A fast backtest of the next top-up forecast (DOMAIN.md §7b "Measure it"): learned on a small simulated fleet,
// tested on another from a different seed. Bounds are loose for a few hundred units, but the rhythm alone (today's
// forecast before §7b: MAE ≈ naive, its range holding about a third of top-ups) fails them.
import { describe, expect, it } from 'vitest';
import { computeUnitStats } from '../../shared/domain';
import { DEFAULT_SETTINGS } from '../../shared/schemas/settings';
import { backtestForecast, simulatedCaseBase } from '../../seed/simulator/backtest';
import { createFleet, simulateFleetUnit } from '../../seed/simulator/fleet';
import { rowsForUnit } from '../../seed/simulator/rows';
import { engineUnit } from '../../server/lib/record/stats';

const now = new Date('2026-12-01T00:00:00Z');
const train = createFleet({ seed: 7, units: 500, now });
const test = createFleet({ seed: 11, units: 300, now });

describe('forecast backtest on simulated fleets', () => {
  const result = backtestForecast({ train, test, trainUnits: 500, testUnits: 300, settings: DEFAULT_SETTINGS });

  it('beats the naive "last interval repeats" by a wide margin on a fleet it never saw', () => {
    expect(result.cases).toBeGreaterThan(800);
    const naive = result.all.naiveMaeDays!;
    expect(result.all.forecastMaeDays).toBeLessThan(naive);
    expect(result.all.forecastMaeDays).toBeLessThan(0.75 * naive);
  });

  it('has an 80 % range that holds the next top-up about 80 % of the time, and no date before the cut-off', () => {
    expect(result.all.coverage80).toBeGreaterThanOrEqual(0.65);
    expect(result.all.coverage80).toBeLessThanOrEqual(0.95);
    expect(result.all.forecastBeforeCutoff).toBe(0);
    expect(result.withoutNaive.forecastBeforeCutoff).toBe(0);
  });

  it('measures what the unit page shows: computeUnitStats on the history up to a cut-off gives the same forecast', () => {
    const { caseBase } = simulatedCaseBase(train, DEFAULT_SETTINGS, 200);
    const siteIds = test.sites.map((_, i) => i + 1);
    let compared = 0;
    for (let i = 0; i < 40 && compared < 20; i++) {
      const sim = simulateFleetUnit(test, i);
      const rows = rowsForUnit(test, sim, siteIds, { unit: 1, visit: 1, event: 1 }, DEFAULT_SETTINGS);
      const u = engineUnit({ ...sim.unit, createdAt: new Date(sim.unit.createdMs) });
      const events = rows.engineEvents;
      const lastMs = events.length ? Date.parse(events[events.length - 1].at) : 0;
      const cutMs = lastMs - 200 * 86_400_000;
      const upTo = events.filter((e) => Date.parse(e.at) <= cutMs);
      const cut = new Date(cutMs).toISOString();
      const whole = computeUnitStats(u, events, cut, DEFAULT_SETTINGS, caseBase);
      const part = computeUnitStats(u, upTo, cut, DEFAULT_SETTINGS, caseBase);
      if (!part.forecast) continue;
      compared++;
      expect(whole.forecast).toEqual(part.forecast);
      expect(whole.rhythm).toEqual(part.rhythm);
    }
    expect(compared).toBeGreaterThan(5);
  });
});
