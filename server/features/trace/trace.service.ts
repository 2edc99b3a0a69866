// Refrigerant traceability (DOMAIN.md §10): every unit charged from a cylinder or lot, or at a site in a date range,
// and marking those units for inspection with a note event on each, in one transaction.
import { retryTransaction } from '../../lib/retry';
import { WRITE_ISOLATION } from '../../lib/record/write-path';
import { and, asc, count, desc, eq, gte, inArray, like, lt, or, sql, type SQL } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { cylinderMoves, cylinders, events, sites, units, users, visits } from '../../db/schema';
import { badRequest } from '../../lib/http-error';
import type { SessionUser } from '../../lib/session';
import {
  MAX_MARK_UNITS,
  MAX_TRACE_ROWS,
  traceQuerySchema,
  type MarkForInspectionInput,
  type MarkForInspectionResultDto,
  type TraceQuery,
  type TraceResultDto,
} from '../../../shared/schemas/trace';
import { MAX_NOTE_LENGTH } from '../../../shared/schemas/history';
import { dayPlus } from '../../lib/dates';
import { fmtIsoDay } from '../../../shared/format-dates';

const CHARGES = ['top_up', 'recharge'] as const;
const voided = sql`EXISTS (SELECT 1 FROM events v WHERE v.voids_event_id = ${events.id})`;
const notVoided = sql`NOT EXISTS (SELECT 1 FROM events v WHERE v.voids_event_id = ${events.id})`;
const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

/** The search without the voided test: cylinder prefix (the lot is the start of the number), site, days. */
export function traceWhere(q: TraceQuery): SQL[] {
  const w: SQL[] = [inArray(events.kind, [...CHARGES])];
  if (q.cylinder) {
    // The typed cylinder/lot text, or a register cylinder whose number or lot starts so (the technician may have
    // typed only the cylinder's number: the register knows its lot).
    const prefix = `${escapeLike(q.cylinder)}%`;
    w.push(
      or(
        like(events.cylinder, prefix),
        sql`EXISTS (SELECT 1 FROM ${cylinderMoves} m JOIN ${cylinders} c ON c.id = m.cylinder_id WHERE m.event_id = ${events.id} AND (c.code LIKE ${prefix} OR c.lot LIKE ${prefix}))`,
      )!,
    );
  }
  if (q.cylinderId) {
    w.push(
      sql`EXISTS (SELECT 1 FROM ${cylinderMoves} m WHERE m.event_id = ${events.id} AND m.cylinder_id = ${q.cylinderId})`,
    );
  }
  if (q.siteId) w.push(eq(events.siteId, q.siteId));
  if (q.from) w.push(gte(events.occurredAt, new Date(`${q.from}T00:00:00Z`)));
  if (q.to) w.push(lt(events.occurredAt, new Date(`${dayPlus(q.to, 1)}T00:00:00Z`)));
  return w;
}

export const traceChargeFields = {
  eventId: events.id,
  unitId: events.unitId,
  containerNumber: units.containerNumber,
  refrigerant: units.refrigerant,
  kind: events.kind,
  kg: events.kg,
  cylinder: events.cylinder,
  occurredAt: events.occurredAt,
  siteId: events.siteId,
  siteName: sites.name,
  technicianId: users.id,
  technicianName: users.name,
};

export function traceChargesQuery(db: Db, q: TraceQuery) {
  return db
    .select(traceChargeFields)
    .from(events)
    .innerJoin(units, eq(units.id, events.unitId))
    .innerJoin(users, eq(users.id, events.recordedBy))
    .leftJoin(sites, eq(sites.id, events.siteId))
    .where(and(...traceWhere(q), notVoided))
    .orderBy(desc(events.occurredAt), desc(events.id))
    .$dynamic();
}

async function markedAtOf(db: Db, unitIds: number[]): Promise<Map<number, Date>> {
  const out = new Map<number, Date>();
  for (let i = 0; i < unitIds.length; i += 1000) {
    const rows = await db
      .select({ unitId: events.unitId, at: sql<Date>`MAX(${events.occurredAt})` })
      .from(events)
      .where(
        and(
          inArray(events.unitId, unitIds.slice(i, i + 1000)),
          eq(events.kind, 'note'),
          sql`JSON_EXTRACT(${events.details}, '$.inspection') IS NOT NULL`,
        ),
      )
      .groupBy(events.unitId);
    for (const r of rows) out.set(r.unitId, new Date(r.at));
  }
  return out;
}

export async function traceCharges(db: Db, q: TraceQuery): Promise<TraceResultDto> {
  const where = traceWhere(q);
  const [charges, [total], [voidedCount], perUnit] = await Promise.all([
    traceChargesQuery(db, q).limit(MAX_TRACE_ROWS),
    db
      .select({ n: count(), kg: sql<number>`COALESCE(SUM(${events.kg}), 0)` })
      .from(events)
      .where(and(...where, notVoided)),
    db
      .select({ n: count() })
      .from(events)
      .where(and(...where, voided)),
    db
      .select({
        unitId: events.unitId,
        containerNumber: units.containerNumber,
        n: count(),
        kg: sql<number>`SUM(${events.kg})`,
      })
      .from(events)
      .innerJoin(units, eq(units.id, events.unitId))
      .where(and(...where, notVoided))
      .groupBy(events.unitId, units.containerNumber)
      .orderBy(asc(units.containerNumber))
      .limit(MAX_MARK_UNITS),
  ]);
  const marked = await markedAtOf(
    db,
    perUnit.map((u) => u.unitId),
  );
  return {
    charges: charges.map((c) => ({
      eventId: c.eventId,
      unitId: c.unitId,
      containerNumber: c.containerNumber,
      refrigerant: c.refrigerant,
      kind: c.kind as 'top_up' | 'recharge',
      kg: c.kg ?? 0,
      cylinder: c.cylinder,
      occurredAt: c.occurredAt.toISOString(),
      site: c.siteId != null ? { id: c.siteId, name: c.siteName ?? '' } : null,
      technician: { id: c.technicianId, name: c.technicianName },
    })),
    totalCharges: Number(total.n),
    totalKg: Math.round(Number(total.kg) * 1000) / 1000,
    units: perUnit.map((u) => ({
      unitId: u.unitId,
      containerNumber: u.containerNumber,
      charges: Number(u.n),
      kg: Math.round(Number(u.kg) * 1000) / 1000,
      markedAt: marked.get(u.unitId)?.toISOString() ?? null,
    })),
    voidedExcluded: Number(voidedCount.n),
  };
}

function describeSearch(q: TraceQuery, siteName: string | null): string {
  const parts: string[] = [];
  if (q.cylinder) parts.push(`from cylinder or lot ${q.cylinder}`);
  if (q.cylinderId) parts.push(`from register cylinder #${q.cylinderId}`);
  if (q.siteId) parts.push(`at ${siteName ?? `site ${q.siteId}`}`);
  if (q.from && q.to) parts.push(`between ${fmtIsoDay(q.from)} and ${fmtIsoDay(q.to)}`);
  else if (q.from) parts.push(`from ${fmtIsoDay(q.from)}`);
  else if (q.to) parts.push(`until ${fmtIsoDay(q.to)}`);
  return parts.join(' ');
}

/**
 * Records a note event on every unit the search finds, saying why it is marked for inspection. One transaction:
 * all units are marked or none. A retry with the same key returns the first result.
 */
export async function markForInspection(
  db: Db,
  user: SessionUser,
  input: MarkForInspectionInput,
  now: Date,
): Promise<MarkForInspectionResultDto> {
  const q = traceQuerySchema.parse(input.query);
  const keyOf = (unitId: number) => `${input.idempotencyKey}-${unitId}`;
  const replayed = async () => {
    const rows = await db
      .select({ id: events.id })
      .from(events)
      .innerJoin(visits, eq(visits.id, events.visitId))
      .where(like(visits.idempotencyKey, `${escapeLike(input.idempotencyKey)}-%`));
    return rows.length
      ? { marked: rows.length, replayed: true, eventIds: rows.map((r) => r.id).sort((a, b) => a - b) }
      : null;
  };
  const earlier = await replayed();
  if (earlier) return earlier;

  try {
    // Notes change no figures, so of the unit write path only its locking and retry rule apply (many units at once,
    // locked in id order).
    return await retryTransaction(() =>
      db.transaction(async (tx) => {
        const found = await tx
          .selectDistinct({ unitId: events.unitId })
          .from(events)
          .where(and(...traceWhere(q), notVoided))
          .orderBy(asc(events.unitId))
          .limit(MAX_MARK_UNITS + 1);
        if (!found.length) throw badRequest('No unit was charged in this search; nothing to mark.');
        if (found.length > MAX_MARK_UNITS)
          throw badRequest(`More than ${MAX_MARK_UNITS} units match; narrow the search first.`);
        const ids = found.map((f) => f.unitId);
        // Lock the units in id order, like every write to a unit's history.
        const locked = await tx
          .select({ id: units.id, siteId: units.siteId })
          .from(units)
          .where(inArray(units.id, ids))
          .orderBy(asc(units.id))
          .for('update');
        const perUnit = await tx
          .select({
            unitId: events.unitId,
            n: count(),
            kg: sql<number>`SUM(${events.kg})`,
            last: sql<Date>`MAX(${events.occurredAt})`,
          })
          .from(events)
          .where(and(...traceWhere(q), notVoided))
          .groupBy(events.unitId);
        const stats = new Map(perUnit.map((p) => [p.unitId, p]));
        let siteName: string | null = null;
        if (q.siteId) {
          const [site] = await tx.select({ name: sites.name }).from(sites).where(eq(sites.id, q.siteId));
          siteName = site?.name ?? null;
        }
        const what = describeSearch(q, siteName);

        const visitIds = await tx
          .insert(visits)
          .values(
            locked.map((u) => ({
              unitId: u.id,
              siteId: u.siteId,
              recordedBy: user.id,
              occurredAt: now,
              enteredAt: now,
              idempotencyKey: keyOf(u.id),
            })),
          )
          .$returningId();
        const rows = locked.map((u, i) => {
          const s = stats.get(u.id);
          const kg = Math.round(Number(s?.kg ?? 0) * 1000) / 1000;
          const last = s ? fmtIsoDay(new Date(s.last).toISOString()) : '—';
          const note = `Marked for inspection: charged ${what} (${Number(s?.n ?? 0)} charge(s), ${kg} kg, last on ${last}). Reason: ${input.reason}`;
          return {
            unitId: u.id,
            visitId: visitIds[i].id,
            siteId: u.siteId,
            recordedBy: user.id,
            kind: 'note' as const,
            occurredAt: now,
            enteredAt: now,
            note: note.slice(0, MAX_NOTE_LENGTH),
            details: {
              inspection: {
                cylinder: q.cylinder ?? null,
                siteId: q.siteId ?? null,
                from: q.from ?? null,
                to: q.to ?? null,
                reason: input.reason,
              },
            },
          };
        });
        await tx.insert(events).values(rows);
        const inserted = await tx
          .select({ id: events.id })
          .from(events)
          .where(
            inArray(
              events.visitId,
              visitIds.map((v) => v.id),
            ),
          )
          .orderBy(asc(events.id));
        return { marked: inserted.length, replayed: false, eventIds: inserted.map((r) => r.id) };
      }, WRITE_ISOLATION),
    );
  } catch (err) {
    // A concurrent retry lost the race on the visits' unique keys: the first one's result stands.
    const e = err as { code?: string; cause?: { code?: string } };
    if (e?.code === 'ER_DUP_ENTRY' || e?.cause?.code === 'ER_DUP_ENTRY') {
      const first = await replayed();
      if (first) return first;
    }
    throw err;
  }
}
