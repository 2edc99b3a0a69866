// The cylinder register: registering, listing with each cylinder's ledger, weighing (the cylinder's row locked, like
// every charge from it), status changes, and quarantine, which marks every unit charged from the cylinder.
import { randomBytes } from 'node:crypto';
import { and, asc, desc, eq, inArray, like, or, sql, type SQL } from 'drizzle-orm';
import type { DbOrTx, Tx } from '../../db/client';
import { cylinderMoves, cylinders, cylinderWeighings, events, sites, units, users, visits } from '../../db/schema';
import { badRequest, conflict, notFound } from '../../lib/http-error';
import { isDuplicateKeyError } from '../../lib/db-errors';
import { retryTransaction } from '../../lib/retry';
import type { AppContext } from '../../lib/app-context';
import type { SessionUser } from '../../lib/session';
import { WRITE_ISOLATION, writeUnit } from '../../lib/record/write-path';
import { lockCylinders } from '../../lib/record/cylinder-moves';
import { cylinderLedger } from '../../../shared/domain/cylinders';
import { MAX_NOTE_LENGTH } from '../../../shared/schemas/history';
import {
  MAX_REGISTER_PAGE,
  cylinderSettingsOf,
  type CreateCylinderInput,
  type CylinderDetailDto,
  type CylinderDto,
  type CylinderListDto,
  type CylinderListQuery,
  type CylinderMoveDto,
  type CylinderStatusChangeInput,
  type QuarantineResultDto,
  type WeighingInput,
} from '../../../shared/schemas/cylinders';

type CylinderRow = typeof cylinders.$inferSelect;
type Ledgers = Awaited<ReturnType<typeof ledgersOf>>;

export const cylinderLabelUrl = (publicUrl: string, code: string) => `${publicUrl}/c/${encodeURIComponent(code)}`;
const notVoided = sql`NOT EXISTS (SELECT 1 FROM events v WHERE v.voids_event_id = ${cylinderMoves.eventId})`;

/** Weighings and counted moves of many cylinders in two queries, and their ledgers. */
async function ledgersOf(db: DbOrTx, rows: CylinderRow[], settings: object) {
  const ids = rows.map((r) => r.id);
  const out = new Map<number, CylinderDto['ledger']>();
  if (!ids.length) return out;
  const [ws, ms] = await Promise.all([
    db
      .select({ id: cylinderWeighings.cylinderId, at: cylinderWeighings.weighedAt, grossKg: cylinderWeighings.grossKg })
      .from(cylinderWeighings)
      .where(inArray(cylinderWeighings.cylinderId, ids)),
    db
      .select({
        id: cylinderMoves.cylinderId,
        at: cylinderMoves.occurredAt,
        kg: cylinderMoves.kg,
        direction: cylinderMoves.direction,
      })
      .from(cylinderMoves)
      .where(and(inArray(cylinderMoves.cylinderId, ids), notVoided)),
  ]);
  const opts = cylinderSettingsOf(settings);
  for (const r of rows) {
    out.set(
      r.id,
      cylinderLedger(
        {
          kind: r.kind,
          tareKg: r.tareKg,
          capacityKg: r.capacityKg,
          weighings: ws.filter((w) => w.id === r.id).map((w) => ({ at: w.at.toISOString(), grossKg: w.grossKg })),
          moves: ms
            .filter((m) => m.id === r.id)
            .map((m) => ({ at: m.at.toISOString(), kg: m.kg, direction: m.direction })),
        },
        opts,
      ),
    );
  }
  return out;
}

function toDto(r: CylinderRow & { siteName: string | null }, ledgers: Ledgers, publicUrl: string): CylinderDto {
  return {
    id: r.id,
    code: r.code,
    kind: r.kind,
    refrigerant: r.refrigerant,
    tareKg: r.tareKg,
    capacityKg: r.capacityKg,
    supplier: r.supplier,
    lot: r.lot,
    gasOrigin: r.gasOrigin,
    site: r.siteId != null ? { id: r.siteId, name: r.siteName ?? '' } : null,
    status: r.status,
    notes: r.notes,
    quarantine:
      r.quarantinedAt && r.status === 'quarantined'
        ? { at: r.quarantinedAt.toISOString(), reason: r.quarantineReason ?? '', by: r.quarantinedBy ?? '' }
        : null,
    labelUrl: cylinderLabelUrl(publicUrl, r.code),
    createdAt: r.createdAt.toISOString(),
    ledger: ledgers.get(r.id)!,
  };
}

function selectCylinders(db: DbOrTx, where: SQL | undefined) {
  return db
    .select({ c: cylinders, siteName: sites.name })
    .from(cylinders)
    .leftJoin(sites, eq(sites.id, cylinders.siteId))
    .where(where)
    .orderBy(asc(cylinders.code));
}

async function dtos(ctx: AppContext, db: DbOrTx, where: SQL | undefined, limit = MAX_REGISTER_PAGE) {
  const rows = (await selectCylinders(db, where).limit(limit)).map((r) => ({ ...r.c, siteName: r.siteName }));
  const settings = await ctx.caches.settings.get(db);
  const ledgers = await ledgersOf(db, rows, settings);
  return rows.map((r) => toDto(r, ledgers, ctx.publicUrl));
}

export async function listCylinders(ctx: AppContext, q: CylinderListQuery): Promise<CylinderListDto> {
  const w: SQL[] = [];
  if (q.siteId) w.push(eq(cylinders.siteId, q.siteId));
  if (q.kind) w.push(eq(cylinders.kind, q.kind));
  if (q.refrigerant) w.push(eq(cylinders.refrigerant, q.refrigerant));
  if (q.usable) w.push(inArray(cylinders.status, ['full', 'in_use', 'empty']));
  if (q.q) {
    const p = `${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    w.push(or(like(cylinders.code, p), like(cylinders.lot, p))!);
  }
  const list = await dtos(ctx, ctx.db, w.length ? and(...w) : undefined);
  const opts = cylinderSettingsOf(await ctx.caches.settings.get(ctx.db));
  return { cylinders: list, ...opts };
}

async function oneDto(ctx: AppContext, db: DbOrTx, where: SQL): Promise<CylinderDto> {
  const [dto] = await dtos(ctx, db, where, 1);
  if (!dto) throw notFound('No such cylinder.');
  return dto;
}

export async function getCylinder(ctx: AppContext, id: number): Promise<CylinderDetailDto> {
  const cylinder = await oneDto(ctx, ctx.db, eq(cylinders.id, id));
  const [weighings, moves, marks] = await Promise.all([
    ctx.db
      .select({ w: cylinderWeighings, name: users.name })
      .from(cylinderWeighings)
      .innerJoin(users, eq(users.id, cylinderWeighings.recordedBy))
      .where(eq(cylinderWeighings.cylinderId, id))
      .orderBy(desc(cylinderWeighings.weighedAt), desc(cylinderWeighings.id)),
    cylinderMovesOf(ctx.db, eq(cylinderMoves.cylinderId, id)),
    quarantineMarks(ctx.db, id),
  ]);
  return {
    cylinder,
    weighings: weighings.map(({ w, name }) => ({
      id: w.id,
      grossKg: w.grossKg,
      netKg: Math.round((w.grossKg - cylinder.tareKg) * 1000) / 1000,
      weighedAt: w.weighedAt.toISOString(),
      recordedBy: { id: w.recordedBy, name },
      note: w.note,
    })),
    moves,
    quarantinedUnits: marks,
  };
}

export async function getCylinderByCode(ctx: AppContext, code: string): Promise<CylinderDto> {
  return oneDto(ctx, ctx.db, eq(cylinders.code, code));
}

/** The visits' movements through cylinders, newest first (voided ones too, marked). */
export async function cylinderMovesOf(db: DbOrTx, where: SQL, limit = 1000): Promise<CylinderMoveDto[]> {
  const rows = await db
    .select({
      m: cylinderMoves,
      kind: events.kind,
      siteId: events.siteId,
      siteName: sites.name,
      techId: users.id,
      techName: users.name,
      containerNumber: units.containerNumber,
      voided: sql<number>`NOT ${notVoided}`,
    })
    .from(cylinderMoves)
    .innerJoin(events, eq(events.id, cylinderMoves.eventId))
    .innerJoin(units, eq(units.id, cylinderMoves.unitId))
    .innerJoin(users, eq(users.id, events.recordedBy))
    .leftJoin(sites, eq(sites.id, events.siteId))
    .where(where)
    .orderBy(desc(cylinderMoves.occurredAt), desc(cylinderMoves.id))
    .limit(limit);
  return rows.map((r) => ({
    eventId: r.m.eventId,
    unitId: r.m.unitId,
    containerNumber: r.containerNumber,
    kind: r.kind,
    direction: r.m.direction,
    kg: r.m.kg,
    occurredAt: r.m.occurredAt.toISOString(),
    site: r.siteId != null ? { id: r.siteId, name: r.siteName ?? '' } : null,
    technician: { id: r.techId, name: r.techName },
    voided: Boolean(Number(r.voided)),
  }));
}

async function quarantineMarks(db: DbOrTx, cylinderId: number) {
  const rows = await db
    .select({ unitId: events.unitId, containerNumber: units.containerNumber, at: sql<Date>`MAX(${events.enteredAt})` })
    .from(events)
    .innerJoin(units, eq(units.id, events.unitId))
    .where(
      and(eq(events.kind, 'note'), sql`JSON_EXTRACT(${events.details}, '$.quarantine.cylinderId') = ${cylinderId}`),
    )
    .groupBy(events.unitId, units.containerNumber)
    .orderBy(asc(units.containerNumber));
  return rows.map((r) => ({
    unitId: r.unitId,
    containerNumber: r.containerNumber,
    markedAt: new Date(r.at).toISOString(),
  }));
}

async function requireSite(tx: DbOrTx, siteId: number | null | undefined) {
  if (siteId == null) return;
  const [site] = await tx.select({ id: sites.id }).from(sites).where(eq(sites.id, siteId));
  if (!site) throw badRequest('Choose a known site.', { siteId: 'Unknown site' });
}

export type NewCylinder = Omit<CreateCylinderInput, 'siteId'> & { siteId: number | null };

/** Inserts cylinders in `tx` (their first weighings too); a number already in the register is a 409 naming it. */
export async function insertCylinders(
  tx: Tx,
  user: SessionUser,
  list: readonly NewCylinder[],
  now: Date,
): Promise<number[]> {
  const ids: number[] = [];
  for (const c of list) {
    // A cylinder registered without a number gets one from its id; a placeholder holds the unique key until then.
    const code = c.code ?? `TMP-${randomBytes(8).toString('hex')}`;
    let id: number;
    try {
      [{ id }] = await tx
        .insert(cylinders)
        .values({
          code,
          kind: c.kind,
          refrigerant: c.refrigerant,
          tareKg: c.tareKg,
          capacityKg: c.capacityKg,
          supplier: c.supplier ?? null,
          lot: c.lot ?? null,
          gasOrigin: c.kind === 'new' ? (c.gasOrigin ?? null) : null,
          siteId: c.siteId,
          status: c.status ?? (c.kind === 'new' ? 'full' : 'empty'),
          notes: c.notes ?? null,
          createdBy: user.id,
          createdAt: now,
          updatedAt: now,
        })
        .$returningId();
    } catch (err) {
      if (isDuplicateKeyError(err)) {
        throw conflict(`Cylinder ${code} is already in the register.`, { code: 'Already in the register' });
      }
      throw err;
    }
    if (!c.code)
      await tx
        .update(cylinders)
        .set({ code: `CY${String(id).padStart(5, '0')}` })
        .where(eq(cylinders.id, id));
    if (c.grossKg != null) {
      await tx
        .insert(cylinderWeighings)
        .values({ cylinderId: id, grossKg: c.grossKg, weighedAt: now, recordedBy: user.id, note: 'At registration' });
    }
    ids.push(id);
  }
  return ids;
}

export async function createCylinder(ctx: AppContext, user: SessionUser, input: CreateCylinderInput) {
  const id = await ctx.db.transaction(async (tx) => {
    await requireSite(tx, input.siteId);
    const [created] = await insertCylinders(tx, user, [{ ...input, siteId: input.siteId ?? null }], ctx.clock.now());
    return created;
  });
  return getCylinder(ctx, id);
}

/** A weighing, with the cylinder's row locked so that it queues with visits charging from the same cylinder. */
export async function addWeighing(ctx: AppContext, user: SessionUser, id: number, input: WeighingInput) {
  await retryTransaction(() =>
    ctx.db.transaction(async (tx) => {
      const c = (await lockCylinders(tx, [id])).get(id);
      if (!c) throw notFound('No such cylinder.');
      if (c.status === 'sent_for_reclaim') throw conflict(`Cylinder ${c.code} was sent for reclaim.`);
      const now = ctx.clock.now();
      const at = input.weighedAt ? new Date(input.weighedAt) : now;
      if (at.getTime() > now.getTime() + 5 * 60_000) {
        throw badRequest('A weighing cannot be in the future.', { weighedAt: 'In the future' });
      }
      // A scale reads a little either side; a gross weight well below the tare is a typo or another cylinder.
      if (input.grossKg < c.tareKg - 0.2) {
        throw badRequest(`The tare of ${c.code} is ${c.tareKg} kg; a gross weight below it is not possible.`, {
          grossKg: 'Below the tare',
        });
      }
      await tx.insert(cylinderWeighings).values({
        cylinderId: id,
        grossKg: input.grossKg,
        weighedAt: at,
        recordedBy: user.id,
        note: input.note ?? null,
      });
    }, WRITE_ISOLATION),
  );
  return getCylinder(ctx, id);
}

/**
 * A status change. Quarantine records who, when and why on the cylinder, then marks every unit charged from it with
 * a note through the unit write path, one unit at a time; each mark has its own key, so repeating the request
 * completes marks a failure left out and never writes one twice.
 */
export async function changeStatus(
  ctx: AppContext,
  user: SessionUser,
  id: number,
  input: CylinderStatusChangeInput,
): Promise<QuarantineResultDto> {
  const row = await retryTransaction(() =>
    ctx.db.transaction(async (tx) => {
      const c = (await lockCylinders(tx, [id])).get(id);
      if (!c) throw notFound('No such cylinder.');
      await requireSite(tx, input.siteId);
      const now = ctx.clock.now();
      const quarantine = input.status === 'quarantined';
      if (c.status === 'quarantined' && !quarantine && !(input.reason && input.reason.length >= 3)) {
        throw badRequest('Say why the cylinder is released from quarantine.', { reason: 'Say why' });
      }
      const keep = quarantine && c.status === 'quarantined';
      await tx
        .update(cylinders)
        .set({
          status: input.status,
          siteId: input.siteId === undefined ? c.siteId : input.siteId,
          quarantinedAt: quarantine ? (keep ? c.quarantinedAt : now) : c.quarantinedAt,
          quarantineReason: quarantine ? (keep ? c.quarantineReason : input.reason!) : c.quarantineReason,
          quarantinedBy: quarantine ? (keep ? c.quarantinedBy : user.id) : c.quarantinedBy,
          updatedAt: now,
        })
        .where(eq(cylinders.id, id));
      return (await tx.select().from(cylinders).where(eq(cylinders.id, id)))[0];
    }, WRITE_ISOLATION),
  );
  let unitIds: number[] = [];
  if (row.status === 'quarantined') unitIds = await markChargedUnits(ctx, user, row);
  return { cylinder: await oneDto(ctx, ctx.db, eq(cylinders.id, id)), unitsMarked: unitIds.length, unitIds };
}

/**
 * Marks each unit charged from a quarantined cylinder: a note whose details carry `quarantine: { cylinderId, code,
 * reason, since }`, the mark the depot's quarantine of units (issue 23) can build on.
 */
async function markChargedUnits(ctx: AppContext, user: SessionUser, c: CylinderRow): Promise<number[]> {
  const charged = await ctx.db
    .selectDistinct({ unitId: cylinderMoves.unitId })
    .from(cylinderMoves)
    .where(and(eq(cylinderMoves.cylinderId, c.id), eq(cylinderMoves.direction, 'out'), notVoided))
    .orderBy(asc(cylinderMoves.unitId));
  const since = c.quarantinedAt ?? ctx.clock.now();
  const marked: number[] = [];
  for (const { unitId } of charged) {
    const key = `cylq-${c.id}-${since.getTime()}-${unitId}`;
    const [done] = await ctx.db.select({ id: visits.id }).from(visits).where(eq(visits.idempotencyKey, key));
    if (!done) {
      try {
        await writeUnit(ctx, unitId, async (tx, { unit }, now) => {
          const [v] = await tx
            .insert(visits)
            .values({
              unitId,
              siteId: unit.siteId,
              recordedBy: user.id,
              occurredAt: now,
              enteredAt: now,
              idempotencyKey: key,
            })
            .$returningId();
          const [kg] = await tx
            .select({ kg: sql<number>`COALESCE(SUM(${cylinderMoves.kg}), 0)` })
            .from(cylinderMoves)
            .where(and(eq(cylinderMoves.cylinderId, c.id), eq(cylinderMoves.unitId, unitId), notVoided));
          const note = `Quarantine: charged from cylinder ${c.code} (${Number(Number(kg.kg).toFixed(3))} kg), which was quarantined. Reason: ${c.quarantineReason ?? ''}`;
          await tx.insert(events).values({
            unitId,
            visitId: v.id,
            siteId: unit.siteId,
            recordedBy: user.id,
            kind: 'note',
            occurredAt: now,
            enteredAt: now,
            note: note.slice(0, MAX_NOTE_LENGTH),
            details: {
              quarantine: {
                cylinderId: c.id,
                code: c.code,
                reason: c.quarantineReason,
                since: since.toISOString(),
              },
            },
          });
          return { result: null };
        });
      } catch (err) {
        // A concurrent repeat of the request wrote this mark first.
        if (!isDuplicateKeyError(err)) throw err;
      }
    }
    marked.push(unitId);
  }
  return marked;
}
