// One unit's simulation under way: what the visits share (the fleet, the unit's traits, its leak process, its random
// stream) and what they write into (visits, voids, the hidden truth, calls still to come), with the bookkeeping every
// visit needs: who works where, at what time of day, when it is entered, and which cylinder it is charged from.
import type { RefrigerantCode } from '../../shared/domain';
import type { LeakProcess } from './leak-process';
import { DAY_MS } from './numbers';
import type { Rng } from './prng';
import type { UnitTraits } from './unit-traits';
import type { FleetContext, Profile, SimEvent, SimTruth, SimUnit, SimVisit, SimVoid, VisitKind } from './unit-sim';

/** A top-up entered with a slip of the decimal point, to be voided by its author and entered again. */
export type PendingCorrection = {
  target: SimEvent;
  site: number;
  by: number;
  voidMs: number;
  occurredMs: number;
  correct: number;
  cylinder: string;
  wrong: number;
};

export type UnitRun = {
  fleet: FleetContext;
  p: Profile;
  rng: Rng;
  traits: UnitTraits;
  leak: LeakProcess;
  visits: SimVisit[];
  voids: SimVoid[];
  truth: SimTruth;
  /** Days on which refrigerant was made up (top-ups and recharges). */
  madeUpDays: number[];
  /** Calls that follow from an earlier one: re-checks after repairs, follow-ups after a failed PTI. */
  pending: { day: number; kind: VisitKind }[];
  corrections: PendingCorrection[];
  lastLeakCheckDay: number;
  lastEngineerNoteDay: number;
  forcedRepairDone: boolean;
  status: SimUnit['status'];
  updatedMs: number;
};

export const techAt = (run: UnitRun, site: number) => run.rng.pick(run.fleet.techniciansBySite[site]);

export const timeOfDay = (run: UnitRun, day: number) =>
  day * DAY_MS + run.rng.int(6 * 60, 19 * 60) * 60_000 + run.rng.int(0, 59) * 1000;

export function enteredAfter(run: UnitRun, ms: number): number {
  const { rng } = run;
  const x = rng.next();
  // Mostly entered on the spot; some queued offline and replayed hours or days later.
  const delay =
    x < 0.9 ? rng.uniform(2, 90) * 60_000 : x < 0.98 ? rng.uniform(2, 20) * 3_600_000 : rng.uniform(1, 4) * DAY_MS;
  return Math.min(Math.round(ms + delay), run.fleet.nowMs - 60_000);
}

/** Records a visit with its entries (none: nothing was recorded). */
export function recordVisit(
  run: UnitRun,
  kind: VisitKind,
  site: number | null,
  ms: number,
  by: number,
  events: SimEvent[],
): void {
  if (events.length === 0) return;
  run.visits.push({ kind, occurredMs: ms, enteredMs: enteredAfter(run, ms), site, by, events });
}

const REFRIGERANT_INDEX: Record<RefrigerantCode, number> = {
  'R-134a': 0,
  'R-404A': 1,
  'R-452A': 2,
  'R-513A': 3,
  'R-1234yf': 4,
  'R-744': 5,
};

/** The site's cylinder of the unit's refrigerant in use on `day` (a new one every 45 days). */
export const cylinder = (run: UnitRun, site: number, day: number) =>
  `HX-${run.fleet.sites[site].code}-${(REFRIGERANT_INDEX[run.traits.refrigerant] + 1) * 1000 + (Math.floor(day / 45) % 1000)}`;

/** The site's recovery cylinder in use on `day` (a new one every 90 days). */
export const recoveryCylinder = (run: UnitRun, site: number, day: number) =>
  `HX-${run.fleet.sites[site].code}-R${Math.floor(day / 90) % 100}`;
