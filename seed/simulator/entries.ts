// The entries a technician writes at the unit: leak checks and what they found, repairs, top-ups (with the odd slip
// of the decimal point), the set point and leak-check method of the day.
import { KG_PER_LB, type LeakCheckMethodId, type LeakLocationId, type RepairActionId } from '../../shared/domain';
import { OTHER_ACTION_TEXT } from './catalogue';
import type { Leak } from './leak-process';
import { r1, r3 } from './numbers';
import type { Rng } from './prng';
import { cylinder, enteredAfter, type UnitRun } from './unit-run';
import type { SimEvent } from './unit-sim';

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

export const pickSetPoint = (rng: Rng) => rng.weighted(SET_POINTS);

export const routineMethod = (rng: Rng): LeakCheckMethodId =>
  rng.weighted([
    ['electronic_detector', 62],
    ['bubble_solution', 22],
    ['uv_dye', 16],
  ] as const);

/** One entry per location found (or one saying nothing was found). */
export function leakCheckEvents(method: LeakCheckMethodId, found: Leak[]): SimEvent[] {
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
}

export const repairEvent = (rng: Rng, l: Leak, action: RepairActionId, verified: boolean): SimEvent => ({
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

/** An amount as entered: mostly in kg to 10 g, now and then weighed in pounds. */
function massEntry(rng: Rng, kg: number): { kg: number; details?: Record<string, unknown> } {
  if (rng.chance(0.1)) {
    const lb = r1(kg / KG_PER_LB);
    return { kg: r3(lb * KG_PER_LB), details: { enteredAs: { value: lb, unit: 'lb' } } };
  }
  return { kg: Math.round(kg * 100) / 100 };
}

/** Tops the unit up to (nearly) full; false when it is too little short to bother. */
export function topUp(run: UnitRun, site: number, day: number, events: SimEvent[], ms: number, by: number): boolean {
  const { rng, leak } = run;
  const { full } = run.traits;
  const after = full * rng.uniform(0, 0.025);
  const amount = leak.deficitKg - after;
  if (amount < 0.05) return false;
  const m = massEntry(rng, amount);
  const e: SimEvent = {
    kind: 'top_up',
    kg: m.kg,
    cylinder: cylinder(run, site, day),
    reusedRecovered: false,
    details: m.details,
  };
  events.push(e);
  leak.madeUp(m.kg);
  run.madeUpDays.push(day);
  if (rng.chance(0.006) && m.kg * 10 <= 2 * full) {
    // A slip of the decimal point, voided by its author and entered again.
    const wrong = Math.round(m.kg * 1000) / 100;
    e.kg = wrong;
    const correct = m.kg;
    const voidMs = enteredAfter(run, ms) + rng.int(10, 120) * 60_000;
    run.corrections.push({ target: e, site, by, voidMs, occurredMs: ms, correct, cylinder: e.cylinder!, wrong });
  }
  return true;
}
