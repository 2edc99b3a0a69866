// Reading a unit's history: the event list page by page, the unit page's first read and the timeline.
import { and, desc, eq, inArray, lt, or, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/mysql-core';
import type { Db, DbOrTx } from '../../db/client';
import { attachments, events, sites, units, unitStats, unitStatsDetail, users, visits } from '../../db/schema';
import { badRequest, notFound } from '../../lib/http-error';
import { engineUnit, ENGINE_EVENT_COLUMNS, toEngineEvent, toStatsDto } from '../../lib/record/stats';
import { computeUnitStats } from '../../../shared/domain';
import {
  HISTORY_PAGE_SIZE,
  OVERVIEWS_PAGE_SIZE,
  type AttachmentDto,
  type DepotPageDto,
  type DepotUnitDto,
  type EventDto,
  type UnitHistoryDto,
  type UnitOverviewDto,
  type UnitTimelineDto,
} from '../../../shared/schemas/history';
import type { Settings } from '../../../shared/schemas/settings';
import { attachmentDto, toEventDto } from './history.mapper';
const voider = alias(events, 'voider');
const voiderUser = alias(users, 'voider_user');

/** The event list's query up to its order: each entry with its site, author and the void that struck it out, if any. */
export function eventQuery(db: DbOrTx, where: SQL, forceIndex?: string) {
  return db
    .select({
      e: events,
      hasFiles: sql<number>`EXISTS (SELECT 1 FROM ${attachments} WHERE ${attachments.eventId} = ${events.id})`,
      siteName: sites.name,
      siteTimeZone: sites.timeZone,
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
export type EventRow = Awaited<ReturnType<typeof eventQuery>>[number];

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
export function reads(db: Db) {
  let r = preparedReads.get(db);
  if (!r) preparedReads.set(db, (r = prepareReads(db)));
  return r;
}

export async function eventDtos(db: DbOrTx, rows: EventRow[], withAttachments = true): Promise<EventDto[]> {
  // Most entries carry no files: the list of those that do saves a query on most pages.
  const ids = withAttachments ? rows.filter((r) => Number(r.hasFiles)).map((r) => r.e.id) : [];
  const files = ids.length ? await db.select().from(attachments).where(inArray(attachments.eventId, ids)) : [];
  const byEvent = new Map<number, AttachmentDto[]>();
  for (const f of files) {
    const list = byEvent.get(f.eventId) ?? [];
    list.push(attachmentDto(f));
    byEvent.set(f.eventId, list);
  }
  return rows.map((r) => toEventDto(r, byEvent.get(r.e.id) ?? []));
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

/** The unit a label's token belongs to (units are locked and read by id; the token only finds which). */
export async function unitIdByToken(db: DbOrTx, token: string): Promise<number> {
  const [found] = await db.select({ id: units.id }).from(units).where(eq(units.qrToken, token));
  if (!found) throw notFound('This label is not linked to any unit. It may have been replaced by a newer label.');
  return found.id;
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

/**
 * A page of a depot's units with their first read and their label's token, by unit id, for a phone that keeps them
 * for offline use (the phone is signed in with view:unit, which opens any of them by id or label anyway).
 */
export async function getDepotPage(db: Db, siteId: number, after: number): Promise<DepotPageDto> {
  const rows = await db
    .select({ id: units.id, qrToken: units.qrToken })
    .from(units)
    .where(and(eq(units.siteId, siteId), sql`${units.id} > ${after}`))
    .orderBy(units.id)
    .limit(OVERVIEWS_PAGE_SIZE + 1);
  const page = rows.slice(0, OVERVIEWS_PAGE_SIZE);
  const out: DepotUnitDto[] = [];
  for (const row of page)
    out.push({ unitId: row.id, qrToken: row.qrToken, overview: await getUnitOverview(db, row.id) });
  return { units: out, nextAfter: rows.length > OVERVIEWS_PAGE_SIZE ? page[page.length - 1].id : null };
}
