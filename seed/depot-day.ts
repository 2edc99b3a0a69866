// The depot's day in the demo: at the site with the most units in service, a few units are quarantined (charged from
// an invented suspect lot) and a few were topped up yesterday without a leak found (re-check due today), recorded by
// the demo technician so that their My day opens on that site. Then every unit's depot state from its history.
// Draws from a stream of its own, after the fleet is written, so the simulated fleet stays byte-identical.
import { and, asc, count, desc, eq } from 'drizzle-orm';
import type { Db } from '../server/db/client';
import { events, units, users, visits } from '../server/db/schema';
import { createCaches } from '../server/lib/caches';
import { rebuildDepotStates } from '../server/lib/record/depot-state';
import { writeUnit } from '../server/lib/record/write-path';
import type { Settings } from '../shared/schemas/settings';
import { DEMO_ACCOUNTS } from './demo-accounts';
import { createRng, streamSeed } from './simulator/prng';

const HOUR = 3_600_000;

export async function seedDepotDay(
  db: Db,
  opts: { seed: number; now: Date; settings: Settings; publicUrl: string },
): Promise<{ quarantined: number; rechecks: number }> {
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
  if (!person || !busiest?.siteId) return { quarantined: 0, rechecks: 0 };
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
  return { quarantined: 2, rechecks: chosen.length - 2 };
}
