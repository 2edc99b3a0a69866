import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { createFleet, STORY_UNITS, unitCount } from '../../seed/simulator/fleet';
import { siteRows, userRows, type UnitRows } from '../../seed/simulator/rows';
import { columnsOf, tuple } from '../../seed/simulator/sql';
import type { UnitSim } from '../../seed/simulator/unit-sim';
import { fleetRows } from '../../seed/simulator/writer';
import { events, sites, units, unitStats, unitStatsDetail, users, visits } from '../../server/db/schema';
import {
  parseContainerNumber,
  saturationRange,
  saturationTemperatureC,
  STANDARD_ATMOSPHERE_KPA,
} from '../../shared/domain';
import { DEFAULT_SETTINGS } from '../../shared/schemas/settings';

const NOW = new Date('2026-06-15T10:00:00Z');
const COLS = {
  sites: columnsOf(sites),
  users: columnsOf(users),
  units: columnsOf(units),
  visits: columnsOf(visits),
  events: columnsOf(events),
  stats: columnsOf(unitStats),
  statsDetail: columnsOf(unitStatsDetail),
};

function generate(seed: number, n: number, now = NOW): { sims: UnitSim[]; rows: UnitRows[]; hash: string } {
  const fleet = createFleet({ seed, units: n, now });
  const h = createHash('sha256');
  const siteList = siteRows(fleet, 1);
  for (const s of siteList) h.update(tuple(COLS.sites, s));
  for (const u of userRows(fleet, 'hash')) h.update(tuple(COLS.users, u));
  const sims: UnitSim[] = [];
  const rows: UnitRows[] = [];
  const ids = { unit: 1, visit: 1, event: 1 };
  for (const { sim, rows: r } of fleetRows(
    fleet,
    siteList.map((s) => s.id!),
    ids,
    DEFAULT_SETTINGS,
  )) {
    // The SQL text that would be inserted, row by row: identical text means identical data.
    h.update(tuple(COLS.units, r.unit));
    for (const v of r.visits) h.update(tuple(COLS.visits, v));
    for (const e of r.events) h.update(tuple(COLS.events, e));
    h.update(tuple(COLS.stats, r.stats as unknown as Record<string, unknown>));
    h.update(tuple(COLS.statsDetail, r.statsDetail as unknown as Record<string, unknown>));
    sims.push(sim);
    rows.push(r);
  }
  expect(rows).toHaveLength(unitCount(fleet));
  return { sims, rows, hash: h.digest('hex') };
}

describe('demo fleet simulator', () => {
  const a = generate(6346, 40);

  it('produces identical rows from the same seed and date', () => {
    expect(generate(6346, 40).hash).toBe(a.hash);
  });

  it('produces a different fleet from another seed', () => {
    expect(generate(6347, 40).hash).not.toBe(a.hash);
  });

  it('gives every unit a valid, unique HRLU container number with its ISO 6346 check digit', () => {
    const numbers = a.rows.map((r) => r.unit.containerNumber);
    expect(new Set(numbers).size).toBe(numbers.length);
    for (const n of numbers) {
      expect(n).toMatch(/^HRLU\d{7}$/);
      expect(parseContainerNumber(n)).toEqual({ ok: true, value: n });
    }
  });

  it('writes pressure readings that follow the saturation curve: condensing above ambient, evaporating below set point', () => {
    const byUnit = new Map(a.rows.map((r) => [r.unit.id, r.unit.refrigerant]));
    let checked = 0;
    const approach: Record<string, number[]> = { full: [], bubbles: [] };
    for (const r of a.rows) {
      for (const e of r.events) {
        if (e.kind !== 'pressure') continue;
        const refrigerant = byUnit.get(e.unitId)!;
        const top = saturationRange(refrigerant).maxKPaAbs;
        const dischargeAbs = e.dischargeKPaG! + STANDARD_ATMOSPHERE_KPA;
        const suctionAbs = e.suctionKPaG! + STANDARD_ATMOSPHERE_KPA;
        expect(suctionAbs).toBeLessThan(dischargeAbs);
        // Evaporating: 5–25 K below the set point (DOMAIN.md §8 reads the dew point on both sides).
        const evaporatingC = saturationTemperatureC(refrigerant, suctionAbs, 'dew');
        expect(e.setPointC! - evaporatingC).toBeGreaterThan(3);
        expect(e.setPointC! - evaporatingC).toBeLessThan(25);
        if (dischargeAbs > top) {
          // Only a CO2 unit runs above its critical point (transcritical on a warm day).
          expect(refrigerant).toBe('R-744');
          continue;
        }
        const condensingC = saturationTemperatureC(refrigerant, dischargeAbs, 'dew');
        const a_ = condensingC - e.ambientC!;
        // Condensing approach at full charge 8–13 K, shrinking as charge is lost; the gauge rounds to 1 psi.
        expect(a_).toBeGreaterThan(-1);
        expect(a_).toBeLessThan(16);
        if (e.sightGlass === 'full' || e.sightGlass === 'bubbles') approach[e.sightGlass].push(a_);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(500);
    const mean = (xs: number[]) => xs.reduce((s, x) => s + x, 0) / xs.length;
    expect(approach.bubbles.length).toBeGreaterThan(5);
    // Low charge (bubbles in the sight glass) shows as a smaller approach.
    expect(mean(approach.bubbles)).toBeLessThan(mean(approach.full) - 2);
  });

  it('records every event with its visit, site, technician and an entry time shortly after it happened', () => {
    for (const r of a.rows) {
      const visitIds = new Set(r.visits.map((v) => v.id));
      for (const e of r.events) {
        expect(e.siteId).toEqual(expect.any(Number));
        expect(e.recordedBy).toEqual(expect.any(String));
        expect(e.enteredAt!.getTime()).toBeGreaterThanOrEqual(e.occurredAt!.getTime());
        expect(e.enteredAt!.getTime()).toBeLessThan(NOW.getTime());
        if (e.kind === 'void') expect(e.voidsEventId).toEqual(expect.any(Number));
        else expect(visitIds.has(e.visitId!)).toBe(true);
      }
    }
  });

  it('mixes refrigerants and leak behaviour, with most units tight', () => {
    const b = generate(6346, 400);
    const share = (f: (s: UnitSim) => boolean) => b.sims.filter(f).length / b.sims.length;
    expect(share((s) => s.unit.refrigerant === 'R-134a')).toBeGreaterThan(0.55);
    expect(share((s) => s.unit.refrigerant === 'R-404A')).toBeGreaterThan(0.05);
    expect(share((s) => s.truth.leakClass === 'tight')).toBeGreaterThan(0.6);
    expect(share((s) => s.truth.leakClass === 'chronic')).toBeGreaterThan(0.03);
    for (const s of b.sims) {
      expect(s.unit.nominalChargeKg).toBeGreaterThanOrEqual(4);
      expect(s.unit.nominalChargeKg).toBeLessThanOrEqual(6);
    }
  });

  it('tells its stories: a chronic leaker, a repair that held, one that did not, a unit due for a decision', () => {
    for (const now of [NOW, new Date('2027-02-03T08:00:00Z')]) {
      const { rows, sims } = generate(6346, 8, now);
      const stats = (story: string) => rows[STORY_UNITS.find((s) => s.story === story)!.index].stats;
      expect(stats('chronic_leaker').scoreBand).toBe('chronic');
      expect(stats('repair_held')).toMatchObject({ scoreBand: 'tight', forecastDate: null });
      const failed = sims[STORY_UNITS.find((s) => s.story === 'repair_failed')!.index];
      expect(failed.truth.repairs.map((r) => r.held)).toEqual([false]);
      expect(stats('repair_failed').score).toBeGreaterThanOrEqual(30);
      expect(stats('decision_due')).toMatchObject({ scoreBand: 'chronic' });
      expect(stats('decision_due').forecastDate).not.toBeNull();
    }
  });

  it('can add a busy unit with exactly the asked-for number of events', () => {
    const fleet = createFleet({ units: 2, now: NOW, busyUnitEvents: 5000 });
    const ids = { unit: 1, visit: 1, event: 1 };
    const list = [
      ...fleetRows(
        fleet,
        fleet.sites.map((_, i) => i + 1),
        ids,
        DEFAULT_SETTINGS,
      ),
    ];
    expect(list).toHaveLength(3);
    expect(list[2].rows.events).toHaveLength(5000);
  });
});
