// The calls at the unit, one function each: commissioning, an alarm at sea or at a terminal, a re-check after a
// repair, a follow-up after a failed PTI, the scheduled depot call with its PTI, the fleet engineer's note, and the
// corrections of mistyped top-ups.
import { COMPONENTS, REPAIRS } from './catalogue';
import { leakCheckEvents, pickSetPoint, repairEvent, routineMethod, topUp } from './entries';
import { gaugeReading } from './gauge';
import type { Leak } from './leak-process';
import { DAY_MS, r1 } from './numbers';
import { chooseRepair, repairVisit, settleRepair } from './repairs';
import { cylinder, recordVisit, techAt, timeOfDay, type UnitRun } from './unit-run';
import type { SimEvent } from './unit-sim';

/** Commissioning inside the record: the first fill is not made-up refrigerant (40 CFR 82.157(b)). */
export function commissioningVisit(run: UnitRun): void {
  const { rng, fleet } = run;
  const { recordStartDay, homeSite, full } = run.traits;
  const site = fleet.workshops.length ? rng.pick(fleet.workshops) : homeSite;
  const ms = timeOfDay(run, recordStartDay);
  const by = techAt(run, site);
  recordVisit(run, 'commissioning', site, ms, by, [
    {
      kind: 'recharge',
      kg: full,
      cylinder: cylinder(run, site, recordStartDay),
      excludedFromLeakRate: true,
      reusedRecovered: false,
      note: 'First fill at commissioning.',
    },
    gaugeReading(run, site, ms, pickSetPoint(rng)),
    { kind: 'pti', passed: true },
  ]);
}

/** At sea or at the terminal: the unit cannot hold its set point. Top up; repairs wait for a depot. */
export function alarmVisit(run: UnitRun, day: number): void {
  const { rng, fleet, p } = run;
  const site =
    rng.chance(0.6) && fleet.vessels.length
      ? rng.pick(fleet.vessels)
      : rng.pick(fleet.terminals.length ? fleet.terminals : fleet.depots);
  const ms = timeOfDay(run, day);
  const by = techAt(run, site);
  const events: SimEvent[] = [];
  const setPoint = pickSetPoint(rng);
  if (rng.chance(0.75)) events.push(gaugeReading(run, site, ms, setPoint));
  let found: Leak[] = [];
  if (rng.chance(0.55)) {
    found = run.leak.detect(day, 'electronic_detector');
    events.push(...leakCheckEvents('electronic_detector', found));
  }
  const quick = found.find(
    (l) =>
      !REPAIRS[l.location].some((o) => o.opensCircuit) && rng.chance(p.repairChance ? p.repairChance(day) * 0.3 : 0.3),
  );
  if (quick) {
    const plan = chooseRepair(run, quick);
    events.push(repairEvent(rng, quick, plan.action, false));
    settleRepair(run, quick, day, plan.holds, plan.action, false);
  }
  topUp(run, site, day, events, ms, by);
  if (rng.chance(0.5))
    events.push({
      kind: 'note',
      note: `Alarm: box at ${r1(setPoint + rng.uniform(4, 9))} °C against a set point of ${setPoint} °C; could not pull down.`,
    });
  if (rng.chance(0.4)) events.push(gaugeReading(run, site, ms + 1, setPoint));
  recordVisit(run, 'alarm', site, ms, by, events);
}

/** Re-check within a month of a repair (Reg. (EU) 2024/573). */
export function recheckVisit(run: UnitRun, day: number): void {
  const { rng } = run;
  const site = run.traits.homeSite;
  const ms = timeOfDay(run, day);
  const by = techAt(run, site);
  const method = routineMethod(rng);
  const found = run.leak.detect(day, method);
  run.lastLeakCheckDay = day;
  const events = leakCheckEvents(method, found);
  if (rng.chance(0.5)) events.unshift(gaugeReading(run, site, ms, pickSetPoint(rng)));
  recordVisit(run, 'recheck', site, ms, by, events);
}

export function followUpVisit(run: UnitRun, day: number): void {
  const site = run.traits.homeSite;
  const ms = timeOfDay(run, day);
  recordVisit(run, 'follow_up', site, ms, techAt(run, site), [
    { kind: 'component_replacement', details: { component: run.rng.pick(COMPONENTS) } },
    { kind: 'pti', passed: true },
  ]);
}

/** A scheduled call at a depot (mostly the home depot) before the unit is released again: the PTI. */
export function scheduledVisit(run: UnitRun, day: number): void {
  const { rng, fleet, p } = run;
  const { homeSite } = run.traits;
  const x = rng.next();
  const forced = p.forceRepairFrom !== undefined && !run.forcedRepairDone && day >= p.forceRepairFrom;
  const site =
    p.daily || forced || x < 0.7
      ? homeSite
      : x < 0.85 || !fleet.terminals.length
        ? rng.pick(fleet.depots)
        : rng.pick(fleet.terminals);
  const ms = timeOfDay(run, day);
  const by = techAt(run, site);
  const events: SimEvent[] = [];
  const setPoint = pickSetPoint(rng);
  const call = { site, day, ms, by, setPoint, events };
  const low = run.leak.deficitKg / run.traits.full >= run.traits.sightGlassAt;
  const found = checkForLeaks(run, call, low, forced);
  const canRepairHere = fleet.sites[site].kind === 'depot' || fleet.sites[site].kind === 'workshop';
  const repairChance = p.repairChance?.(day) ?? (run.traits.leakClass === 'chronic' ? 0.55 : 0.75);
  const wantsRepair =
    found.length > 0 && canRepairHere && (forced || rng.chance(low ? repairChance : repairChance * 0.7));
  if (forced && wantsRepair) run.forcedRepairDone = true;
  if (wantsRepair) {
    // A reading taken before the circuit is opened would fall into the new baseline: keep only the one after.
    for (let i = events.length - 1; i >= 0; i--) if (events[i].kind === 'pressure') events.splice(i, 1);
    repairVisit(run, site, day, found, events, ms, by);
  } else if (low) {
    topUp(run, site, day, events, ms, by);
    if (rng.chance(0.5)) events.push(gaugeReading(run, site, ms + 1, setPoint));
  }
  if (!p.daily || rng.chance(0.04)) pti(run, day, events);
  maybeRetire(run, day, ms, events);
  recordVisit(run, 'scheduled', site, ms, by, events);
  if (p.daily && rng.chance(0.45)) {
    const later = ms + rng.int(3, 6) * 3_600_000;
    recordVisit(run, 'scheduled', site, later, by, [gaugeReading(run, site, later, setPoint)]);
  }
}

type Call = { site: number; day: number; ms: number; by: number; setPoint: number; events: SimEvent[] };

/** The reading, and a leak check when the unit is low, one is due or the profile asks for it; returns what it found. */
function checkForLeaks(run: UnitRun, call: Call, low: boolean, forced: boolean): Leak[] {
  const { rng, p } = run;
  const { site, day, ms, setPoint, events } = call;
  const interval = run.traits.leakCheckIntervalMonths;
  const due = interval !== null && day - run.lastLeakCheckDay >= interval * 30.4 - 45 && rng.chance(0.92);
  const doCheck = low || due || forced || p.alwaysLeakCheck !== undefined;
  if (p.daily) {
    events.push(gaugeReading(run, site, ms, setPoint));
  } else if (rng.chance(0.88)) events.push(gaugeReading(run, site, ms, setPoint));
  if (!doCheck) return [];
  const method = forced ? 'uv_dye' : (p.alwaysLeakCheck ?? routineMethod(rng));
  const found = forced ? run.leak.active(day) : run.leak.detect(day, method);
  run.lastLeakCheckDay = day;
  events.push(...leakCheckEvents(method, found));
  return found;
}

/** The PTI: mostly passed (now and then after a part is changed); a failed one brings a follow-up within days. */
function pti(run: UnitRun, day: number, events: SimEvent[]): void {
  const { rng } = run;
  const y = rng.next();
  if (y < 0.015) {
    const component = rng.pick(COMPONENTS);
    events.push({ kind: 'pti', passed: false, note: `${component} fault; unit held until the part arrives.` });
    run.pending.push({ day: day + rng.int(1, 5), kind: 'follow_up' });
  } else {
    if (y < 0.045) events.push({ kind: 'component_replacement', details: { component: rng.pick(COMPONENTS) } });
    events.push({ kind: 'pti', passed: true });
  }
}

/** An old unit that keeps leaking is retired at a depot call now and then. */
function maybeRetire(run: UnitRun, day: number, ms: number, events: SimEvent[]): void {
  const { p } = run;
  const age = (day - run.traits.commissionDay) / 365.25;
  const recent = run.madeUpDays.filter((d) => d > day - 365).length;
  if (
    !p.noRetire &&
    !p.story &&
    run.traits.leakClass === 'chronic' &&
    age >= 13 &&
    recent >= 3 &&
    run.rng.chance(0.25)
  ) {
    events.push({
      kind: 'status_change',
      details: { status: 'retired' },
      note: 'Retired: machinery beyond economic repair.',
    });
    run.status = 'retired';
    run.updatedMs = ms;
  }
}

/** The fleet engineer notices a third top-up in twelve months (after a call that made refrigerant up). */
export function engineerNote(run: UnitRun, day: number): void {
  const { rng, fleet } = run;
  const recent = run.madeUpDays.filter((d) => d > day - 365).length;
  if (recent >= 3 && day - run.lastEngineerNoteDay > 180 && rng.chance(0.4)) {
    run.lastEngineerNoteDay = day;
    const noteDay = day + rng.int(1, 3);
    if (noteDay < fleet.todayDay) {
      const ms = noteDay * DAY_MS + rng.int(8 * 60, 16 * 60) * 60_000;
      recordVisit(run, 'engineer_note', null, ms, rng.pick(fleet.engineers), [
        {
          kind: 'note',
          note: `Top-up number ${recent} in twelve months. Review at the next depot call: repair properly or keep topping up?`,
        },
      ]);
    }
  }
}

/** Each mistyped top-up: voided by its author, then entered again with the right amount. */
export function enterCorrections(run: UnitRun): void {
  const { nowMs } = run.fleet;
  for (const c of run.corrections) {
    run.voids.push({
      target: c.target,
      site: c.site,
      atMs: Math.min(c.voidMs, nowMs - 30_000),
      by: c.by,
      reason: `Typed ${c.wrong} kg instead of ${c.correct} kg.`,
    });
    run.visits.push({
      kind: 'correction',
      occurredMs: c.occurredMs,
      enteredMs: Math.min(c.voidMs + 60_000, nowMs - 20_000),
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
}
