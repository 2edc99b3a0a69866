// The invented fleet of Halyard Reefer Leasing: its sites, its people, and one simulated life per unit.
// Deterministic from the seed: each unit draws from its own stream, so any unit can be regenerated alone.
import type { Role } from '../../shared/permissions';
import { DEMO_ACCOUNTS } from '../demo-accounts';
import { EXTRA_ENGINEERS, FIRST_NAMES, LAST_NAMES, TECHNICIANS_PER_SITE, fleetSites, type SiteSpec } from './catalogue';
import { createRng, streamSeed } from './prng';
import { DAY_MS } from './numbers';
import { simulateUnit, type FleetContext, type Profile, type StoryId, type UnitSim } from './unit-sim';

export const DEFAULT_SEED = 6346;
export const DEFAULT_HISTORY_YEARS = 6;
export const BUSY_UNIT_EVENTS = 5000;

export type FleetOptions = {
  seed?: number;
  /** Units with ordinary histories (the busy benchmark unit comes on top). */
  units: number;
  /** The moment the fleet is seen from; every visit is before the start of its UTC day. */
  now: Date;
  historyYears?: number;
  /** Add one unit logged every day with exactly this many events (for the benchmark). */
  busyUnitEvents?: number;
};

export type SimPerson = {
  id: string;
  email: string;
  name: string;
  role: Role;
  certificateNumber: string | null;
  /** One of the four demo sign-ins (these get the demo password). */
  demo: boolean;
};

export type Fleet = {
  ctx: FleetContext;
  people: SimPerson[];
  sites: SiteSpec[];
  /** Ordinary units; the busy unit, when asked for, has index `units`. */
  units: number;
  busyUnitEvents: number;
};

/** The demo's story units: their indices in every fleet (the first units generated). */
export const STORY_UNITS: { index: number; story: StoryId; title: string }[] = [
  {
    index: 0,
    story: 'chronic_leaker',
    title: 'chronic leaker: a brazed joint that keeps leaking, repairs that do not last',
  },
  {
    index: 1,
    story: 'repair_held',
    title: 'a repair that held: condenser coil replaced three years ago, no top-up since',
  },
  {
    index: 2,
    story: 'repair_failed',
    title: 'a repair that did not hold: evaporator coil rebrazed, leaking again within weeks',
  },
  {
    index: 3,
    story: 'decision_due',
    title: 'due for a decision: 14 years old, leaking at the compressor and coil, topped up every few weeks',
  },
];

export function createFleet(opts: FleetOptions): Fleet {
  const seed = opts.seed ?? DEFAULT_SEED;
  const nowMs = opts.now.getTime();
  const todayDay = Math.floor(nowMs / DAY_MS);
  const sites = fleetSites(opts.units);
  if (new Set(sites.map((s) => s.code)).size !== sites.length) throw new Error('Site codes must be unique.');
  const rng = createRng(streamSeed(seed, 'people'));
  const id = () => Buffer.from(rng.bytes(12)).toString('base64url');

  const people: SimPerson[] = DEMO_ACCOUNTS.map((a) => ({ id: id(), ...a, demo: true }));
  const demoTech = people.findIndex((p) => p.role === 'technician');
  const demoEngineer = people.findIndex((p) => p.role === 'engineer');
  const used = new Set(people.map((p) => p.email));
  const usedNames = new Set(people.map((p) => p.name));
  const person = (role: Role): number => {
    let name = '';
    do name = `${rng.pick(FIRST_NAMES)} ${rng.pick(LAST_NAMES)}`;
    while (usedNames.has(name));
    usedNames.add(name);
    const base = name.toLowerCase().replace(/[^a-z]+/g, '.');
    let email = `${base}@halyard.example`;
    for (let n = 2; used.has(email); n++) email = `${base}${n}@halyard.example`;
    used.add(email);
    people.push({
      id: id(),
      email,
      name,
      role,
      certificateNumber: role === 'technician' || role === 'engineer' ? `HX-CERT-${rng.int(30000, 59999)}` : null,
      demo: false,
    });
    return people.length - 1;
  };

  const techniciansBySite: number[][] = [];
  sites.forEach((s, i) => {
    const list: number[] = [];
    // The demo technician works at the first depot, so signing in as her shows her own entries.
    if (i === 0 && demoTech >= 0) list.push(demoTech);
    while (list.length < TECHNICIANS_PER_SITE[s.kind]) list.push(person('technician'));
    techniciansBySite.push(list);
  });
  const engineers = demoEngineer >= 0 ? [demoEngineer] : [];
  for (let i = 0; i < EXTRA_ENGINEERS; i++) engineers.push(person('engineer'));

  const idx = (kind: SiteSpec['kind']) => sites.flatMap((s, i) => (s.kind === kind ? [i] : []));
  const ctx: FleetContext = {
    seed,
    nowMs,
    todayDay,
    historyYears: opts.historyYears ?? DEFAULT_HISTORY_YEARS,
    sites,
    depots: idx('depot'),
    terminals: idx('terminal'),
    vessels: idx('vessel'),
    workshops: idx('workshop'),
    techniciansBySite,
    engineers,
  };
  return { ctx, people, sites, units: opts.units, busyUnitEvents: opts.busyUnitEvents ?? 0 };
}

/** The overrides of the story units and the busy unit; ordinary units have none. */
export function profileFor(fleet: Fleet, index: number): Profile | undefined {
  const { ctx } = fleet;
  const today = ctx.todayDay;
  const home = ctx.depots[0];
  if (index === fleet.units && fleet.busyUnitEvents > 0) {
    return {
      story: 'busy_unit',
      daily: true,
      ageYears: 11.5,
      historyYears: 11,
      refrigerant: 'R-134a',
      chargeKg: 5,
      leakClass: 'slow',
      homeSite: ctx.workshops[0] ?? home,
      noRetire: true,
    };
  }
  switch (STORY_UNITS.find((s) => s.index === index)?.story) {
    case 'chronic_leaker':
      return {
        story: 'chronic_leaker',
        ageYears: 11.3,
        refrigerant: 'R-134a',
        chargeKg: 5.2,
        leakClass: 'chronic',
        homeSite: home,
        initialLeaks: [{ location: 'brazed_joint', ratePctPerYear: 60, daysBeforeStart: 200 }],
        weakSpot: 'brazed_joint',
        hazardPerYear: 0.6,
        holdMultiplier: 0.45,
        repairAction: 'rebrazed',
        // Repaired again a year ago without success; nothing repaired in its last months, only topped up.
        forceRepairFrom: today - 420,
        repairOutcome: 'fail',
        verified: true,
        repairChance: (day) => (day < today - 420 ? 0.55 : 0),
      };
    case 'repair_held':
      return {
        story: 'repair_held',
        ageYears: 7.6,
        refrigerant: 'R-134a',
        chargeKg: 4.6,
        leakClass: 'slow',
        homeSite: home,
        initialLeaks: [{ location: 'condenser_coil', ratePctPerYear: 40, daysBeforeStart: 30 }],
        hazardPerYear: 0,
        forceRepairFrom: today - 3 * 365,
        repairChance: () => 0,
        repairOutcome: 'hold',
        repairAction: 'coil_replaced',
        verified: true,
      };
    case 'repair_failed':
      return {
        story: 'repair_failed',
        ageYears: 5.2,
        refrigerant: 'R-452A',
        chargeKg: 4.4,
        leakClass: 'slow',
        homeSite: home,
        initialLeaks: [{ location: 'evaporator_coil', ratePctPerYear: 45, daysBeforeStart: -400 }],
        hazardPerYear: 0,
        forceRepairFrom: today - 290,
        repairChance: () => 0,
        repairOutcome: 'fail',
        reopen: { afterDays: 30, rateFactor: 1.5 },
        repairAction: 'rebrazed',
        verified: true,
      };
    case 'decision_due':
      return {
        story: 'decision_due',
        ageYears: 14.2,
        refrigerant: 'R-404A',
        chargeKg: 5.5,
        leakClass: 'chronic',
        homeSite: home,
        initialLeaks: [
          { location: 'compressor', ratePctPerYear: 60, daysBeforeStart: 100 },
          { location: 'condenser_coil', ratePctPerYear: 25, daysBeforeStart: 20 },
        ],
        hazardPerYear: 0.3,
        repairChance: () => 0,
        alwaysLeakCheck: 'uv_dye',
        noRetire: true,
      };
    default:
      return undefined;
  }
}

/** Total number of units, the busy one included. */
export function unitCount(fleet: Fleet): number {
  return fleet.units + (fleet.busyUnitEvents > 0 ? 1 : 0);
}

/** Simulates one unit of the fleet by index. */
export function simulateFleetUnit(fleet: Fleet, index: number): UnitSim {
  const sim = simulateUnit(fleet.ctx, index, profileFor(fleet, index));
  if (index === fleet.units && fleet.busyUnitEvents > 0) trimToEvents(sim, fleet.busyUnitEvents);
  return sim;
}

/** Drops the oldest entries until the unit has exactly `n` event rows (entries plus void markers). */
function trimToEvents(sim: UnitSim, n: number) {
  let total = sim.visits.reduce((s, v) => s + v.events.length, 0) + sim.voids.length;
  if (total < n) throw new Error(`The busy unit has only ${total} events; lengthen its history.`);
  while (total > n) {
    const first = sim.visits[0];
    const excess = total - n;
    if (first.events.length <= excess) {
      // Voids of entries in a dropped visit go with it.
      const dropped = new Set(first.events);
      const before = sim.voids.length;
      sim.voids = sim.voids.filter((v) => !dropped.has(v.target));
      total -= first.events.length + (before - sim.voids.length);
      sim.visits.shift();
    } else {
      const keep = first.events.length - excess;
      const dropped = new Set(first.events.slice(keep));
      if (sim.voids.some((v) => dropped.has(v.target))) {
        sim.voids = sim.voids.filter((v) => !dropped.has(v.target));
        total = sim.visits.reduce((s, v) => s + v.events.length, 0) + sim.voids.length;
        continue;
      }
      first.events.length = keep;
      total -= excess;
    }
  }
}
