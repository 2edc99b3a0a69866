// One unit's life, simulated: a hidden leak process (which the registry never sees) and the visits technicians
// record because of it — PTIs, leak checks, top-ups, repairs that hold or not, recoveries and recharges, and
// pressure readings that follow the refrigerant's saturation curve as the charge drops. The parts: the unit's traits
// (unit-traits.ts), its leak process (leak-process.ts), the calls at the unit (visits.ts, repairs.ts, entries.ts,
// gauge.ts) and the run they share (unit-run.ts); here the schedule that decides which call comes next.
import {
  containerCheckDigit,
  type LeakCheckMethodId,
  type LeakLocationId,
  type RefrigerantCode,
  type RepairActionId,
} from '../../shared/domain';
import type { SiteSpec } from './catalogue';
import { LeakProcess } from './leak-process';
import { clamp } from './numbers';
import { createRng, streamSeed } from './prng';
import type { UnitRun } from './unit-run';
import { drawTraits, unitRow } from './unit-traits';
import {
  alarmVisit,
  commissioningVisit,
  engineerNote,
  enterCorrections,
  followUpVisit,
  recheckVisit,
  scheduledVisit,
} from './visits';

export const OWNER_CODE = 'HRL';

export type EventKind =
  | 'pti'
  | 'leak_check'
  | 'repair'
  | 'component_replacement'
  | 'status_change'
  | 'note'
  | 'top_up'
  | 'recovery'
  | 'recharge'
  | 'pressure';

/** One recorded entry, with the columns of the events table it fills. */
export type SimEvent = {
  kind: EventKind;
  kg?: number;
  cylinder?: string;
  reusedRecovered?: boolean;
  excludedFromLeakRate?: boolean;
  method?: LeakCheckMethodId;
  leakFound?: boolean;
  location?: LeakLocationId;
  action?: RepairActionId;
  verified?: boolean;
  passed?: boolean;
  suctionKPaG?: number;
  dischargeKPaG?: number;
  ambientC?: number;
  setPointC?: number;
  supplyAirC?: number;
  returnAirC?: number;
  sightGlass?: 'full' | 'bubbles' | 'empty' | 'not_checked';
  details?: Record<string, unknown>;
  note?: string;
};

export type VisitKind =
  'commissioning' | 'scheduled' | 'alarm' | 'recheck' | 'follow_up' | 'engineer_note' | 'correction';

/** One submission: everything done at the unit in one go (shares one occurred and one entered time). */
export type SimVisit = {
  kind: VisitKind;
  occurredMs: number;
  enteredMs: number;
  /** Index into the fleet's sites; null for an engineer's note from the office. */
  site: number | null;
  /** Index into the fleet's people. */
  by: number;
  events: SimEvent[];
};

/** A correction: the target entry is voided by its author shortly after it was entered. */
export type SimVoid = { target: SimEvent; site: number | null; atMs: number; by: number; reason: string };

export type LeakClass = 'tight' | 'slow' | 'chronic';

export type SimUnit = {
  containerNumber: string;
  refrigerant: RefrigerantCode;
  nominalChargeKg: number;
  commissionedOn: string | null;
  homeSite: number;
  status: 'in_service' | 'out_of_service' | 'retired';
  qrToken: string;
  machinerySerial: string;
  model: string;
  manufactureYear: number;
  purchaseCost: number;
  residualValue: number | null;
  createdMs: number;
  updatedMs: number;
};

/** The hidden truth, for the forecast backtest and for choosing the demo's stories. */
export type SimTruth = {
  leakClass: LeakClass;
  story: StoryId | null;
  leaks: { location: LeakLocationId; ratePctPerYear: number; onDay: number; fixed: boolean }[];
  repairs: { day: number; location: LeakLocationId; action: RepairActionId; held: boolean; verified: boolean }[];
};

export type UnitSim = { index: number; unit: SimUnit; visits: SimVisit[]; voids: SimVoid[]; truth: SimTruth };

export type StoryId = 'chronic_leaker' | 'repair_held' | 'repair_failed' | 'decision_due' | 'busy_unit';

/** Overrides that make a unit tell a particular story (or carry a very long history for the benchmark). */
export type Profile = {
  story?: StoryId;
  ageYears?: number;
  refrigerant?: RefrigerantCode;
  chargeKg?: number;
  leakClass?: LeakClass;
  historyYears?: number;
  homeSite?: number;
  initialLeaks?: { location: LeakLocationId; ratePctPerYear: number; daysBeforeStart: number }[];
  hazardPerYear?: number;
  holdMultiplier?: number;
  weakSpot?: LeakLocationId;
  /** Chance that a found leak is repaired on this day (depot or workshop). */
  repairChance?: (day: number) => number;
  /** Outcome of every repair; by default drawn from the location's hold probability. */
  repairOutcome?: 'hold' | 'fail';
  /** A failed repair leaks again after about this many days, at this share of the old rate. */
  reopen?: { afterDays: number; rateFactor: number };
  /** Always leak check with this method at scheduled visits. */
  alwaysLeakCheck?: LeakCheckMethodId;
  repairAction?: RepairActionId;
  /** From this day on, the next depot call finds the active leaks for certain and repairs them (once). */
  forceRepairFrom?: number;
  /** Whether repairs are pressure-tested (verified); by default most are. */
  verified?: boolean;
  /** Daily readings (a unit on a test stand): visit every day, often twice. */
  daily?: boolean;
  noRetire?: boolean;
};

export type FleetContext = {
  seed: number;
  nowMs: number;
  /** UTC day number of "today"; every visit is before it. */
  todayDay: number;
  historyYears: number;
  sites: SiteSpec[];
  depots: number[];
  terminals: number[];
  vessels: number[];
  workshops: number[];
  /** Person indices of the technicians at each site (by site index). */
  techniciansBySite: number[][];
  engineers: number[];
};

export function containerNumberFor(seed: number, index: number): string {
  // Serials in blocks of three per unit index, so that numbers are unique without looking consecutive.
  const serial = 104_000 + index * 3 + (streamSeed(seed, 'serial', index) % 3);
  const first10 = `${OWNER_CODE}U${String(serial).padStart(6, '0')}`;
  return `${first10}${containerCheckDigit(first10)}`;
}

export function simulateUnit(fleet: FleetContext, index: number, profile: Profile = {}): UnitSim {
  const rng = createRng(streamSeed(fleet.seed, 'unit', index));
  const p = profile;
  const traits = drawTraits(fleet, p, rng);
  const leak = new LeakProcess(rng, {
    fullKg: traits.full,
    leakClass: traits.leakClass,
    weakSpot: traits.weakSpot,
    permeationKgPerDay: traits.permeationKgPerDay,
    hazardPerYear: traits.hazardPerYear,
    commissionDay: traits.commissionDay,
    recordStartDay: traits.recordStartDay,
    todayDay: fleet.todayDay,
    newInRecord: traits.newInRecord,
    sightGlassAt: traits.sightGlassAt,
    initialLeaks: p.initialLeaks,
    holdMultiplier: traits.holdMultiplier,
    repairOutcome: p.repairOutcome,
    reopen: p.reopen,
  });
  const run: UnitRun = {
    fleet,
    p,
    rng,
    traits,
    leak,
    visits: [],
    voids: [],
    truth: { leakClass: traits.leakClass, story: p.story ?? null, leaks: [], repairs: [] },
    madeUpDays: [],
    pending: [],
    corrections: [],
    lastLeakCheckDay: traits.newInRecord ? traits.recordStartDay : traits.recordStartDay - rng.int(0, 330),
    lastEngineerNoteDay: -1e9,
    forcedRepairDone: false,
    status: 'in_service',
    updatedMs: 0,
  };

  if (traits.newInRecord) commissioningVisit(run);
  liveThroughTheRecord(run);
  enterCorrections(run);
  run.visits.sort((a, b) => a.occurredMs - b.occurredMs || a.enteredMs - b.enteredMs);
  run.truth.leaks.push(...leak.truth());

  const unit = unitRow(traits, rng, {
    containerNumber: containerNumberFor(fleet.seed, index),
    status: run.status,
    updatedMs: run.updatedMs,
  });
  return { index, unit, visits: run.visits, voids: run.voids, truth: run.truth };
}

/**
 * Call after call until today or retirement: the next scheduled trip, unless a pending re-check or follow-up comes
 * first, or the charge runs so low on the way that the unit raises an alarm.
 */
function liveThroughTheRecord(run: UnitRun): void {
  const { rng, fleet, p, leak } = run;
  const { tripMeanDays, alarmAt, full } = run.traits;
  let day = run.traits.recordStartDay;
  let nextScheduled =
    day +
    (run.traits.newInRecord
      ? Math.round(clamp(rng.normal(tripMeanDays, tripMeanDays * 0.3), 1, 200))
      : rng.int(1, Math.round(tripMeanDays)));
  let guard = 0;
  while (run.status !== 'retired' && guard++ < 20_000) {
    let target = nextScheduled;
    let kind: VisitKind = 'scheduled';
    run.pending.sort((a, b) => a.day - b.day);
    if (run.pending.length && run.pending[0].day < target) {
      target = run.pending[0].day;
      kind = run.pending[0].kind;
    }
    const alarmDay = leak.dayDeficitReaches(alarmAt * full, day, target);
    if (alarmDay !== null) {
      const d = alarmDay + rng.int(0, 3);
      if (d < target) {
        target = d;
        kind = 'alarm';
      }
    }
    if (target >= fleet.todayDay) break;
    leak.advance(day, target);
    day = target;
    if (kind === 'scheduled')
      nextScheduled =
        day + Math.max(1, Math.round(p.daily ? 1 : clamp(rng.normal(tripMeanDays, tripMeanDays * 0.3), 20, 200)));
    else if (kind !== 'alarm') run.pending.shift();
    const madeUpBefore = run.madeUpDays.length;

    if (kind === 'alarm') alarmVisit(run, day);
    else if (kind === 'recheck') recheckVisit(run, day);
    else if (kind === 'follow_up') followUpVisit(run, day);
    else scheduledVisit(run, day);

    if (run.madeUpDays.length > madeUpBefore && fleet.engineers.length) engineerNote(run, day);
  }
}
