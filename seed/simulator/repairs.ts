// Repairs: which fix a technician chooses for a leak, what it does to the hidden leak, and a repair call at a depot
// or workshop that opens the circuit (recover, repair, pressure-test, recharge) when the fix needs it.
import type { RepairActionId } from '../../shared/domain';
import { REPAIRS } from './catalogue';
import { pickSetPoint, repairEvent, topUp } from './entries';
import { gaugeReading } from './gauge';
import type { Leak } from './leak-process';
import { r3 } from './numbers';
import { cylinder, recoveryCylinder, type UnitRun } from './unit-run';
import type { SimEvent } from './unit-sim';

export function chooseRepair(run: UnitRun, l: Leak) {
  const options = REPAIRS[l.location];
  const forced = run.p.repairAction ? options.find((o) => o.action === run.p.repairAction) : undefined;
  return forced ?? run.rng.weighted(options.map((o) => [o, o.weight] as const));
}

/** Applies the repair's outcome to the hidden leak (and others at the same place) and notes it in the truth. */
export function settleRepair(
  run: UnitRun,
  l: Leak,
  day: number,
  holds: number,
  action: RepairActionId,
  verified: boolean,
  also: Leak[] = [],
): void {
  const held = run.leak.repair([l, ...also], day, holds);
  run.truth.repairs.push({ day, location: l.location, action, held, verified });
}

/** Repair of the found leaks at a depot or workshop; opens the circuit (recover, repair, test, recharge) if needed. */
export function repairVisit(
  run: UnitRun,
  site: number,
  day: number,
  found: Leak[],
  events: SimEvent[],
  ms: number,
  by: number,
) {
  const { rng, p } = run;
  const { full } = run.traits;
  // One repair per location, however many of the hidden leaks sit there.
  const plans: { leak: Leak; plan: ReturnType<typeof chooseRepair>; also: Leak[] }[] = [];
  for (const l of found) {
    const same = plans.find((x) => x.leak.location === l.location);
    if (same) same.also.push(l);
    else plans.push({ leak: l, plan: chooseRepair(run, l), also: [] });
  }
  const opens = plans.some((x) => x.plan.opensCircuit);
  if (opens) {
    const recovered = Math.max(0, r3(full - run.leak.deficitKg - rng.uniform(0, 0.04)));
    if (recovered > 0) events.push({ kind: 'recovery', kg: recovered, cylinder: recoveryCylinder(run, site, day) });
    const tested = p.verified ?? rng.chance(0.85);
    for (const { leak, plan, also } of plans) {
      events.push(repairEvent(rng, leak, plan.action, tested));
      settleRepair(run, leak, day, plan.holds, plan.action, tested, also);
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
      cylinder: cylinder(run, site, day),
      reusedRecovered: reused,
      excludedFromLeakRate: false,
    });
    run.madeUpDays.push(day);
    run.leak.madeUp();
    events.push(gaugeReading(run, site, ms, pickSetPoint(rng)));
  } else {
    const checked = p.verified ?? rng.chance(0.6);
    for (const { leak, plan, also } of plans) {
      events.push(repairEvent(rng, leak, plan.action, checked));
      settleRepair(run, leak, day, plan.holds, plan.action, checked, also);
    }
    if (checked) events.push({ kind: 'leak_check', method: 'electronic_detector', leakFound: false });
    topUp(run, site, day, events, ms, by);
    if (rng.chance(0.7)) events.push(gaugeReading(run, site, ms, pickSetPoint(rng)));
  }
  if (rng.chance(0.6)) run.pending.push({ day: day + rng.int(18, 34), kind: 'recheck' });
}
