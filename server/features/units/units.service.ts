import { and, asc, count, desc, eq, like, min, sql, type SQL } from 'drizzle-orm';
import type { Db, DbOrTx } from '../../db/client';
import { events, sites, unitChanges, units, users } from '../../db/schema';
import { BEFORE_COMMISSIONING_MARGIN_DAYS } from '../../../shared/schemas/common';
import { isDuplicateKeyError } from '../../lib/db-errors';
import { badRequest, conflict, notFound } from '../../lib/http-error';
import { newToken } from '../../lib/ids';
import { formatContainerNumber } from '../../../shared/domain';
import {
  UNIT_FIELD_LABELS,
  UNIT_INPUT_FIELDS,
  type CreateUnitInput,
  type UnitChangeDto,
  type UnitDto,
  type UnitField,
  type UnitListDto,
  type UnitListQuery,
  type UpdateUnitInput,
} from '../../../shared/schemas/units';
import { newUnitRow } from '../../lib/record/new-unit';
import { toUnitDto } from './units.mapper';
import { registerNewUnits, writeUnit, WRITE_ISOLATION, type WriteContext } from '../../lib/record/write-path';
import { retryTransaction } from '../../lib/retry';
import { fmtIsoDay } from '../../../shared/format-dates';

const numberTaken = (containerNumber: string) =>
  conflict(`${formatContainerNumber(containerNumber)} is already registered.`, {
    containerNumber: 'Already registered',
  });

/** Refuses a container number another unit already has (409), before the unique index would. */
async function requireNumberFree(tx: DbOrTx, containerNumber: string) {
  const [taken] = await tx
    .select({ id: units.id })
    .from(units)
    .where(eq(units.containerNumber, containerNumber))
    .limit(1);
  if (taken) throw numberTaken(containerNumber);
}

const SORT_COLUMNS = {
  containerNumber: units.containerNumber,
  updatedAt: units.updatedAt,
  commissionedOn: units.commissionedOn,
  nominalChargeKg: units.nominalChargeKg,
} as const;

function selectUnitsWithSite(db: DbOrTx) {
  return db.select({ unit: units, site: sites }).from(units).leftJoin(sites, eq(units.siteId, sites.id));
}

async function findUnit(db: DbOrTx, where: SQL): Promise<UnitDto | null> {
  const [row] = await selectUnitsWithSite(db).where(where).limit(1);
  return row ? toUnitDto(row.unit, row.site) : null;
}

export async function listUnits(db: Db, q: UnitListQuery): Promise<UnitListDto> {
  const conditions: SQL[] = [];
  // q is letters and digits only (schema), so it cannot smuggle LIKE wildcards; a prefix LIKE uses the unique index.
  if (q.q) conditions.push(like(units.containerNumber, `${q.q}%`));
  if (q.siteId) conditions.push(eq(units.siteId, q.siteId));
  if (q.status) conditions.push(eq(units.status, q.status));
  if (q.refrigerant) conditions.push(eq(units.refrigerant, q.refrigerant));
  const where = conditions.length ? and(...conditions) : undefined;
  const order = q.dir === 'desc' ? desc : asc;
  const sortColumn = SORT_COLUMNS[q.sort];
  const [rows, [{ n }]] = await Promise.all([
    selectUnitsWithSite(db)
      .where(where)
      .orderBy(
        ...(q.sort === 'containerNumber' ? [order(sortColumn)] : [order(sortColumn), asc(units.containerNumber)]),
      )
      .limit(q.pageSize)
      .offset((q.page - 1) * q.pageSize),
    db.select({ n: count() }).from(units).where(where),
  ]);
  return { units: rows.map((r) => toUnitDto(r.unit, r.site)), total: Number(n), page: q.page, pageSize: q.pageSize };
}

export async function getUnit(db: DbOrTx, id: number): Promise<UnitDto> {
  const unit = await findUnit(db, eq(units.id, id));
  if (!unit) throw notFound('No such unit.');
  return unit;
}

export async function getUnitByToken(db: Db, token: string): Promise<UnitDto> {
  const unit = await findUnit(db, eq(units.qrToken, token));
  if (!unit) throw notFound('This label is not linked to any unit. It may have been replaced by a newer label.');
  return unit;
}

/** `containerNumber` is the validated 11-character form. */
export async function getUnitByNumber(db: Db, containerNumber: string): Promise<UnitDto> {
  const unit = await findUnit(db, eq(units.containerNumber, containerNumber));
  if (!unit) throw notFound(`No unit is registered as ${formatContainerNumber(containerNumber)}.`);
  return unit;
}

async function requireSite(tx: DbOrTx, siteId: number) {
  const [site] = await tx.select().from(sites).where(eq(sites.id, siteId));
  if (!site) throw badRequest('Choose an existing site.', { siteId: 'No such site' });
  return site;
}

/** Registers one unit and writes its first figures and a change record in the same transaction. */
export async function createUnit(ctx: WriteContext, actorId: string, input: CreateUnitInput): Promise<UnitDto> {
  try {
    return await retryTransaction(() =>
      ctx.db.transaction(async (tx) => {
        await requireNumberFree(tx, input.containerNumber);
        if (input.siteId != null) await requireSite(tx, input.siteId);
        const now = ctx.clock.now();
        const [{ id }] = await tx
          .insert(units)
          .values(newUnitRow(input, input.siteId ?? null, now))
          .$returningId();
        await registerNewUnits(tx, ctx, actorId, [id], now, 'Registered in the unit register');
        return getUnit(tx, id);
      }, WRITE_ISOLATION),
    );
  } catch (err) {
    if (isDuplicateKeyError(err)) throw numberTaken(input.containerNumber);
    throw err;
  } finally {
    ctx.caches.fleetSize.invalidate();
  }
}

type ChangeValue = string | number | null | undefined;
const asText = (v: ChangeValue) => (v === null || v === undefined ? null : String(v));

/** A commissioning date must not contradict the history: the same margin as a visit dated before it (the date rule). */
async function requireHistoryFits(tx: DbOrTx, unitId: number, commissionedOn: string) {
  const [{ first }] = await tx
    .select({ first: min(events.occurredAt) })
    .from(events)
    .where(
      and(
        eq(events.unitId, unitId),
        sql`${events.kind} <> 'void'`,
        sql`NOT EXISTS (SELECT 1 FROM events v WHERE v.voids_event_id = ${events.id})`,
      ),
    );
  if (!first) return;
  const firstDay = new Date(first).toISOString().slice(0, 10);
  if ((Date.parse(commissionedOn) - Date.parse(firstDay)) / 86_400_000 > BEFORE_COMMISSIONING_MARGIN_DAYS) {
    throw badRequest('The commissioning date contradicts the history.', {
      commissionedOn: `The history has entries from ${fmtIsoDay(firstDay)}; a commissioning date more than a year later cannot be right`,
    });
  }
}

/**
 * Edits a unit through the unit write path: each changed field leaves a change record (who, when, before → after),
 * and the figures are recomputed in the same transaction (refrigerant, charge and commissioning date feed them).
 */
export async function updateUnit(
  ctx: WriteContext,
  actorId: string,
  id: number,
  input: UpdateUnitInput,
): Promise<UnitDto> {
  try {
    const { result } = await writeUnit(ctx, id, async (tx, { unit: current }, now) => {
      if (input.containerNumber !== undefined && input.containerNumber !== current.containerNumber) {
        await requireNumberFree(tx, input.containerNumber);
      }
      if (input.commissionedOn && input.commissionedOn !== current.commissionedOn) {
        await requireHistoryFits(tx, id, input.commissionedOn);
      }
      const changes: { field: UnitField; before: string | null; after: string | null }[] = [];
      const set: Partial<typeof units.$inferInsert> = {};
      // The site is recorded by its code, below.
      const plain = UNIT_INPUT_FIELDS.filter((f): f is Exclude<typeof f, 'siteId'> => f !== 'siteId');
      for (const field of plain) {
        const next = input[field];
        if (next === undefined) continue;
        const before = asText(current[field] as ChangeValue);
        const after = asText(next);
        if (before === after) continue;
        changes.push({ field, before, after });
        Object.assign(set, { [field]: next });
      }
      if (input.siteId !== undefined && input.siteId !== current.siteId) {
        const beforeSite = current.siteId == null ? null : await requireSite(tx, current.siteId);
        const afterSite = input.siteId == null ? null : await requireSite(tx, input.siteId);
        // The history keeps the site's code as it was then, so it reads right after a site is renamed or removed.
        changes.push({ field: 'site', before: beforeSite?.code ?? null, after: afterSite?.code ?? null });
        set.siteId = input.siteId;
      }
      if (changes.length > 0) {
        set.updatedAt = now;
        await tx.update(units).set(set).where(eq(units.id, id));
        await tx.insert(unitChanges).values(changes.map((c) => ({ unitId: id, userId: actorId, at: now, ...c })));
      }
      return { result: await getUnit(tx, id), unitChanged: changes.length > 0 };
    });
    return result;
  } catch (err) {
    if (isDuplicateKeyError(err) && input.containerNumber) throw numberTaken(input.containerNumber);
    throw err;
  }
}

/** A new label code for a lost or damaged label; the old code stops working at once. */
export async function reissueQrToken(db: Db, actorId: string, now: Date, id: number): Promise<UnitDto> {
  return db.transaction(async (tx) => {
    const [current] = await tx.select().from(units).where(eq(units.id, id)).for('update');
    if (!current) throw notFound('No such unit.');
    await tx.update(units).set({ qrToken: newToken(), qrIssuedAt: now, updatedAt: now }).where(eq(units.id, id));
    await tx.insert(unitChanges).values({
      unitId: id,
      userId: actorId,
      at: now,
      field: 'qrIssuedAt',
      before: new Date(current.qrIssuedAt).toISOString(),
      after: now.toISOString(),
    });
    return getUnit(tx, id);
  });
}

export async function listUnitChanges(db: Db, id: number): Promise<UnitChangeDto[]> {
  const [exists] = await db.select({ id: units.id }).from(units).where(eq(units.id, id));
  if (!exists) throw notFound('No such unit.');
  const rows = await db
    .select({ change: unitChanges, userName: users.name })
    .from(unitChanges)
    .innerJoin(users, eq(unitChanges.userId, users.id))
    .where(eq(unitChanges.unitId, id))
    .orderBy(desc(unitChanges.at), desc(unitChanges.id));
  return rows.map(({ change: c, userName }) => ({
    id: c.id,
    at: new Date(c.at).toISOString(),
    field: c.field,
    label: UNIT_FIELD_LABELS[c.field as UnitField] ?? c.field,
    before: c.before,
    after: c.after,
    user: { id: c.userId, name: userName },
  }));
}
