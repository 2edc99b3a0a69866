// The hidden leak process of one unit, which the registry never sees: leaks that start at random (more often as the
// unit ages, far more often for a chronic leaker), each losing a share of the charge a year, plus slow permeation;
// the refrigerant missing from the full charge; what a leak check finds; and what a repair does to the leaks.
import type { LeakCheckMethodId, LeakLocationId } from '../../shared/domain';
import { LEAK_LOCATION_WEIGHTS, METHOD_SENSITIVITY, OTHER_LOCATION_TEXT } from './catalogue';
import { clamp, r1 } from './numbers';
import type { Rng } from './prng';
import type { LeakClass, Profile, SimTruth } from './unit-sim';

export type Leak = { location: LeakLocationId; rate: number; onDay: number; fixed: boolean; otherText?: string };

export type LeakSpec = {
  fullKg: number;
  leakClass: LeakClass;
  /** Where a chronic leaker's leaks mostly come back. */
  weakSpot: LeakLocationId;
  permeationKgPerDay: number;
  /** New leaks a year at age 0, growing with age. */
  hazardPerYear: number;
  commissionDay: number;
  /** The first day of the record (the later of commissioning and the start of the history). */
  recordStartDay: number;
  todayDay: number;
  newInRecord: boolean;
  /** Share of the charge missing when the sight glass shows bubbles; a unit older than the record starts short of it. */
  sightGlassAt: number;
  initialLeaks?: Profile['initialLeaks'];
  /** Multiplies each repair's chance to hold. */
  holdMultiplier: number;
  repairOutcome?: Profile['repairOutcome'];
  reopen?: Profile['reopen'];
};

const CLASS_RATE_MEDIAN: Record<LeakClass, number> = { tight: 0.1, slow: 0.15, chronic: 0.5 };

export class LeakProcess {
  readonly leaks: Leak[] = [];
  /** Refrigerant missing from the full charge, kg. */
  deficitKg: number;
  private readonly maxDeficitKg: number;

  constructor(
    private readonly rng: Rng,
    private readonly spec: LeakSpec,
  ) {
    const { leakClass: cls, recordStartDay, newInRecord } = spec;
    if (spec.initialLeaks) {
      for (const l of spec.initialLeaks)
        this.leaks.push(this.makeLeak(recordStartDay - l.daysBeforeStart, l.location, l.ratePctPerYear));
    } else if (cls === 'chronic' || (cls === 'slow' && rng.chance(0.6))) {
      this.leaks.push(
        this.makeLeak(newInRecord ? recordStartDay + rng.int(30, 700) : recordStartDay - rng.int(0, 300)),
      );
    }
    for (let t = recordStartDay; ;) {
      const age = (t - spec.commissionDay) / 365.25;
      t += rng.exponential(365 / (spec.hazardPerYear * (1 + age / 15)));
      if (t >= spec.todayDay) break;
      this.leaks.push(this.makeLeak(Math.floor(t)));
    }
    this.maxDeficitKg = 0.9 * spec.fullKg;
    this.deficitKg = newInRecord ? 0 : spec.fullKg * rng.uniform(0, 0.5) * spec.sightGlassAt;
  }

  private makeLeak(onDay: number, location?: LeakLocationId, ratePctPerYear?: number): Leak {
    const { rng, spec } = this;
    const loc =
      location ??
      (spec.leakClass === 'chronic' && rng.chance(0.55) ? spec.weakSpot : rng.weighted(LEAK_LOCATION_WEIGHTS));
    const frac =
      ratePctPerYear !== undefined
        ? ratePctPerYear / 100
        : clamp(rng.logNormal(CLASS_RATE_MEDIAN[spec.leakClass], 0.55), 0.03, 2);
    return {
      location: loc,
      rate: (frac * spec.fullKg) / 365,
      onDay,
      fixed: false,
      otherText: loc === 'other' ? rng.pick(OTHER_LOCATION_TEXT) : undefined,
    };
  }

  /** Loss in kg a day on `day`: permeation plus every open leak that has started. */
  rateAt(day: number): number {
    let r = this.spec.permeationKgPerDay;
    for (const l of this.leaks) if (!l.fixed && l.onDay <= day) r += l.rate;
    return r;
  }

  /** `from`, the days between on which a leak starts, and `to`: the loss rate is constant between two of them. */
  private breakpoints(from: number, to: number): number[] {
    const pts = [from];
    for (const l of this.leaks) if (!l.fixed && l.onDay > from && l.onDay < to) pts.push(l.onDay);
    pts.sort((a, b) => a - b);
    pts.push(to);
    return pts;
  }

  lostBetween(from: number, to: number): number {
    const pts = this.breakpoints(from, to);
    let kg = 0;
    for (let i = 0; i + 1 < pts.length; i++) kg += this.rateAt(pts[i]) * (pts[i + 1] - pts[i]);
    return kg;
  }

  /** First day on which the deficit reaches `target`, before `to`; null if it does not. */
  dayDeficitReaches(target: number, from: number, to: number): number | null {
    if (this.deficitKg >= target) return from;
    const pts = this.breakpoints(from, to);
    let d = this.deficitKg;
    for (let i = 0; i + 1 < pts.length; i++) {
      const r = this.rateAt(pts[i]);
      const len = pts[i + 1] - pts[i];
      if (d + r * len >= target) return pts[i] + Math.ceil((target - d) / r);
      d += r * len;
    }
    return null;
  }

  /** Loses what leaks out from `from` to `to`; a unit never loses more than 90 % of its charge (it stops first). */
  advance(from: number, to: number): void {
    this.deficitKg = Math.min(this.maxDeficitKg, this.deficitKg + this.lostBetween(from, to));
  }

  /** The open leaks that have started by `day`. */
  active(day: number): Leak[] {
    return this.leaks.filter((l) => !l.fixed && l.onDay <= day);
  }

  /** The open leaks a check with `method` finds on `day`: the bigger the leak, the likelier. */
  detect(day: number, method: LeakCheckMethodId): Leak[] {
    const found: Leak[] = [];
    for (const l of this.leaks) {
      if (l.fixed || l.onDay > day) continue;
      const ratePerYear = (l.rate * 365) / this.spec.fullKg;
      if (this.rng.chance(METHOD_SENSITIVITY[method] * Math.min(1, 0.5 + ratePerYear))) found.push(l);
    }
    return found;
  }

  /**
   * A repair of `leaks` (one location) on `day` with the chance `holds` of holding: they are fixed for good, or
   * leak again some weeks later. Returns whether it held.
   */
  repair(leaks: Leak[], day: number, holds: number): boolean {
    const { rng, spec } = this;
    const held = spec.repairOutcome ? spec.repairOutcome === 'hold' : rng.chance(holds * spec.holdMultiplier);
    const reopenDay = day + 7 + Math.round(spec.reopen?.afterDays ?? rng.exponential(75));
    for (const leak of leaks) {
      if (held) leak.fixed = true;
      else {
        leak.onDay = reopenDay;
        leak.rate *= spec.reopen?.rateFactor ?? rng.uniform(0.6, 1.2);
      }
    }
    return held;
  }

  /** Refrigerant added: a top-up of `kg`, or a recharge to full (no `kg`). */
  madeUp(kg?: number): void {
    this.deficitKg = kg === undefined ? 0 : Math.max(0, this.deficitKg - kg);
  }

  truth(): SimTruth['leaks'] {
    return this.leaks.map((l) => ({
      location: l.location,
      ratePctPerYear: r1((l.rate * 365 * 100) / this.spec.fullKg),
      onDay: l.onDay,
      fixed: l.fixed,
    }));
  }
}
