// The depot's day in the demo: at the site with the most units in service, a few units are quarantined (charged from
// an invented suspect lot) and a few were topped up yesterday without a leak found (re-check due today), recorded by
// the demo technician so that their My day opens on that site. Then every unit's depot state from its history, and
// where the simulated histories leave a group of My day empty at that site, an invented entry that fills it. Last, the
// demo engineer's review notes of the past fortnight at the busiest sites, so their alert defaults ("my sites") reach them.
// Draws from a stream of its own, after the fleet is written, so the simulated fleet stays byte-identical.
import { and, asc, count, desc, eq, isNull } from 'drizzle-orm';
import type { Db } from '../server/db/client';
import { events, unitDepotState, units, unitStats, users, visits } from '../server/db/schema';
import { myDay } from '../server/features/day/day.service';
import { createCaches } from '../server/lib/caches';
import { rebuildDepotStates } from '../server/lib/record/depot-state';
import { writeUnit } from '../server/lib/record/write-path';
import type { DayGroupId } from '../shared/schemas/day';
import type { Settings } from '../shared/schemas/settings';
import { DEMO_ACCOUNTS } from './demo-accounts';
import { createRng, streamSeed } from './simulator/prng';

const HOUR = 3_600_000;
const DAY = 24 * HOUR;
type Entry = Partial<typeof events.$inferInsert>;
type Candidate = typeof unitStats.$inferSelect;

/**
 * An invented entry per My day group that can be filled by one: when it happened, what it was, and which units can
 * take it (their latest entry is older, so it becomes the one that counts).
 */
function fillers(today: string, settings: Settings) {
  const after = (c: Candidate, at: Date) => c.lastEventAt == null || c.lastEventAt < at;
  const dayOf = (at: Date) => at.toISOString().slice(0, 10);
  const ptiBefore = (daysAgo: number) => ({
    daysAgo,
    entry: { kind: 'pti', passed: true } as Entry,
    fits: after,
  });
  const repairBefore = (daysAgo: number, dueAfter: string) => ({
    daysAgo,
    // A repair asks for a leak check within a month (Reg. (EU) 2024/573), so it brings the unit's check forward.
    entry: { kind: 'repair', location: 'service_valve', action: 'valve_core_replaced', verified: true } as Entry,
    fits: (c: Candidate, at: Date) => after(c, at) && c.nextLeakCheckDue != null && c.nextLeakCheckDue > dueAfter,
  });
  const plus = (n: number) => dayOf(new Date(Date.parse(`${today}T00:00:00Z`) + n * DAY));
  const fill: Partial<Record<DayGroupId, ReturnType<typeof ptiBefore>>> = {
    pti_expiring: ptiBefore(settings.ptiValidityDays - 6),
    pti_expired: ptiBefore(settings.ptiValidityDays + 5),
    open_leak: {
      daysAgo: 2,
      entry: { kind: 'leak_check', method: 'electronic_detector', leakFound: true, location: 'service_valve' },
      fits: (c, at) => after(c, at) && c.openLeakFoundAt == null,
    },
    leak_check_due: repairBefore(16, plus(30)),
    leak_check_overdue: repairBefore(45, today),
  };
  return fill;
}

export async function seedDepotDay(
  db: Db,
  opts: { seed: number; now: Date; settings: Settings; publicUrl: string },
): Promise<{ quarantined: number; rechecks: number; filled: number }> {
  const rng = createRng(streamSeed(opts.seed, 'depot-day'));
  const tech = DEMO_ACCOUNTS.find((a) => a.role === 'technician')!;
  const [person] = await db.select({ id: users.id }).from(users).where(eq(users.email, tech.email));
  const [busiest] = await db
    .select({ siteId: units.siteId, n: count() })
    .from(units)
    .where(eq(units.status, 'in_service'))
    .groupBy(units.siteId)
    .orderBy(desc(count()))
    .limit(1);
  if (!person || !busiest?.siteId) return { quarantined: 0, rechecks: 0, filled: 0 };
  const siteId = busiest.siteId;
  const candidates = await db
    .select({ id: units.id })
    .from(units)
    .where(and(eq(units.siteId, siteId), eq(units.status, 'in_service')))
    .orderBy(asc(units.id));
  const chosen: number[] = [];
  while (chosen.length < Math.min(5, candidates.length)) {
    const id = rng.pick(candidates).id;
    if (!chosen.includes(id)) chosen.push(id);
  }
  const ctx = { db, clock: { now: () => opts.now }, publicUrl: opts.publicUrl, caches: createCaches() };
  const lot = `LOT-${rng.int(1000, 9999)}-X`;
  const write = (unitId: number, key: string, at: Date, entry: Partial<typeof events.$inferInsert>) =>
    writeUnit(ctx, unitId, async (tx, { unit }, now) => {
      const [v] = await tx
        .insert(visits)
        .values({ unitId, siteId, recordedBy: person.id, occurredAt: at, enteredAt: now, idempotencyKey: key })
        .$returningId();
      await tx.insert(events).values({
        kind: 'note',
        ...entry,
        unitId,
        visitId: v.id,
        siteId: unit.siteId,
        recordedBy: person.id,
        occurredAt: at,
        enteredAt: now,
      });
      return { result: null, movedVisitIds: entry.kind === 'top_up' ? [v.id] : [] };
    });
  // Two quarantined units.
  for (const unitId of chosen.slice(0, 2)) {
    const reason = `Charged from lot ${lot}, reported as possibly contaminated by its supplier`;
    await write(unitId, `demo-q-${unitId}`, new Date(opts.now.getTime() - rng.int(2, 30) * HOUR), {
      kind: 'note',
      note: `Quarantined from a trace search: ${reason}`,
      details: { quarantine: { reason, source: 'trace', search: `cylinder or lot ${lot}` } },
    });
  }
  // Three top-ups yesterday without a leak found: re-checks due today.
  for (const unitId of chosen.slice(2)) {
    await write(unitId, `demo-r-${unitId}`, new Date(opts.now.getTime() - rng.int(20, 30) * HOUR), {
      kind: 'top_up',
      kg: Math.round(rng.uniform(0.2, 0.7) * 100) / 100,
      cylinder: `CYL-${rng.int(100, 999)}`,
    });
  }
  await rebuildDepotStates(db, opts.now, opts.settings);
  const filled = await fillEmptyGroups(db, { ...opts, siteId, personId: person.id, write, rng, skip: chosen });
  if (filled > 0) await rebuildDepotStates(db, opts.now, opts.settings);
  await seedEngineerReviews(db, { ...opts, ctx, rng });
  return { quarantined: 2, rechecks: chosen.length - 2, filled };
}

const ENGINEER_REVIEW_SITES = 3;

/** A review note by the demo engineer on one unit at each of the busiest sites, within the last two weeks. */
async function seedEngineerReviews(
  db: Db,
  o: { now: Date; ctx: Parameters<typeof writeUnit>[0]; rng: ReturnType<typeof createRng> },
): Promise<void> {
  const engineer = DEMO_ACCOUNTS.find((a) => a.role === 'engineer')!;
  const [person] = await db.select({ id: users.id }).from(users).where(eq(users.email, engineer.email));
  if (!person) return;
  const busiest = await db
    .select({ siteId: units.siteId, n: count() })
    .from(units)
    .where(eq(units.status, 'in_service'))
    .groupBy(units.siteId)
    .orderBy(desc(count()), asc(units.siteId))
    .limit(ENGINEER_REVIEW_SITES);
  for (const { siteId } of busiest) {
    if (siteId == null) continue;
    const [unit] = await db
      .select({ id: units.id })
      .from(units)
      .where(and(eq(units.siteId, siteId), eq(units.status, 'in_service')))
      .orderBy(asc(units.id))
      .limit(1);
    if (!unit) continue;
    const at = new Date(o.now.getTime() - o.rng.int(1, 14) * DAY - o.rng.int(1, 8) * HOUR);
    await writeUnit(o.ctx, unit.id, async (tx, _state, now) => {
      const common = { unitId: unit.id, siteId, recordedBy: person.id, occurredAt: at, enteredAt: now };
      const [v] = await tx
        .insert(visits)
        .values({ ...common, idempotencyKey: `demo-review-${unit.id}` })
        .$returningId();
      await tx.insert(events).values({
        ...common,
        kind: 'note',
        visitId: v.id,
        note: 'Reviewed the leak history before the depot call; no change to the plan.',
      });
      return { result: null, movedVisitIds: [] };
    });
  }
}

/** The groups of My day the fleet left empty at the site, each given one unit by an invented entry. */
async function fillEmptyGroups(
  db: Db,
  o: {
    now: Date;
    settings: Settings;
    siteId: number;
    personId: string;
    rng: ReturnType<typeof createRng>;
    skip: number[];
    write: (unitId: number, key: string, at: Date, entry: Entry) => Promise<unknown>;
  },
): Promise<number> {
  const [user] = await db.select().from(users).where(eq(users.id, o.personId));
  const day = await myDay(db, user, o.siteId, o.now);
  const today = day.today;
  const fill = fillers(today, o.settings);
  const empty = day.groups.filter((g) => g.total === 0 && fill[g.id]).map((g) => g.id);
  if (empty.length === 0) return 0;
  const used = new Set(o.skip);
  let filled = 0;
  for (const id of empty) {
    const f = fill[id]!;
    const at = new Date(o.now.getTime() - f.daysAgo * DAY - o.rng.int(1, 6) * HOUR);
    const rows = await db
      .select({ stats: unitStats })
      .from(units)
      .innerJoin(unitStats, eq(unitStats.unitId, units.id))
      .leftJoin(unitDepotState, eq(unitDepotState.unitId, units.id))
      .where(and(eq(units.siteId, o.siteId), eq(units.status, 'in_service'), isNull(unitDepotState.quarantinedSince)))
      .orderBy(asc(units.id));
    const fits = rows.map((r) => r.stats).filter((c) => !used.has(c.unitId) && f.fits(c, at));
    if (fits.length === 0) continue;
    const unitId = o.rng.pick(fits).unitId;
    used.add(unitId);
    await o.write(unitId, `demo-${id}-${unitId}`, at, f.entry);
    filled += 1;
  }
  return filled;
}
