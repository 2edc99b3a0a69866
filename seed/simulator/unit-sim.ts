// One unit's life, simulated: a hidden leak process (which the registry never sees) and the visits technicians
// record because of it — PTIs, leak checks, top-ups, repairs that hold or not, recoveries and recharges, and
// pressure readings that follow the refrigerant's saturation curve as the charge drops.
import {
  KG_PER_LB,
  KPA_PER_BAR,
  KPA_PER_PSI,
  absoluteToGaugeKPa,
  co2eTonnes,
  containerCheckDigit,
  leakCheckIntervalMonths,
  saturationPressureKPa,
  type LeakCheckMethodId,
  type LeakLocationId,
  type RefrigerantCode,
  type RepairActionId,
} from '../../shared/domain';
import {
  COMPONENTS,
  LEAK_LOCATION_WEIGHTS,
  METHOD_SENSITIVITY,
  MODELS,
  OTHER_ACTION_TEXT,
  OTHER_LOCATION_TEXT,
  REPAIRS,
  inventedPurchaseCost,
  refrigerantMix,
  type SiteSpec,
} from './catalogue';
import { createRng, streamSeed, type Rng } from './prng';

export const DAY_MS = 86_400_000;
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

const clamp = (x: number, lo: number, hi: number) => (x < lo ? lo : x > hi ? hi : x);
const roundTo = (x: number, step: number) => Math.round(x / step) * step;
const r3 = (x: number) => Math.round(x * 1000) / 1000;
const r1 = (x: number) => Math.round(x * 10) / 10;
export const isoDay = (day: number) => new Date(day * DAY_MS).toISOString().slice(0, 10);

export function containerNumberFor(seed: number, index: number): string {
  // Serials in blocks of three per unit index, so that numbers are unique without looking consecutive.
  const serial = 104_000 + index * 3 + (streamSeed(seed, 'serial', index) % 3);
  const first10 = `${OWNER_CODE}U${String(serial).padStart(6, '0')}`;
  return `${first10}${containerCheckDigit(first10)}`;
}

function tokenFrom(rng: Rng): string {
  return Buffer.from(rng.bytes(32)).toString('base64url');
}

const SET_POINTS: (readonly [number, number])[] = [
  [-25, 20],
  [-18, 22],
  [-20, 5],
  [-1, 10],
  [2, 14],
  [4, 10],
  [6, 5],
  [13, 9],
];

const CLASS_HAZARD: Record<LeakClass, number> = { tight: 0.03, slow: 0.14, chronic: 0.7 };
const CLASS_RATE_MEDIAN: Record<LeakClass, number> = { tight: 0.1, slow: 0.15, chronic: 0.5 };

type Leak = { location: LeakLocationId; rate: number; onDay: number; fixed: boolean; otherText?: string };

export function simulateUnit(fleet: FleetContext, index: number, profile: Profile = {}): UnitSim {
  const rng = createRng(streamSeed(fleet.seed, 'unit', index));
  const p = profile;
  const ageYears = p.ageYears ?? rng.uniform(0.2, 15);
  const commissionDay = fleet.todayDay - Math.round(ageYears * 365.25);
  const refrigerant = p.refrigerant ?? rng.weighted(refrigerantMix(ageYears));
  const model = rng.pick(MODELS.filter((m) => m.refrigerants.includes(refrigerant)));
  const full = p.chargeKg ?? r3(roundTo(refrigerant === 'R-744' ? rng.uniform(4, 4.8) : rng.uniform(4, 6), 0.05));
  const historyDays = Math.round((p.historyYears ?? fleet.historyYears) * 365.25);
  const recordStartDay = Math.max(commissionDay, fleet.todayDay - historyDays);
  const newInRecord = commissionDay >= fleet.todayDay - historyDays;
  const buildYear = new Date(commissionDay * DAY_MS).getUTCFullYear() - (rng.chance(0.3) ? 1 : 0);

  const pChronic = 0.04 + 0.006 * ageYears;
  const pSlow = 0.16 + 0.008 * ageYears;
  const x = rng.next();
  const cls: LeakClass = p.leakClass ?? (x < pChronic ? 'chronic' : x < pChronic + pSlow ? 'slow' : 'tight');

  const homeSite = p.homeSite ?? rng.weighted(fleet.depots.map((s, k) => [s, 1 / Math.sqrt(k + 1)] as const));
  const tripMeanDays = p.daily ? 1 : clamp(rng.normal(96, 13), 60, 140);
  // Hidden per-unit constants: when the sight glass shows bubbles, when the unit can no longer hold its set point,
  // its condensing approach and evaporator temperature difference at full charge, and its slow permeation.
  const sightGlassAt = rng.uniform(0.08, 0.15);
  const alarmAt = rng.uniform(0.28, 0.4);
  const approach0 = rng.uniform(8, 13);
  const evapDelta0 = rng.uniform(5.5, 8);
  const permeation = (full * rng.uniform(0.002, 0.01)) / 365;
  const hazard = p.hazardPerYear ?? CLASS_HAZARD[cls];
  const holdMultiplier = p.holdMultiplier ?? (cls === 'chronic' ? 0.7 : 1);
  const weakSpot = p.weakSpot ?? rng.weighted(LEAK_LOCATION_WEIGHTS);
  const interval = leakCheckIntervalMonths(co2eTonnes(refrigerant, full));

  const leaks: Leak[] = [];
  const makeLeak = (onDay: number, location?: LeakLocationId, ratePctPerYear?: number): Leak => {
    const loc = location ?? (cls === 'chronic' && rng.chance(0.55) ? weakSpot : rng.weighted(LEAK_LOCATION_WEIGHTS));
    const frac =
      ratePctPerYear !== undefined ? ratePctPerYear / 100 : clamp(rng.logNormal(CLASS_RATE_MEDIAN[cls], 0.55), 0.03, 2);
    return {
      location: loc,
      rate: (frac * full) / 365,
      onDay,
      fixed: false,
      otherText: loc === 'other' ? rng.pick(OTHER_LOCATION_TEXT) : undefined,
    };
  };
  if (p.initialLeaks) {
    for (const l of p.initialLeaks)
      leaks.push(makeLeak(recordStartDay - l.daysBeforeStart, l.location, l.ratePctPerYear));
  } else if (cls === 'chronic' || (cls === 'slow' && rng.chance(0.6))) {
    leaks.push(makeLeak(newInRecord ? recordStartDay + rng.int(30, 700) : recordStartDay - rng.int(0, 300)));
  }
  for (let t = recordStartDay; ;) {
    const age = (t - commissionDay) / 365.25;
    t += rng.exponential(365 / (hazard * (1 + age / 15)));
    if (t >= fleet.todayDay) break;
    leaks.push(makeLeak(Math.floor(t)));
  }

  const rateAt = (day: number) => {
    let r = permeation;
    for (const l of leaks) if (!l.fixed && l.onDay <= day) r += l.rate;
    return r;
  };
  const breakpoints = (from: number, to: number) => {
    const pts = [from];
    for (const l of leaks) if (!l.fixed && l.onDay > from && l.onDay < to) pts.push(l.onDay);
    pts.sort((a, b) => a - b);
    pts.push(to);
    return pts;
  };
  const maxDeficit = 0.9 * full;
  let deficit = newInRecord ? 0 : full * rng.uniform(0, 0.5) * sightGlassAt;
  const lostBetween = (from: number, to: number) => {
    const pts = breakpoints(from, to);
    let kg = 0;
    for (let i = 0; i + 1 < pts.length; i++) kg += rateAt(pts[i]) * (pts[i + 1] - pts[i]);
    return kg;
  };
  /** First day on which the deficit reaches `target`, before `to`; null if it does not. */
  const dayDeficitReaches = (target: number, from: number, to: number): number | null => {
    if (deficit >= target) return from;
    const pts = breakpoints(from, to);
    let d = deficit;
    for (let i = 0; i + 1 < pts.length; i++) {
      const r = rateAt(pts[i]);
      const len = pts[i + 1] - pts[i];
      if (d + r * len >= target) return pts[i] + Math.ceil((target - d) / r);
      d += r * len;
    }
    return null;
  };

  const visits: SimVisit[] = [];
  const voids: SimVoid[] = [];
  const truth: SimTruth = { leakClass: cls, story: p.story ?? null, leaks: [], repairs: [] };
  const madeUpDays: number[] = [];
  let lastLeakCheckDay = newInRecord ? recordStartDay : recordStartDay - rng.int(0, 330);
  let lastEngineerNoteDay = -1e9;
  let status: SimUnit['status'] = 'in_service';
  let updatedMs = 0;
  const pending: { day: number; kind: VisitKind }[] = [];
  let forcedRepairDone = false;

  const techAt = (site: number) => rng.pick(fleet.techniciansBySite[site]);
  const timeOfDay = (day: number) => day * DAY_MS + rng.int(6 * 60, 19 * 60) * 60_000 + rng.int(0, 59) * 1000;
  const enteredAfter = (ms: number) => {
    const x = rng.next();
    // Mostly entered on the spot; some queued offline and replayed hours or days later.
    const delay =
      x < 0.9 ? rng.uniform(2, 90) * 60_000 : x < 0.98 ? rng.uniform(2, 20) * 3_600_000 : rng.uniform(1, 4) * DAY_MS;
    return Math.min(Math.round(ms + delay), fleet.nowMs - 60_000);
  };
  const ambientAt = (site: number, ms: number) => {
    const c = fleet.sites[site].climate;
    const dayOfYear = (ms / DAY_MS) % 365.25;
    const seasonal = Math.cos((2 * Math.PI * (dayOfYear - (c.southern ? 17 : 200))) / 365.25);
    const hour = (ms % DAY_MS) / 3_600_000;
    const daily = -2.5 * Math.cos((2 * Math.PI * (hour - 3)) / 24);
    return r1(clamp(c.meanC + c.swingC * seasonal + daily + rng.normal(0, 2.5), -15, 45));
  };
  const cylinder = (site: number, day: number) =>
    `HX-${fleet.sites[site].code}-${(REFRIGERANT_INDEX[refrigerant] + 1) * 1000 + (Math.floor(day / 45) % 1000)}`;
  const recoveryCylinder = (site: number, day: number) => `HX-${fleet.sites[site].code}-R${Math.floor(day / 90) % 100}`;

  const massEntry = (kg: number): { kg: number; details?: Record<string, unknown> } => {
    if (rng.chance(0.1)) {
      const lb = r1(kg / KG_PER_LB);
      return { kg: r3(lb * KG_PER_LB), details: { enteredAs: { value: lb, unit: 'lb' } } };
    }
    return { kg: Math.round(kg * 100) / 100 };
  };

  /** A gauge reading: condensing at ambient + approach (shrinking with lost charge), evaporating below set point. */
  const reading = (site: number, ms: number, setPointC: number): SimEvent => {
    const frac = deficit / full;
    const ambientC = ambientAt(site, ms);
    const approach = Math.max(1.5, approach0 - 20 * frac + rng.normal(0, 0.6));
    const condensingC = clamp(ambientC + approach, -40, 58);
    const dischargeAbs =
      refrigerant === 'R-744' && condensingC >= 29.5
        ? // Above the critical point a CO2 unit runs transcritical: a gas-cooler pressure, not a saturation one.
          clamp(7800 + (condensingC - 30) * 230 - frac * 1500 + rng.normal(0, 80), 7450, 12500)
        : saturationPressureKPa(refrigerant, condensingC, 'dew');
    const evaporatingC = clamp(setPointC - (evapDelta0 + 14 * frac + rng.normal(0, 0.6)), -49, 5);
    const suctionAbs = saturationPressureKPa(refrigerant, evaporatingC, 'dew');
    let suctionKPaG = absoluteToGaugeKPa(suctionAbs);
    let dischargeKPaG = absoluteToGaugeKPa(dischargeAbs);
    let details: Record<string, unknown> | undefined;
    const unitPick = rng.next();
    if (unitPick < 0.15) {
      // Read on a psi gauge to the nearest psi.
      suctionKPaG = Math.round(Math.round(suctionKPaG / KPA_PER_PSI) * KPA_PER_PSI * 100) / 100;
      dischargeKPaG = Math.round(Math.round(dischargeKPaG / KPA_PER_PSI) * KPA_PER_PSI * 100) / 100;
      details = { enteredAs: { pressureUnit: 'psi', temperatureUnit: 'C' } };
    } else if (unitPick < 0.45) {
      suctionKPaG = r1(suctionKPaG / KPA_PER_BAR) * KPA_PER_BAR;
      dischargeKPaG = r1(dischargeKPaG / KPA_PER_BAR) * KPA_PER_BAR;
      details = { enteredAs: { pressureUnit: 'bar', temperatureUnit: 'C' } };
    } else {
      suctionKPaG = Math.round(suctionKPaG);
      dischargeKPaG = Math.round(dischargeKPaG);
    }
    const sightGlass = rng.chance(0.07)
      ? 'not_checked'
      : frac < sightGlassAt
        ? 'full'
        : frac < 0.45
          ? 'bubbles'
          : 'empty';
    const supplyAirC = r1(setPointC + Math.max(0, frac - 0.22) * 25 + rng.normal(0.3, 0.3));
    return {
      kind: 'pressure',
      suctionKPaG,
      dischargeKPaG,
      ambientC,
      setPointC,
      supplyAirC,
      returnAirC: r1(supplyAirC + rng.uniform(2, 4)),
      sightGlass,
      details,
    };
  };

  const detect = (day: number, method: LeakCheckMethodId): Leak[] => {
    const found: Leak[] = [];
    for (const l of leaks) {
      if (l.fixed || l.onDay > day) continue;
      const ratePerYear = (l.rate * 365) / full;
      if (rng.chance(METHOD_SENSITIVITY[method] * Math.min(1, 0.5 + ratePerYear))) found.push(l);
    }
    return found;
  };
  const leakCheckEvents = (method: LeakCheckMethodId, found: Leak[]): SimEvent[] => {
    if (found.length === 0) return [{ kind: 'leak_check', method, leakFound: false }];
    const seen = new Set<LeakLocationId>();
    const out: SimEvent[] = [];
    for (const l of found) {
      if (seen.has(l.location)) continue;
      seen.add(l.location);
      out.push({
        kind: 'leak_check',
        method,
        leakFound: true,
        location: l.location,
        details: l.location === 'other' ? { locationOther: l.otherText } : undefined,
      });
    }
    return out;
  };
  const routineMethod = (): LeakCheckMethodId =>
    rng.weighted([
      ['electronic_detector', 62],
      ['bubble_solution', 22],
      ['uv_dye', 16],
    ] as const);

  const topUp = (site: number, day: number, events: SimEvent[], ms: number, by: number) => {
    const after = full * rng.uniform(0, 0.025);
    const amount = deficit - after;
    if (amount < 0.05) return false;
    const m = massEntry(amount);
    const e: SimEvent = {
      kind: 'top_up',
      kg: m.kg,
      cylinder: cylinder(site, day),
      reusedRecovered: false,
      details: m.details,
    };
    events.push(e);
    deficit = Math.max(0, deficit - m.kg);
    madeUpDays.push(day);
    if (rng.chance(0.006) && m.kg * 10 <= 2 * full) {
      // A slip of the decimal point, voided by its author and entered again.
      const wrong = Math.round(m.kg * 1000) / 100;
      e.kg = wrong;
      const correct = m.kg;
      const voidMs = enteredAfter(ms) + rng.int(10, 120) * 60_000;
      pendingCorrections.push({ target: e, site, by, voidMs, occurredMs: ms, correct, cylinder: e.cylinder!, wrong });
    }
    return true;
  };
  const pendingCorrections: {
    target: SimEvent;
    site: number;
    by: number;
    voidMs: number;
    occurredMs: number;
    correct: number;
    cylinder: string;
    wrong: number;
  }[] = [];

  const chooseRepair = (l: Leak) => {
    const options = REPAIRS[l.location];
    const forced = p.repairAction ? options.find((o) => o.action === p.repairAction) : undefined;
    return forced ?? rng.weighted(options.map((o) => [o, o.weight] as const));
  };
  /** Applies the repair's outcome to the hidden leak: fixed for good, or leaking again some weeks later. */
  const settle = (
    l: Leak,
    day: number,
    holds: number,
    action: RepairActionId,
    verified: boolean,
    also: Leak[] = [],
  ) => {
    const held = p.repairOutcome ? p.repairOutcome === 'hold' : rng.chance(holds * holdMultiplier);
    const reopenDay = day + 7 + Math.round(p.reopen?.afterDays ?? rng.exponential(75));
    for (const leak of [l, ...also]) {
      if (held) leak.fixed = true;
      else {
        leak.onDay = reopenDay;
        leak.rate *= p.reopen?.rateFactor ?? rng.uniform(0.6, 1.2);
      }
    }
    truth.repairs.push({ day, location: l.location, action, held, verified });
  };

  /** Repair of the found leaks at a depot or workshop; opens the circuit (recover, repair, test, recharge) if needed. */
  const repairVisit = (site: number, day: number, found: Leak[], events: SimEvent[], ms: number, by: number) => {
    // One repair per location, however many of the hidden leaks sit there.
    const plans: { leak: Leak; plan: ReturnType<typeof chooseRepair>; also: Leak[] }[] = [];
    for (const l of found) {
      const same = plans.find((x) => x.leak.location === l.location);
      if (same) same.also.push(l);
      else plans.push({ leak: l, plan: chooseRepair(l), also: [] });
    }
    const opens = plans.some((x) => x.plan.opensCircuit);
    if (opens) {
      const recovered = Math.max(0, r3(full - deficit - rng.uniform(0, 0.04)));
      if (recovered > 0) events.push({ kind: 'recovery', kg: recovered, cylinder: recoveryCylinder(site, day) });
      const tested = p.verified ?? rng.chance(0.85);
      for (const { leak, plan, also } of plans) {
        events.push(repairEvent(leak, plan.action, tested));
        settle(leak, day, plan.holds, plan.action, tested, also);
      }
      if (tested)
        events.push({
          kind: 'leak_check',
          method: rng.chance(0.8) ? 'nitrogen_pressure_test' : 'vacuum_test',
          leakFound: false,
        });
      const reused = rng.chance(0.3);
      events.push({
        kind: 'recharge',
        kg: full,
        cylinder: cylinder(site, day),
        reusedRecovered: reused,
        excludedFromLeakRate: false,
      });
      madeUpDays.push(day);
      deficit = 0;
      events.push(reading(site, ms, pickSetPoint()));
    } else {
      const checked = p.verified ?? rng.chance(0.6);
      for (const { leak, plan, also } of plans) {
        events.push(repairEvent(leak, plan.action, checked));
        settle(leak, day, plan.holds, plan.action, checked, also);
      }
      if (checked) events.push({ kind: 'leak_check', method: 'electronic_detector', leakFound: false });
      topUp(site, day, events, ms, by);
      if (rng.chance(0.7)) events.push(reading(site, ms, pickSetPoint()));
    }
    if (rng.chance(0.6)) pending.push({ day: day + rng.int(18, 34), kind: 'recheck' });
  };
  const repairEvent = (l: Leak, action: RepairActionId, verified: boolean): SimEvent => ({
    kind: 'repair',
    location: l.location,
    action,
    verified,
    details:
      l.location === 'other' || action === 'other'
        ? {
            locationOther: l.location === 'other' ? l.otherText : undefined,
            actionOther: action === 'other' ? rng.pick(OTHER_ACTION_TEXT) : undefined,
          }
        : undefined,
  });
  const pickSetPoint = () => rng.weighted(SET_POINTS);
  const repairChance = (day: number) => p.repairChance?.(day) ?? (cls === 'chronic' ? 0.55 : 0.75);

  const push = (kind: VisitKind, site: number | null, ms: number, by: number, events: SimEvent[]) => {
    if (events.length === 0) return;
    visits.push({ kind, occurredMs: ms, enteredMs: enteredAfter(ms), site, by, events });
  };

  // Commissioning inside the record: the first fill is not made-up refrigerant (40 CFR 82.157(b)).
  if (newInRecord) {
    const site = fleet.workshops.length ? rng.pick(fleet.workshops) : homeSite;
    const ms = timeOfDay(recordStartDay);
    const by = techAt(site);
    push('commissioning', site, ms, by, [
      {
        kind: 'recharge',
        kg: full,
        cylinder: cylinder(site, recordStartDay),
        excludedFromLeakRate: true,
        reusedRecovered: false,
        note: 'First fill at commissioning.',
      },
      reading(site, ms, pickSetPoint()),
      { kind: 'pti', passed: true },
    ]);
  }

  let day = recordStartDay;
  let nextScheduled =
    day +
    (newInRecord
      ? Math.round(clamp(rng.normal(tripMeanDays, tripMeanDays * 0.3), 1, 200))
      : rng.int(1, Math.round(tripMeanDays)));
  let guard = 0;
  while (status !== 'retired' && guard++ < 20_000) {
    let target = nextScheduled;
    let kind: VisitKind = 'scheduled';
    pending.sort((a, b) => a.day - b.day);
    if (pending.length && pending[0].day < target) {
      target = pending[0].day;
      kind = pending[0].kind;
    }
    const alarmDay = dayDeficitReaches(alarmAt * full, day, target);
    if (alarmDay !== null) {
      const d = alarmDay + rng.int(0, 3);
      if (d < target) {
        target = d;
        kind = 'alarm';
      }
    }
    if (target >= fleet.todayDay) break;
    deficit = Math.min(maxDeficit, deficit + lostBetween(day, target));
    day = target;
    if (kind === 'scheduled')
      nextScheduled =
        day + Math.max(1, Math.round(p.daily ? 1 : clamp(rng.normal(tripMeanDays, tripMeanDays * 0.3), 20, 200)));
    else if (kind !== 'alarm') pending.shift();
    const madeUpBefore = madeUpDays.length;

    if (kind === 'alarm') {
      // At sea or at the terminal: the unit cannot hold its set point. Top up; repairs wait for a depot.
      const site =
        rng.chance(0.6) && fleet.vessels.length
          ? rng.pick(fleet.vessels)
          : rng.pick(fleet.terminals.length ? fleet.terminals : fleet.depots);
      const ms = timeOfDay(day);
      const by = techAt(site);
      const events: SimEvent[] = [];
      const setPoint = pickSetPoint();
      if (rng.chance(0.75)) events.push(reading(site, ms, setPoint));
      let found: Leak[] = [];
      if (rng.chance(0.55)) {
        found = detect(day, 'electronic_detector');
        events.push(...leakCheckEvents('electronic_detector', found));
      }
      const quick = found.find(
        (l) =>
          !REPAIRS[l.location].some((o) => o.opensCircuit) &&
          rng.chance(p.repairChance ? p.repairChance(day) * 0.3 : 0.3),
      );
      if (quick) {
        const plan = chooseRepair(quick);
        events.push(repairEvent(quick, plan.action, false));
        settle(quick, day, plan.holds, plan.action, false);
      }
      topUp(site, day, events, ms, by);
      if (rng.chance(0.5))
        events.push({
          kind: 'note',
          note: `Alarm: box at ${r1(setPoint + rng.uniform(4, 9))} °C against a set point of ${setPoint} °C; could not pull down.`,
        });
      if (rng.chance(0.4)) events.push(reading(site, ms + 1, setPoint));
      push('alarm', site, ms, by, events);
    } else if (kind === 'recheck') {
      // Re-check within a month of a repair (Reg. (EU) 2024/573).
      const site = homeSite;
      const ms = timeOfDay(day);
      const by = techAt(site);
      const method = routineMethod();
      const found = detect(day, method);
      lastLeakCheckDay = day;
      const events = leakCheckEvents(method, found);
      if (rng.chance(0.5)) events.unshift(reading(site, ms, pickSetPoint()));
      push('recheck', site, ms, by, events);
    } else if (kind === 'follow_up') {
      const site = homeSite;
      const ms = timeOfDay(day);
      push('follow_up', site, ms, techAt(site), [
        { kind: 'component_replacement', details: { component: rng.pick(COMPONENTS) } },
        { kind: 'pti', passed: true },
      ]);
    } else {
      // A scheduled call at a depot (mostly the home depot) before the unit is released again: the PTI.
      const x = rng.next();
      const forced = p.forceRepairFrom !== undefined && !forcedRepairDone && day >= p.forceRepairFrom;
      const site =
        p.daily || forced || x < 0.7
          ? homeSite
          : x < 0.85 || !fleet.terminals.length
            ? rng.pick(fleet.depots)
            : rng.pick(fleet.terminals);
      const kindOfSite = fleet.sites[site].kind;
      const ms = timeOfDay(day);
      const by = techAt(site);
      const events: SimEvent[] = [];
      const setPoint = pickSetPoint();
      const frac = deficit / full;
      const low = frac >= sightGlassAt;
      const due = interval !== null && day - lastLeakCheckDay >= interval * 30.4 - 45 && rng.chance(0.92);
      const doCheck = low || due || forced || p.alwaysLeakCheck !== undefined;
      let found: Leak[] = [];
      if (p.daily) {
        events.push(reading(site, ms, setPoint));
      } else if (rng.chance(0.88)) events.push(reading(site, ms, setPoint));
      if (doCheck) {
        const method = forced ? 'uv_dye' : (p.alwaysLeakCheck ?? routineMethod());
        found = forced ? leaks.filter((l) => !l.fixed && l.onDay <= day) : detect(day, method);
        lastLeakCheckDay = day;
        events.push(...leakCheckEvents(method, found));
      }
      const canRepairHere = kindOfSite === 'depot' || kindOfSite === 'workshop';
      const wantsRepair =
        found.length > 0 && canRepairHere && (forced || rng.chance(low ? repairChance(day) : repairChance(day) * 0.7));
      if (forced && wantsRepair) forcedRepairDone = true;
      if (wantsRepair) {
        // A reading taken before the circuit is opened would fall into the new baseline: keep only the one after.
        for (let i = events.length - 1; i >= 0; i--) if (events[i].kind === 'pressure') events.splice(i, 1);
        repairVisit(site, day, found, events, ms, by);
      } else if (low) {
        topUp(site, day, events, ms, by);
        if (rng.chance(0.5)) events.push(reading(site, ms + 1, setPoint));
      }
      if (!p.daily || rng.chance(0.04)) {
        const y = rng.next();
        if (y < 0.015) {
          const component = rng.pick(COMPONENTS);
          events.push({ kind: 'pti', passed: false, note: `${component} fault; unit held until the part arrives.` });
          pending.push({ day: day + rng.int(1, 5), kind: 'follow_up' });
        } else {
          if (y < 0.045) events.push({ kind: 'component_replacement', details: { component: rng.pick(COMPONENTS) } });
          events.push({ kind: 'pti', passed: true });
        }
      }
      // An old unit that keeps leaking is retired at a depot call now and then.
      const age = (day - commissionDay) / 365.25;
      const recent = madeUpDays.filter((d) => d > day - 365).length;
      if (!p.noRetire && !p.story && cls === 'chronic' && age >= 13 && recent >= 3 && rng.chance(0.25)) {
        events.push({
          kind: 'status_change',
          details: { status: 'retired' },
          note: 'Retired: machinery beyond economic repair.',
        });
        status = 'retired';
        updatedMs = ms;
      }
      push('scheduled', site, ms, by, events);
      if (p.daily && rng.chance(0.45)) {
        const later = ms + rng.int(3, 6) * 3_600_000;
        push('scheduled', site, later, by, [reading(site, later, setPoint)]);
      }
    }

    // The fleet engineer notices a third top-up in twelve months.
    if (madeUpDays.length > madeUpBefore && fleet.engineers.length) {
      const recent = madeUpDays.filter((d) => d > day - 365).length;
      if (recent >= 3 && day - lastEngineerNoteDay > 180 && rng.chance(0.4)) {
        lastEngineerNoteDay = day;
        const noteDay = day + rng.int(1, 3);
        if (noteDay < fleet.todayDay) {
          const ms = noteDay * DAY_MS + rng.int(8 * 60, 16 * 60) * 60_000;
          push('engineer_note', null, ms, rng.pick(fleet.engineers), [
            {
              kind: 'note',
              note: `Top-up number ${recent} in twelve months. Review at the next depot call: repair properly or keep topping up?`,
            },
          ]);
        }
      }
    }
  }

  for (const c of pendingCorrections) {
    voids.push({
      target: c.target,
      site: c.site,
      atMs: Math.min(c.voidMs, fleet.nowMs - 30_000),
      by: c.by,
      reason: `Typed ${c.wrong} kg instead of ${c.correct} kg.`,
    });
    visits.push({
      kind: 'correction',
      occurredMs: c.occurredMs,
      enteredMs: Math.min(c.voidMs + 60_000, fleet.nowMs - 20_000),
      site: c.site,
      by: c.by,
      events: [
        {
          kind: 'top_up',
          kg: c.correct,
          cylinder: c.cylinder,
          reusedRecovered: false,
          note: 'Entered again with the right amount.',
        },
      ],
    });
  }
  visits.sort((a, b) => a.occurredMs - b.occurredMs || a.enteredMs - b.enteredMs);

  for (const l of leaks)
    truth.leaks.push({
      location: l.location,
      ratePctPerYear: r1((l.rate * 365 * 100) / full),
      onDay: l.onDay,
      fixed: l.fixed,
    });

  const createdMs = newInRecord ? recordStartDay * DAY_MS : (recordStartDay - rng.int(1, 30)) * DAY_MS;
  const unit: SimUnit = {
    containerNumber: containerNumberFor(fleet.seed, index),
    refrigerant,
    nominalChargeKg: full,
    commissionedOn: rng.chance(0.03) ? null : isoDay(commissionDay),
    homeSite,
    status,
    qrToken: tokenFrom(rng),
    machinerySerial: `${model.serialPrefix}${String(buildYear % 100).padStart(2, '0')}-${String(rng.int(0, 99_999)).padStart(5, '0')}`,
    model: model.model,
    manufactureYear: buildYear,
    purchaseCost: inventedPurchaseCost(buildYear, rng.next()),
    residualValue: ageYears > 10 ? Math.round(rng.uniform(2400, 3600) / 50) * 50 : null,
    createdMs,
    updatedMs: Math.max(createdMs, updatedMs),
  };
  return { index, unit, visits, voids, truth };
}

const REFRIGERANT_INDEX: Record<RefrigerantCode, number> = {
  'R-134a': 0,
  'R-404A': 1,
  'R-452A': 2,
  'R-513A': 3,
  'R-1234yf': 4,
  'R-744': 5,
};
