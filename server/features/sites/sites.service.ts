import { asc, count, eq } from 'drizzle-orm';
import type { Db, DbOrTx } from '../../db/client';
import { alertSubscriptions, events, sites, units, visits } from '../../db/schema';
import { isDuplicateKeyError } from '../../lib/db-errors';
import { conflict, notFound } from '../../lib/http-error';
import type { AppContext } from '../../lib/app-context';
import { writeUnit, type WriteContext } from '../../lib/record/write-path';
import type { CreateSiteInput, SiteDto, UpdateSiteInput } from '../../../shared/schemas/sites';

type SiteRow = typeof sites.$inferSelect;

function toSiteDto(s: SiteRow, unitCount: number): SiteDto {
  return {
    id: s.id,
    code: s.code,
    name: s.name,
    kind: s.kind,
    country: s.country ?? null,
    jurisdiction: s.jurisdiction ?? null,
    timeZone: s.timeZone ?? null,
    unitCount,
    createdAt: new Date(s.createdAt).toISOString(),
  };
}

const codeTaken = () => conflict('A site with this code already exists.', { code: 'Already in use' });

async function unitCountOf(db: DbOrTx, siteId: number): Promise<number> {
  const [row] = await db.select({ n: count() }).from(units).where(eq(units.siteId, siteId));
  return Number(row.n);
}

export async function listSites(db: Db): Promise<SiteDto[]> {
  const [rows, counts] = await Promise.all([
    db.select().from(sites).orderBy(asc(sites.code)),
    db.select({ siteId: units.siteId, n: count() }).from(units).groupBy(units.siteId),
  ]);
  const bySite = new Map(counts.map((c) => [c.siteId, Number(c.n)]));
  return rows.map((s) => toSiteDto(s, bySite.get(s.id) ?? 0));
}

export async function getSite(db: Db, id: number): Promise<SiteDto> {
  const [row] = await db.select().from(sites).where(eq(sites.id, id));
  if (!row) throw notFound('No such site.');
  return toSiteDto(row, await unitCountOf(db, id));
}

export async function createSite(db: Db, input: CreateSiteInput): Promise<SiteDto> {
  try {
    return await db.transaction(async (tx) => {
      const [taken] = await tx.select({ id: sites.id }).from(sites).where(eq(sites.code, input.code)).limit(1);
      if (taken) throw codeTaken();
      const [{ id }] = await tx
        .insert(sites)
        .values({
          code: input.code,
          name: input.name,
          kind: input.kind,
          country: input.country ?? null,
          jurisdiction: input.jurisdiction ?? null,
          timeZone: input.timeZone ?? null,
        })
        .$returningId();
      const [row] = await tx.select().from(sites).where(eq(sites.id, id));
      return toSiteDto(row, 0);
    });
  } catch (err) {
    if (isDuplicateKeyError(err)) throw codeTaken();
    throw err;
  }
}

/** The site and whether its leak-check rule changed (its units' figures then follow the new rule). */
export async function updateSite(
  db: Db,
  id: number,
  input: UpdateSiteInput,
): Promise<{ site: SiteDto; ruleChanged: boolean }> {
  try {
    return await db.transaction(async (tx) => {
      const [current] = await tx.select().from(sites).where(eq(sites.id, id)).for('update');
      if (!current) throw notFound('No such site.');
      if (input.code !== undefined && input.code !== current.code) {
        const [taken] = await tx.select({ id: sites.id }).from(sites).where(eq(sites.code, input.code)).limit(1);
        if (taken) throw codeTaken();
      }
      await tx
        .update(sites)
        .set({
          ...(input.code !== undefined && { code: input.code }),
          ...(input.name !== undefined && { name: input.name }),
          ...(input.kind !== undefined && { kind: input.kind }),
          ...(input.country !== undefined && { country: input.country }),
          ...(input.jurisdiction !== undefined && { jurisdiction: input.jurisdiction }),
          ...(input.timeZone !== undefined && { timeZone: input.timeZone }),
        })
        .where(eq(sites.id, id));
      const [row] = await tx.select().from(sites).where(eq(sites.id, id));
      const ruleChanged = (row.jurisdiction ?? null) !== (current.jurisdiction ?? null);
      return { site: toSiteDto(row, await unitCountOf(tx, id)), ruleChanged };
    });
  } catch (err) {
    if (isDuplicateKeyError(err)) throw codeTaken();
    throw err;
  }
}

/** True when MariaDB refused to delete a row that another table still refers to (errno 1451). */
function isStillReferencedError(err: unknown): boolean {
  for (let e = err as { code?: unknown; cause?: unknown } | undefined, depth = 0; e && depth < 4; depth++) {
    if (e.code === 'ER_ROW_IS_REFERENCED_2' || e.code === 'ER_ROW_IS_REFERENCED') return true;
    e = e.cause as typeof e;
  }
  return false;
}

/** Why a site cannot go, in words that say what to do instead; null when nothing refers to it. */
async function historyAt(tx: DbOrTx, id: number): Promise<string | null> {
  const n = await unitCountOf(tx, id);
  if (n > 0) return `${n} unit${n === 1 ? ' is' : 's are'} at this site; move them to another site before removing it.`;
  // Existence only: a busy site may have millions of entries and counting them would hold the lock for nothing.
  const [visit] = await tx.select({ id: visits.id }).from(visits).where(eq(visits.siteId, id)).limit(1);
  const [event] = visit ? [] : await tx.select({ id: events.id }).from(events).where(eq(events.siteId, id)).limit(1);
  if (visit || event) {
    // The record must keep saying where the work was done, so a site it names stays.
    return 'Visits recorded at this site name it in the service history, so it cannot be removed. Keep it, or rename it if it has changed.';
  }
  return null;
}

export async function deleteSite(db: Db, id: number): Promise<void> {
  try {
    await db.transaction(async (tx) => {
      const [current] = await tx.select({ id: sites.id }).from(sites).where(eq(sites.id, id)).for('update');
      if (!current) throw notFound('No such site.');
      const why = await historyAt(tx, id);
      if (why) throw conflict(why);
      // Alert subscriptions are preferences about the site, not its history; they go with it.
      await tx.delete(alertSubscriptions).where(eq(alertSubscriptions.siteId, id));
      await tx.delete(sites).where(eq(sites.id, id));
    });
  } catch (err) {
    // Something came to refer to the site between the check and the delete (or a table the check does not know).
    if (isStillReferencedError(err)) {
      throw conflict('Records still refer to this site (units or their service history), so it cannot be removed.');
    }
    throw err;
  }
}

/** Units at most this many are recomputed at once after a rule change; more go to the recompute job. */
const INLINE_RECOMPUTE_MAX = 200;

/**
 * After a site's jurisdiction changes, its units' stored figures (interval, next check due, alerts, My day) follow the
 * new rule: each through the unit write path, or the background recompute for a large site.
 */
export async function recomputeSiteUnits(ctx: WriteContext & Pick<AppContext, 'jobs'>, siteId: number) {
  const ids = (
    await ctx.db
      .select({ id: units.id })
      .from(units)
      .where(eq(units.siteId, siteId))
      .limit(INLINE_RECOMPUTE_MAX + 1)
  ).map((r) => r.id);
  if (ids.length > INLINE_RECOMPUTE_MAX) {
    await ctx.jobs.start('stats_recompute', { message: 'A site’s leak-check rule changed.' });
    return;
  }
  for (const id of ids) await writeUnit(ctx, id, async () => ({ result: null }));
}
