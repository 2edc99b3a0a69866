// A unit's whole record as one export: identity, figures with their reasons, every event (voids and voided entries
// included) with who, when and where, the register cylinders of its refrigerant movements and its attachments. The
// checksum is the SHA-256 of the record's RFC 8785 canonical JSON, so anyone holding the JSON can check a PDF's footer.
import { createHash } from 'node:crypto';
import canonicalize from 'canonicalize';
import { and, asc, eq, gte, inArray, lt, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/mysql-core';
import type { Db } from '../../db/client';
import { attachments, cylinderMoves, cylinders, events, sites, users } from '../../db/schema';
import { dayPlus } from '../../lib/dates';
import { loadUnitWithStats, toStatsDto } from '../../lib/record/stats';
import { gwp } from '../../../shared/domain';
import {
  HANDOVER_FORMAT,
  type HandoverEvent,
  type HandoverExport,
  type HandoverQuery,
  type HandoverRecord,
} from '../../../shared/schemas/handover';

const voider = alias(events, 'voider');
const voiderUser = alias(users, 'voider_user');

export function recordChecksum(record: HandoverRecord): string {
  return createHash('sha256').update(canonicalize(record)!).digest('hex');
}

const bool = (v: boolean | number | null) => (v == null ? null : Boolean(v));

export async function buildHandover(db: Db, unitId: number, q: HandoverQuery, now: Date): Promise<HandoverExport> {
  const found = await loadUnitWithStats(db, unitId);
  const where: SQL[] = [eq(events.unitId, unitId)];
  if (q.from) where.push(gte(events.occurredAt, new Date(`${q.from}T00:00:00Z`)));
  if (q.to) where.push(lt(events.occurredAt, new Date(`${dayPlus(q.to, 1)}T00:00:00Z`)));
  const rows = await db
    .select({
      e: events,
      siteName: sites.name,
      userName: users.name,
      certificate: users.certificateNumber,
      voidId: voider.id,
      voidAt: voider.enteredAt,
      voidReason: voider.note,
      voidByName: voiderUser.name,
      cylCode: cylinders.code,
      cylKind: cylinders.kind,
      cylLot: cylinders.lot,
      cylOrigin: cylinders.gasOrigin,
    })
    .from(events)
    .innerJoin(users, eq(users.id, events.recordedBy))
    .leftJoin(sites, eq(sites.id, events.siteId))
    .leftJoin(voider, eq(voider.voidsEventId, events.id))
    .leftJoin(voiderUser, eq(voiderUser.id, voider.recordedBy))
    .leftJoin(cylinderMoves, eq(cylinderMoves.eventId, events.id))
    .leftJoin(cylinders, eq(cylinders.id, cylinderMoves.cylinderId))
    .where(and(...where))
    .orderBy(asc(events.occurredAt), asc(events.id));
  const ids = rows.map((r) => r.e.id);
  const files = ids.length
    ? await db.select().from(attachments).where(inArray(attachments.eventId, ids)).orderBy(asc(attachments.id))
    : [];
  const list: HandoverEvent[] = rows.map((r) => ({
    id: r.e.id,
    visitId: r.e.visitId,
    kind: r.e.kind,
    occurredAt: r.e.occurredAt.toISOString(),
    enteredAt: r.e.enteredAt.toISOString(),
    site: r.siteName ?? null,
    recordedBy: { id: r.e.recordedBy, name: r.userName, certificate: r.certificate ?? null },
    kg: r.e.kg,
    cylinder: r.e.cylinder,
    registerCylinder: r.cylCode
      ? { code: r.cylCode, kind: r.cylKind!, lot: r.cylLot ?? null, gasOrigin: r.cylOrigin ?? null }
      : null,
    reusedRecovered: bool(r.e.reusedRecovered),
    method: r.e.method,
    leakFound: bool(r.e.leakFound),
    location: r.e.location,
    action: r.e.action,
    verified: bool(r.e.verified),
    passed: bool(r.e.passed),
    suctionKPaG: r.e.suctionKPaG,
    dischargeKPaG: r.e.dischargeKPaG,
    ambientC: r.e.ambientC,
    setPointC: r.e.setPointC,
    sightGlass: r.e.sightGlass,
    note: r.e.note,
    details: r.e.details ?? null,
    voidsEventId: r.e.voidsEventId,
    voided:
      r.voidId != null && r.voidAt
        ? { eventId: r.voidId, by: r.voidByName ?? '', at: r.voidAt.toISOString(), reason: r.voidReason ?? '' }
        : null,
    attachments: files
      .filter((f) => f.eventId === r.e.id)
      .map((f) => ({
        id: f.id,
        name: f.originalName,
        mimeType: f.mimeType,
        sizeBytes: f.sizeBytes,
        // Content-addressed storage: the key is the SHA-256 of the bytes.
        sha256: f.storageKey.replace(/^.*\//, ''),
      })),
  }));
  const counted = list.filter((e) => !e.voided && e.kind !== 'void');
  const sum = (kinds: string[]) =>
    Math.round(counted.filter((e) => kinds.includes(e.kind)).reduce((s, e) => s + (e.kg ?? 0), 0) * 1000) / 1000;
  const u = found.u;
  const record: HandoverRecord = {
    unit: {
      id: u.id,
      containerNumber: u.containerNumber,
      refrigerant: u.refrigerant,
      nominalChargeKg: u.nominalChargeKg,
      commissionedOn: u.commissionedOn,
      site: found.siteName ?? null,
      status: u.status,
      machinerySerial: u.machinerySerial,
      model: u.model,
      manufactureYear: u.manufactureYear,
      gwp: gwp(u.refrigerant),
      co2eTonnes: found.stats?.co2eTonnes ?? 0,
    },
    figures: found.stats ? toStatsDto(found.stats, found.detail) : null,
    events: list,
    totals: {
      addedKg: sum(['top_up', 'recharge']),
      recoveredKg: sum(['recovery']),
      events: list.filter((e) => e.kind !== 'void').length,
      voided: list.filter((e) => e.voided).length,
    },
  };
  return {
    format: HANDOVER_FORMAT,
    producedAt: now.toISOString(),
    range: { from: q.from ?? null, to: q.to ?? null },
    checksum: recordChecksum(record),
    record,
  };
}

/** Small images of a record's photos, for the PDF (a missing stored file is left out, not an error). */
export async function thumbnailsOf(
  db: Db,
  storage: { get(key: string): Promise<Buffer | null> },
  attachmentIds: number[],
): Promise<Map<number, Buffer>> {
  const out = new Map<number, Buffer>();
  if (!attachmentIds.length) return out;
  const rows = await db
    .select({ id: attachments.id, key: attachments.thumbnailKey })
    .from(attachments)
    .where(and(inArray(attachments.id, attachmentIds), sql`${attachments.thumbnailKey} IS NOT NULL`));
  for (const r of rows) {
    const bytes = await storage.get(r.key!);
    if (bytes) out.set(r.id, bytes);
  }
  return out;
}
