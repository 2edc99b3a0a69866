// The refrigerant log an inspector asks for (Reg. (EU) No 517/2014 Art. 6, kept by 2024/573): quantities added and
// recovered with dates, who did it and their certificate, and the leak checks with their results. Voided entries
// are left out (and counted, so the page can say so).
import { and, count, desc, eq, gte, inArray, lt, or, sql, type SQL } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { events, sites, units, users, visits } from '../../db/schema';
import { co2eTonnes } from '../../../shared/domain';
import {
  LOG_ENTRY_KINDS,
  LOG_PAGE_SIZE,
  type LogEntryKind,
  type RefrigerantLogDto,
  type RefrigerantLogEntryDto,
  type RefrigerantLogQuery,
  type RefrigerantLogTotalsDto,
} from '../../../shared/schemas/refrigerant-log';
import type { Settings } from '../../../shared/schemas/settings';
import { JURISDICTION_RULE_WORDS } from '../../../shared/schemas/sites';
import { dayPlus } from '../../lib/dates';

const voided = sql`EXISTS (SELECT 1 FROM events v WHERE v.voids_event_id = ${events.id})`;
const notVoided = sql`NOT EXISTS (SELECT 1 FROM events v WHERE v.voids_event_id = ${events.id})`;
const round = (v: number, d: number) => Math.round(v * 10 ** d) / 10 ** d;

export function logWhere(q: RefrigerantLogQuery): SQL[] {
  const w: SQL[] = [
    inArray(events.kind, [...LOG_ENTRY_KINDS]),
    gte(events.occurredAt, new Date(`${q.from}T00:00:00Z`)),
    lt(events.occurredAt, new Date(`${dayPlus(q.to, 1)}T00:00:00Z`)),
  ];
  if (q.siteId) w.push(eq(events.siteId, q.siteId));
  if (q.refrigerant) w.push(eq(units.refrigerant, q.refrigerant));
  return w;
}

export const logFields = {
  eventId: events.id,
  occurredAt: events.occurredAt,
  kind: events.kind,
  unitId: units.id,
  containerNumber: units.containerNumber,
  refrigerant: units.refrigerant,
  siteId: events.siteId,
  siteName: sites.name,
  kg: events.kg,
  cylinder: events.cylinder,
  reusedRecovered: events.reusedRecovered,
  excludedFromLeakRate: events.excludedFromLeakRate,
  method: events.method,
  leakFound: events.leakFound,
  location: events.location,
  technicianId: users.id,
  technicianName: users.name,
  // Held on the day of the work (kept on the visit); visits from before it was kept show today's.
  certificateNumber: sql<string | null>`COALESCE(${visits.certificateNumber}, ${users.certificateNumber})`,
  certificateExpiresOn: sql<
    string | null
  >`CASE WHEN ${visits.certificateNumber} IS NULL THEN ${users.certificateExpiresOn} ELSE ${visits.certificateExpiresOn} END`,
};
export const LOG_FIELD_NAMES = Object.keys(logFields) as (keyof typeof logFields)[];

export function logEntriesQuery(db: Db, q: RefrigerantLogQuery, extra: SQL[] = []) {
  return db
    .select(logFields)
    .from(events)
    .innerJoin(units, eq(units.id, events.unitId))
    .innerJoin(users, eq(users.id, events.recordedBy))
    .leftJoin(visits, eq(visits.id, events.visitId))
    .leftJoin(sites, eq(sites.id, events.siteId))
    .where(and(...logWhere(q), notVoided, ...extra))
    .orderBy(desc(events.occurredAt), desc(events.id))
    .$dynamic();
}

type LogRow = {
  eventId: number;
  occurredAt: Date;
  kind: string;
  unitId: number;
  containerNumber: string;
  refrigerant: string;
  siteId: number | null;
  siteName: string | null;
  kg: number | null;
  cylinder: string | null;
  reusedRecovered: boolean | number | null;
  excludedFromLeakRate: boolean | number | null;
  method: string | null;
  leakFound: boolean | number | null;
  location: string | null;
  technicianId: string;
  technicianName: string;
  certificateNumber: string | null;
  certificateExpiresOn: string | null;
};

// A DATE read through sql`` arrives as a Date or a string depending on the driver's typing.
const dayOf = (v: string | Date | null): string | null =>
  v == null ? null : typeof v === 'string' ? v.slice(0, 10) : v.toISOString().slice(0, 10);
const bool = (v: boolean | number | null) => (v == null ? null : Boolean(v));

/** t CO2e of a mass, or null when the engine refuses it (an old row with a negative kg): one odd row leaves its
 * own figure empty instead of failing the whole log for everyone. */
function co2eOrNull(refrigerant: string, kg: number, settings: Settings): number | null {
  try {
    return round(co2eTonnes(refrigerant, kg, settings.gwpBasis), 4);
  } catch {
    return null;
  }
}

export function toLogEntry(r: LogRow, settings: Settings): RefrigerantLogEntryDto {
  const movement = r.kind !== 'leak_check';
  return {
    eventId: r.eventId,
    occurredAt: new Date(r.occurredAt).toISOString(),
    kind: r.kind as LogEntryKind,
    unit: { id: r.unitId, containerNumber: r.containerNumber },
    refrigerant: r.refrigerant,
    site: r.siteId != null ? { id: r.siteId, name: r.siteName ?? '' } : null,
    kg: movement ? (r.kg ?? 0) : null,
    co2eTonnes: movement ? co2eOrNull(r.refrigerant, r.kg ?? 0, settings) : null,
    cylinder: movement ? r.cylinder : null,
    reusedRecovered: movement ? bool(r.reusedRecovered) : null,
    excludedFromLeakRate: movement ? bool(r.excludedFromLeakRate) : null,
    method: movement ? null : r.method,
    leakFound: movement ? null : bool(r.leakFound),
    location: movement ? null : r.location,
    technician: {
      id: r.technicianId,
      name: r.technicianName,
      certificateNumber: r.certificateNumber,
      certificateExpiresOn: dayOf(r.certificateExpiresOn),
    },
  };
}

export async function logTotals(
  db: Db,
  q: RefrigerantLogQuery,
  settings: Settings,
): Promise<RefrigerantLogTotalsDto[]> {
  const rows = await db
    .select({
      refrigerant: units.refrigerant,
      kind: events.kind,
      n: count(),
      kg: sql<number>`COALESCE(SUM(${events.kg}), 0)`,
      leaks: sql<number>`COALESCE(SUM(${events.leakFound}), 0)`,
    })
    .from(events)
    .innerJoin(units, eq(units.id, events.unitId))
    .where(and(...logWhere(q), notVoided))
    .groupBy(units.refrigerant, events.kind);
  const byRefrigerant = new Map<string, RefrigerantLogTotalsDto>();
  for (const r of rows) {
    const t = byRefrigerant.get(r.refrigerant) ?? {
      refrigerant: r.refrigerant,
      addedKg: 0,
      addedCo2eTonnes: 0,
      recoveredKg: 0,
      recoveredCo2eTonnes: 0,
      additions: 0,
      recoveries: 0,
      leakChecks: 0,
      leaksFound: 0,
    };
    const kg = Number(r.kg);
    if (r.kind === 'top_up' || r.kind === 'recharge') {
      t.addedKg += kg;
      t.additions += Number(r.n);
    } else if (r.kind === 'recovery') {
      t.recoveredKg += kg;
      t.recoveries += Number(r.n);
    } else {
      t.leakChecks += Number(r.n);
      t.leaksFound += Number(r.leaks);
    }
    byRefrigerant.set(r.refrigerant, t);
  }
  return [...byRefrigerant.values()]
    .map((t) => ({
      ...t,
      addedKg: round(t.addedKg, 3),
      recoveredKg: round(t.recoveredKg, 3),
      addedCo2eTonnes: co2eOrNull(t.refrigerant, t.addedKg, settings),
      recoveredCo2eTonnes: co2eOrNull(t.refrigerant, t.recoveredKg, settings),
    }))
    .sort((a, b) => a.refrigerant.localeCompare(b.refrigerant));
}

export async function refrigerantLog(db: Db, q: RefrigerantLogQuery, settings: Settings): Promise<RefrigerantLogDto> {
  const extra: SQL[] = [];
  if (q.before) {
    const [at, id] = q.before.split('_');
    const t = new Date(at);
    extra.push(or(lt(events.occurredAt, t), and(eq(events.occurredAt, t), lt(events.id, Number(id))))!);
  }
  const [rows, totals, [voidedCount]] = await Promise.all([
    logEntriesQuery(db, q, extra).limit(LOG_PAGE_SIZE + 1),
    logTotals(db, q, settings),
    db
      .select({ n: count() })
      .from(events)
      .innerJoin(units, eq(units.id, events.unitId))
      .where(and(...logWhere(q), voided)),
  ]);
  const [site] = q.siteId
    ? await db.select({ name: sites.name, jurisdiction: sites.jurisdiction }).from(sites).where(eq(sites.id, q.siteId))
    : [];
  const jurisdiction = site?.jurisdiction ?? settings.policy;
  const more = rows.length > LOG_PAGE_SIZE;
  const page = (more ? rows.slice(0, LOG_PAGE_SIZE) : rows) as LogRow[];
  const last = page[page.length - 1];
  return {
    from: q.from,
    to: q.to,
    gwpBasis: settings.gwpBasis,
    rule: {
      jurisdiction,
      siteName: site?.jurisdiction ? site.name : null,
      words: JURISDICTION_RULE_WORDS[jurisdiction],
    },
    entries: page.map((r) => toLogEntry(r, settings)),
    nextBefore: more && last ? `${new Date(last.occurredAt).toISOString()}_${last.eventId}` : null,
    totals,
    voidedExcluded: Number(voidedCount.n),
  };
}
