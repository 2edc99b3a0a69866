// Recording visits and voids (append-only, through the unit write path), and reading a unit's history.
import { createHash } from 'node:crypto';
import { and, desc, eq, inArray, lt, or, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/mysql-core';
import type { Db, DbOrTx } from '../../db/client';
import {
  attachments,
  events,
  sites,
  unitChanges,
  units,
  unitStats,
  unitStatsDetail,
  users,
  visits,
} from '../../db/schema';
import { badRequest, conflict, forbidden, notFound } from '../../lib/http-error';
import type { AppContext } from '../../lib/app-context';
import type { SessionUser } from '../../lib/session';
import { can } from '../../../shared/permissions';
import {
  HISTORY_PAGE_SIZE,
  VOID_WINDOW_HOURS,
  type AttachmentDto,
  type EventDto,
  type RecordVisitInput,
  type RecordVisitResultDto,
  type UnitHistoryDto,
  type UnitOverviewDto,
  type UnitTimelineDto,
  type VisitEventInput,
} from '../../../shared/schemas/history';
import { visitPlausibilityIssues } from '../../../shared/schemas/visit-rules';
import type { Settings } from '../../../shared/schemas/settings';
import { isDuplicateKeyError } from '../../lib/db-errors';
import { writeUnit } from '../../lib/record/write-path';
import { computeUnitStats, REFRIGERANT_MOVEMENT_KINDS } from '../../../shared/domain';
import { engineUnit, ENGINE_EVENT_COLUMNS, toEngineEvent, toStatsDto } from '../../lib/record/stats';

type EventInsert = typeof events.$inferInsert;

/** The row for one form entry; `enteredAs`, free text and kind-specific extras go to `details`. */
function eventRow(
  e: VisitEventInput,
): Omit<EventInsert, 'unitId' | 'visitId' | 'siteId' | 'recordedBy' | 'occurredAt' | 'enteredAt'> {
  const base = { kind: e.kind, note: e.note ?? null };
  switch (e.kind) {
    case 'pti':
      return { ...base, passed: e.passed };
    case 'leak_check':
      return {
        ...base,
        method: e.method,
        leakFound: e.leakFound,
        location: e.leakFound ? (e.location ?? null) : null,
        details: e.locationOther ? { locationOther: e.locationOther } : null,
      };
    case 'repair':
      return {
        ...base,
        location: e.location,
        action: e.action,
        verified: e.verified,
        details:
          e.locationOther || e.actionOther ? { locationOther: e.locationOther, actionOther: e.actionOther } : null,
      };
    case 'component_replacement':
      return { ...base, details: { component: e.component } };
    case 'status_change':
      return { ...base, details: { status: e.status } };
    case 'note':
      return base;
    case 'top_up':
    case 'recovery':
    case 'recharge':
      return {
        ...base,
        kg: e.kg,
        cylinder: e.cylinder,
        reusedRecovered: 'reusedRecovered' in e ? (e.reusedRecovered ?? false) : null,
        excludedFromLeakRate: e.kind === 'recharge' ? (e.excludedFromLeakRate ?? false) : null,
        details: e.enteredAs ? { enteredAs: e.enteredAs } : null,
      };
    case 'pressure':
      return {
        ...base,
        suctionKPaG: e.suctionKPaG ?? null,
        dischargeKPaG: e.dischargeKPaG ?? null,
        ambientC: e.ambientC ?? null,
        setPointC: e.setPointC ?? null,
        supplyAirC: e.supplyAirC ?? null,
        returnAirC: e.returnAirC ?? null,
        sightGlass: e.sightGlass ?? null,
        details: e.enteredAs ? { enteredAs: e.enteredAs } : null,
      };
  }
}

/** SHA-256 of what a submission says (everything but its key): a key sent again must come with the same content. */
export function submissionHash(input: RecordVisitInput): string {
  const { idempotencyKey: _key, ...content } = input;
  return createHash('sha256').update(JSON.stringify(content)).digest('hex');
}

async function replay(db: Db, user: SessionUser, input: RecordVisitInput): Promise<RecordVisitResultDto | null> {
  const [visit] = await reads(db).visitByKey.execute({ key: input.idempotencyKey });
  if (!visit) return null;
  if (visit.recordedBy !== user.id || visit.unitId !== input.unitId) {
    throw conflict('This submission key was already used for another visit.', { idempotencyKey: 'Already used' });
  }
  // Visits recorded before the content was kept have no hash: the key alone identifies them.
  if (visit.contentHash && visit.contentHash !== submissionHash(input)) {
    throw conflict(
      'This submission key was already used for a visit with other entries; nothing was recorded. Send the visit as a new submission.',
      {
        idempotencyKey: 'Already used for other entries',
      },
    );
  }
  const evs = await eventDtos(db, await reads(db).visitEvents.execute({ visitId: visit.id }));
  const [found] = await reads(db).unitWithStats.execute({ unitId: visit.unitId });
  return { visitId: visit.id, replayed: true, events: evs, stats: toStatsDto(found.stats!, found.detail) };
}

const isMovement = (kind: string) => (REFRIGERANT_MOVEMENT_KINDS as readonly string[]).includes(kind);

export async function recordVisit(ctx: AppContext, user: SessionUser, input: RecordVisitInput) {
  const earlier = await replay(ctx.db, user, input);
  if (earlier) return earlier;
  try {
    const written = await writeUnit(ctx, input.unitId, async (tx, { unit }, now) => {
      if (unit.status === 'retired' && input.events.some((e) => e.kind !== 'note' && e.kind !== 'status_change')) {
        throw conflict('This unit is retired. Record a status change first if it is back in service.');
      }
      const issues = visitPlausibilityIssues(unit, input, now);
      if (Object.keys(issues).length) throw badRequest('Some entries are not plausible.', issues);
      const siteId = input.siteId ?? unit.siteId ?? null;
      if (input.siteId && input.siteId !== unit.siteId) {
        const [site] = await tx.select({ id: sites.id }).from(sites).where(eq(sites.id, input.siteId));
        if (!site) throw badRequest('Choose a known site.', { siteId: 'Unknown site' });
      }
      const occurredAt = new Date(input.occurredAt);
      const [inserted] = await tx
        .insert(visits)
        .values({
          unitId: unit.id,
          siteId,
          recordedBy: user.id,
          occurredAt,
          enteredAt: now,
          idempotencyKey: input.idempotencyKey,
          contentHash: submissionHash(input),
        })
        .$returningId();
      await tx.insert(events).values(
        input.events.map((e) => ({
          ...eventRow(e),
          unitId: unit.id,
          visitId: inserted.id,
          siteId,
          recordedBy: user.id,
          occurredAt,
          enteredAt: now,
        })),
      );
      const statusChange = input.events.findLast((e) => e.kind === 'status_change');
      const newStatus =
        statusChange?.kind === 'status_change' && statusChange.status !== unit.status ? statusChange.status : null;
      if (newStatus) {
        await tx.update(units).set({ status: newStatus, updatedAt: now }).where(eq(units.id, unit.id));
        await tx.insert(unitChanges).values({
          unitId: unit.id,
          userId: user.id,
          at: now,
          field: 'status',
          before: unit.status,
          after: newStatus,
        });
      }
      return {
        result: inserted.id,
        // Only refrigerant movements change the monthly made-up totals.
        movedVisitIds: input.events.some((e) => isMovement(e.kind)) ? [inserted.id] : [],
        unitChanged: newStatus != null,
      };
    });
    // A visit just recorded has no attachments yet: they are uploaded per event once its id is known.
    const evs = await eventDtos(ctx.db, await reads(ctx.db).visitEvents.execute({ visitId: written.result }), false);
    return {
      visitId: written.result,
      replayed: false,
      events: evs,
      stats: toStatsDto(written.stats, written.detail.detail),
    } satisfies RecordVisitResultDto;
  } catch (err) {
    // A concurrent retry with the same key lost the race on the unique index: hand back the first result.
    if (isDuplicateKeyError(err)) {
      const first = await replay(ctx.db, user, input);
      if (first) return first;
    }
    throw err;
  }
}

export async function voidEvent(ctx: AppContext, user: SessionUser, eventId: number, reason: string) {
  // An entry never moves to another unit, so which unit to lock can be read before the lock; all else is read after.
  const [found] = await ctx.db.select({ unitId: events.unitId }).from(events).where(eq(events.id, eventId));
  if (!found) throw notFound('No such entry.');
  let written;
  try {
    written = await writeUnit(ctx, found.unitId, async (tx, _locked, now) => {
      const [target] = await tx.select().from(events).where(eq(events.id, eventId));
      if (target.kind === 'void') throw conflict('A correction cannot itself be voided.');
      if (!can(user, 'void:event:any')) {
        if (!can(user, 'void:event:own')) throw forbidden('Your role cannot void entries.');
        if (target.recordedBy !== user.id) throw forbidden('You can void only entries you recorded.');
        if (now.getTime() - target.enteredAt.getTime() > VOID_WINDOW_HOURS * 3600 * 1000) {
          throw forbidden(
            `Entries can be voided by their author within ${VOID_WINDOW_HOURS} hours; ask a fleet engineer.`,
          );
        }
      }
      const [already] = await tx.select({ id: events.id }).from(events).where(eq(events.voidsEventId, eventId));
      if (already) throw conflict('This entry is already voided.');
      await tx.insert(events).values({
        unitId: target.unitId,
        siteId: target.siteId,
        recordedBy: user.id,
        kind: 'void',
        occurredAt: now,
        enteredAt: now,
        voidsEventId: eventId,
        note: reason,
      });
      return { result: null, movedVisitIds: target.visitId != null && isMovement(target.kind) ? [target.visitId] : [] };
    });
  } catch (err) {
    // The unique key on the voided entry is the last guard against two voids of one entry.
    if (isDuplicateKeyError(err)) throw conflict('This entry is already voided.');
    throw err;
  }
  const [dto] = await eventDtos(ctx.db, await eventQuery(ctx.db, eq(events.id, eventId)));
  return { event: dto, stats: toStatsDto(written.stats, written.detail.detail) };
}

// --- reading ------------------------------------------------------------------------------------------------

const voider = alias(events, 'voider');
const voiderUser = alias(users, 'voider_user');

/** The event list's query up to its order: each entry with its site, author and the void that struck it out, if any. */
function eventQuery(db: DbOrTx, where: SQL, forceIndex?: string) {
  return db
    .select({
      e: events,
      hasFiles: sql<number>`EXISTS (SELECT 1 FROM ${attachments} WHERE ${attachments.eventId} = ${events.id})`,
      siteName: sites.name,
      userName: users.name,
      voidId: voider.id,
      voidAt: voider.enteredAt,
      voidReason: voider.note,
      voidBy: voider.recordedBy,
      voidByName: voiderUser.name,
    })
    .from(events, forceIndex ? { forceIndex } : undefined)
    .innerJoin(users, eq(users.id, events.recordedBy))
    .leftJoin(sites, eq(sites.id, events.siteId))
    .leftJoin(voider, eq(voider.voidsEventId, events.id))
    .leftJoin(voiderUser, eq(voiderUser.id, voider.recordedBy))
    .where(where)
    .orderBy(desc(events.occurredAt), desc(events.id))
    .$dynamic();
}
type EventRow = Awaited<ReturnType<typeof eventQuery>>[number];

const notVoidMarker = sql`${events.kind} <> 'void'`;
// Forced: with sampled statistics the optimizer may start from users and read a person's whole history.
const UNIT_TIME_INDEX = 'events_unit_time_idx';

/** The reads every unit page and visit write makes, built once per database (Drizzle's prepared queries). */
function prepareReads(db: Db) {
  const ph = sql.placeholder;
  return {
    unitWithStats: db
      .select({ id: units.id, stats: unitStats, detail: unitStatsDetail.detail })
      .from(units)
      .leftJoin(unitStats, eq(unitStats.unitId, units.id))
      .leftJoin(unitStatsDetail, eq(unitStatsDetail.unitId, units.id))
      .where(eq(units.id, ph('unitId')))
      .prepare(),
    firstHistoryPage: eventQuery(db, and(eq(events.unitId, ph('unitId')), notVoidMarker)!, UNIT_TIME_INDEX)
      .limit(ph('limit'))
      .prepare(),
    visitEvents: eventQuery(db, eq(events.visitId, ph('visitId'))).prepare(),
    visitByKey: db
      .select()
      .from(visits)
      .where(eq(visits.idempotencyKey, ph('key')))
      .prepare(),
  };
}
const preparedReads = new WeakMap<Db, ReturnType<typeof prepareReads>>();
function reads(db: Db) {
  let r = preparedReads.get(db);
  if (!r) preparedReads.set(db, (r = prepareReads(db)));
  return r;
}

async function eventDtos(db: DbOrTx, rows: EventRow[], withAttachments = true): Promise<EventDto[]> {
  // Most entries carry no files: the list of those that do saves a query on most pages.
  const ids = withAttachments ? rows.filter((r) => Number(r.hasFiles)).map((r) => r.e.id) : [];
  const files = ids.length ? await db.select().from(attachments).where(inArray(attachments.eventId, ids)) : [];
  const byEvent = new Map<number, AttachmentDto[]>();
  for (const f of files) {
    const list = byEvent.get(f.eventId) ?? [];
    list.push(attachmentDto(f));
    byEvent.set(f.eventId, list);
  }
  return rows.map(({ e, siteName, userName, voidId, voidAt, voidReason, voidBy, voidByName }) => ({
    id: e.id,
    unitId: e.unitId,
    visitId: e.visitId,
    kind: e.kind,
    occurredAt: e.occurredAt.toISOString(),
    enteredAt: e.enteredAt.toISOString(),
    site: e.siteId != null && siteName != null ? { id: e.siteId, name: siteName } : null,
    recordedBy: { id: e.recordedBy, name: userName },
    kg: e.kg,
    cylinder: e.cylinder,
    reusedRecovered: e.reusedRecovered == null ? null : Boolean(e.reusedRecovered),
    excludedFromLeakRate: e.excludedFromLeakRate == null ? null : Boolean(e.excludedFromLeakRate),
    method: e.method,
    leakFound: e.leakFound == null ? null : Boolean(e.leakFound),
    location: e.location,
    action: e.action,
    verified: e.verified == null ? null : Boolean(e.verified),
    passed: e.passed == null ? null : Boolean(e.passed),
    suctionKPaG: e.suctionKPaG,
    dischargeKPaG: e.dischargeKPaG,
    ambientC: e.ambientC,
    setPointC: e.setPointC,
    supplyAirC: e.supplyAirC,
    returnAirC: e.returnAirC,
    sightGlass: e.sightGlass,
    details: e.details ?? null,
    note: e.note,
    voidsEventId: e.voidsEventId,
    voided:
      voidId != null && voidAt && voidBy
        ? {
            by: { id: voidBy, name: voidByName ?? '' },
            at: voidAt.toISOString(),
            reason: voidReason ?? '',
            eventId: voidId,
          }
        : null,
    attachments: byEvent.get(e.id) ?? [],
  }));
}

export function attachmentDto(f: typeof attachments.$inferSelect): AttachmentDto {
  return {
    id: f.id,
    mimeType: f.mimeType,
    sizeBytes: f.sizeBytes,
    originalName: f.originalName,
    url: `/api/attachments/${f.id}/file`,
    thumbnailUrl: f.thumbnailKey ? `/api/attachments/${f.id}/thumbnail` : null,
  };
}

async function requireUnit(db: DbOrTx, unitId: number) {
  const [unit] = await db.select({ id: units.id }).from(units).where(eq(units.id, unitId));
  if (!unit) throw notFound('No such unit.');
}

export async function getUnitHistory(
  db: Db,
  unitId: number,
  before?: number,
  limit = HISTORY_PAGE_SIZE,
): Promise<UnitHistoryDto> {
  await requireUnit(db, unitId);
  return historyPage(db, unitId, before, limit);
}

async function historyPage(db: Db, unitId: number, before: number | undefined, limit: number): Promise<UnitHistoryDto> {
  let rows: EventRow[];
  if (!before) {
    rows = await reads(db).firstHistoryPage.execute({ unitId, limit: limit + 1 });
  } else {
    // The list runs newest first by when the work happened; the cursor is the last event shown, so entries recorded
    // late for an earlier date are neither skipped nor repeated.
    const [cursor] = await db
      .select({ at: events.occurredAt })
      .from(events)
      .where(and(eq(events.id, before), eq(events.unitId, unitId)));
    if (!cursor)
      throw badRequest('That page of the history no longer exists; reload the list.', { before: 'Unknown entry' });
    const after = or(lt(events.occurredAt, cursor.at), and(eq(events.occurredAt, cursor.at), lt(events.id, before)));
    rows = await eventQuery(db, and(eq(events.unitId, unitId), notVoidMarker, after)!, UNIT_TIME_INDEX).limit(
      limit + 1,
    );
  }
  const list = await eventDtos(db, rows);
  const more = list.length > limit;
  const page = more ? list.slice(0, limit) : list;
  return { events: page, nextBefore: more ? page[page.length - 1].id : null };
}

/** The unit page's first read: the figures and the first page of the history. */
export async function getUnitOverview(db: Db, unitId: number): Promise<UnitOverviewDto> {
  const [found] = await reads(db).unitWithStats.execute({ unitId });
  if (!found) throw notFound('No such unit.');
  const history = await historyPage(db, unitId, undefined, HISTORY_PAGE_SIZE);
  return { stats: found.stats ? toStatsDto(found.stats, found.detail) : null, history };
}

/** Every event of the unit, oldest first, compact; and the pressure snapshots the engine derives from them now. */
export async function getUnitTimeline(db: Db, unitId: number, now: Date, settings: Settings): Promise<UnitTimelineDto> {
  const [unit] = await db
    .select({
      refrigerant: units.refrigerant,
      nominalChargeKg: units.nominalChargeKg,
      commissionedOn: units.commissionedOn,
      createdAt: units.createdAt,
    })
    .from(units)
    .where(eq(units.id, unitId));
  if (!unit) throw notFound('No such unit.');
  const rows = await db
    .select({
      id: events.id,
      voided: sql<number>`EXISTS (SELECT 1 FROM events v WHERE v.voids_event_id = \`events\`.\`id\`)`,
      ...ENGINE_EVENT_COLUMNS,
    })
    .from(events)
    .where(and(eq(events.unitId, unitId), sql`${events.kind} <> 'void'`))
    .orderBy(events.occurredAt, events.id);
  const counted = rows.filter((r) => !Number(r.voided)).flatMap((r) => toEngineEvent(r) ?? []);
  let snapshots: UnitTimelineDto['snapshots'] = [];
  try {
    ({ snapshots } = computeUnitStats(engineUnit(unit), counted, now.toISOString(), settings));
  } catch {
    // A record the engine cannot compute still has a timeline: its entries, without derived readings (the unit's
    // figures say why).
  }
  return {
    events: rows.map((r) => ({
      id: r.id,
      visitId: r.visitId,
      kind: r.kind,
      occurredAt: r.occurredAt.toISOString(),
      kg: r.kg,
      leakFound: r.leakFound == null ? null : Boolean(r.leakFound),
      location: r.location,
      verified: r.verified == null ? null : Boolean(r.verified),
      passed: r.passed == null ? null : Boolean(r.passed),
      suctionKPaG: r.suctionKPaG,
      dischargeKPaG: r.dischargeKPaG,
      ambientC: r.ambientC,
      sightGlass: r.sightGlass,
      voided: Boolean(Number(r.voided)),
    })),
    snapshots,
  };
}
