// From a simulated unit to the rows the server itself would have written: units, visits, events (void markers
// included) and the unit's statistics row, computed in memory with the server's own functions.
import type { events, sites, units, users, visitMadeUp, visits } from '../../server/db/schema';
import { engineUnit, statsRowsFrom, toEngineEvent, type UnitStatsRows } from '../../server/lib/record/stats';
import { computeUnitStats } from '../../shared/domain';
import type { Settings } from '../../shared/schemas/settings';
import type { Fleet } from './fleet';
import type { SimEvent, UnitSim } from './unit-sim';

export type SiteRow = typeof sites.$inferInsert;
export type UserRow = typeof users.$inferInsert;
export type UnitRow = typeof units.$inferInsert;
export type VisitRow = typeof visits.$inferInsert;
export type EventRow = typeof events.$inferInsert;
export type VisitMadeUpRow = typeof visitMadeUp.$inferInsert;

/** The next id of each table; advanced as rows are made. */
export type IdCursor = { unit: number; visit: number; event: number };

export type EngineEvent = NonNullable<ReturnType<typeof toEngineEvent>>;

/** The rows of one unit, and the engine's view of its history (what loadEngineHistory would read back). */
export type UnitRows = {
  unit: UnitRow;
  visits: VisitRow[];
  events: EventRow[];
  stats: UnitStatsRows['stats'];
  statsDetail: UnitStatsRows['detail'];
  /** Each visit's made-up refrigerant (for visit_made_up and fleet_monthly), as the engine counts it. */
  madeUp: VisitMadeUpRow[];
  engineEvents: EngineEvent[];
  /** The engine's per-visit figures for the whole history (the statistics row keeps only the summary). */
  visitStats: ReturnType<typeof computeUnitStats>['visits'];
};

export function siteRows(fleet: Fleet, firstId: number): SiteRow[] {
  const at = new Date((fleet.ctx.todayDay - Math.round(fleet.ctx.historyYears * 365.25) - 60) * 86_400_000);
  return fleet.sites.map((s, i) => ({
    id: firstId + i,
    code: s.code,
    name: s.name,
    kind: s.kind,
    country: s.country,
    jurisdiction: s.jurisdiction,
    timeZone: s.timeZone,
    createdAt: at,
  }));
}

/**
 * Days from today to each certificate's last valid day, taken in turn: most run a year or more, one in about every
 * eight has expired and a few run out within two months, so the people page's expiring list has something to show.
 * The demo sign-ins' certificates run well past today.
 */
const CERTIFICATE_DAYS_LEFT = [410, 720, -25, 190, 38, 905, 560, 12];
const DEMO_CERTIFICATE_DAYS_LEFT = 480;

function certificateExpiry(fleet: Fleet, p: Fleet['people'][number], i: number): string | null {
  if (!p.certificateNumber) return null;
  const left = p.demo ? DEMO_CERTIFICATE_DAYS_LEFT : CERTIFICATE_DAYS_LEFT[i % CERTIFICATE_DAYS_LEFT.length];
  return new Date((fleet.ctx.todayDay + left) * 86_400_000).toISOString().slice(0, 10);
}

export function userRows(fleet: Fleet, demoPasswordHash: string | null): UserRow[] {
  const at = new Date((fleet.ctx.todayDay - Math.round(fleet.ctx.historyYears * 365.25) - 60) * 86_400_000);
  return fleet.people.map((p, i) => ({
    id: p.id,
    email: p.email,
    name: p.name,
    role: p.role,
    // Only the demo sign-ins can sign in; the simulated staff would be invited.
    passwordHash: p.demo ? demoPasswordHash : null,
    certificateNumber: p.certificateNumber,
    certificateExpiresOn: certificateExpiry(fleet, p, i),
    active: true,
    createdAt: at,
  }));
}

const NULL_EVENT = {
  kg: null,
  cylinder: null,
  reusedRecovered: null,
  excludedFromLeakRate: null,
  method: null,
  leakFound: null,
  location: null,
  action: null,
  verified: null,
  passed: null,
  suctionKPaG: null,
  dischargeKPaG: null,
  ambientC: null,
  setPointC: null,
  supplyAirC: null,
  returnAirC: null,
  sightGlass: null,
  details: null,
  note: null,
  voidsEventId: null,
};

/** The entry's own columns, as the server would write them (absent fields NULL). */
function entryColumns(e: SimEvent) {
  return {
    kg: e.kg ?? null,
    cylinder: e.cylinder ?? null,
    reusedRecovered: e.reusedRecovered ?? null,
    excludedFromLeakRate: e.excludedFromLeakRate ?? null,
    method: e.method ?? null,
    leakFound: e.leakFound ?? null,
    location: e.location ?? null,
    action: e.action ?? null,
    verified: e.verified ?? null,
    passed: e.passed ?? null,
    suctionKPaG: e.suctionKPaG ?? null,
    dischargeKPaG: e.dischargeKPaG ?? null,
    ambientC: e.ambientC ?? null,
    setPointC: e.setPointC ?? null,
    supplyAirC: e.supplyAirC ?? null,
    returnAirC: e.returnAirC ?? null,
    sightGlass: e.sightGlass ?? null,
    details: e.details ?? null,
    note: e.note ?? null,
  };
}

function unitRowOf(sim: UnitSim, unitId: number, siteIds: readonly number[]): UnitRow {
  const u = sim.unit;
  const createdAt = new Date(u.createdMs);
  return {
    id: unitId,
    containerNumber: u.containerNumber,
    refrigerant: u.refrigerant,
    nominalChargeKg: u.nominalChargeKg,
    commissionedOn: u.commissionedOn,
    siteId: siteIds[u.homeSite],
    status: u.status,
    qrToken: u.qrToken,
    machinerySerial: u.machinerySerial,
    model: u.model,
    manufactureYear: u.manufactureYear,
    purchaseCost: u.purchaseCost,
    residualValue: u.residualValue,
    notes: null,
    qrIssuedAt: createdAt,
    createdAt,
    updatedAt: new Date(u.updatedMs),
  };
}

/** Visits, their entries and the void markers; and the engine's view of the entries that stand. */
function historyRows(fleet: Fleet, sim: UnitSim, unit: UnitRow, siteIds: readonly number[], ids: IdCursor) {
  const people = fleet.people;
  const unitId = unit.id!;
  const visitRows: VisitRow[] = [];
  const eventRows: EventRow[] = [];
  const idOf = new Map<SimEvent, number>();
  const voided = new Set<SimEvent>();
  for (const v of sim.voids) voided.add(v.target);
  const engineEvents: EngineEvent[] = [];

  for (let k = 0; k < sim.visits.length; k++) {
    const v = sim.visits[k];
    const visitId = ids.visit++;
    const occurredAt = new Date(v.occurredMs);
    const enteredAt = new Date(v.enteredMs);
    const siteId = v.site === null ? unit.siteId! : siteIds[v.site];
    const recordedBy = people[v.by].id;
    visitRows.push({
      id: visitId,
      unitId,
      siteId,
      recordedBy,
      occurredAt,
      enteredAt,
      idempotencyKey: `sim-${fleet.ctx.seed}-${sim.index}-${k}`,
      createdAt: enteredAt,
    });
    for (const e of v.events) {
      const id = ids.event++;
      idOf.set(e, id);
      const columns = entryColumns(e);
      eventRows.push({
        id,
        unitId,
        visitId,
        siteId,
        recordedBy,
        kind: e.kind,
        occurredAt,
        enteredAt,
        ...columns,
        voidsEventId: null,
        createdAt: enteredAt,
      });
      if (!voided.has(e)) {
        const ee = toEngineEvent({ ...columns, kind: e.kind, occurredAt, visitId });
        if (ee) engineEvents.push(ee);
      }
    }
  }
  for (const vd of sim.voids) {
    const at = new Date(vd.atMs);
    eventRows.push({
      id: ids.event++,
      unitId,
      visitId: null,
      siteId: vd.site === null ? unit.siteId! : siteIds[vd.site],
      recordedBy: people[vd.by].id,
      kind: 'void',
      occurredAt: at,
      enteredAt: at,
      ...NULL_EVENT,
      voidsEventId: idOf.get(vd.target)!,
      note: vd.reason,
      createdAt: at,
    });
  }
  return { visitRows, eventRows, engineEvents };
}

/** The settings a unit's figures follow: the fleet's, with its site's leak-check rule (as the write path does). */
function rulesAt(fleet: Fleet, site: number, settings: Settings): Settings {
  const jurisdiction = fleet.sites[site]?.jurisdiction;
  return jurisdiction ? { ...settings, policy: jurisdiction } : settings;
}

export function rowsForUnit(
  fleet: Fleet,
  sim: UnitSim,
  siteIds: readonly number[],
  ids: IdCursor,
  settings: Settings,
): UnitRows {
  const now = new Date(fleet.ctx.nowMs);
  const u = sim.unit;
  const unitId = ids.unit++;
  const unit = unitRowOf(sim, unitId, siteIds);
  const { visitRows, eventRows, engineEvents } = historyRows(fleet, sim, unit, siteIds, ids);

  // Exactly what recomputeUnitStats does after a write, on the same events in the same order.
  const result = computeUnitStats(
    engineUnit({
      refrigerant: u.refrigerant,
      nominalChargeKg: u.nominalChargeKg,
      commissionedOn: u.commissionedOn,
      createdAt: unit.createdAt!,
    }),
    engineEvents,
    now.toISOString(),
    rulesAt(fleet, u.homeSite, settings),
  );
  const last = engineEvents.length ? new Date(engineEvents[engineEvents.length - 1].at) : null;
  const { stats, detail: statsDetail } = statsRowsFrom(unitId, result, now, last);
  // What applyToFleetMonthly would have recorded visit by visit: month of the visit (UTC), its site, the unit's
  // refrigerant, and the made-up kg by the domain rule.
  const madeUp: VisitMadeUpRow[] = [];
  const siteOfVisit = new Map(visitRows.map((v) => [String(v.id), v.siteId ?? 0]));
  for (const v of result.visits) {
    if (!(v.madeUpKg > 0) || v.visitId === null) continue;
    madeUp.push({
      visitId: Number(v.visitId),
      unitId,
      month: v.date.slice(0, 7),
      siteId: siteOfVisit.get(v.visitId) ?? 0,
      refrigerant: u.refrigerant,
      madeUpKg: v.madeUpKg,
      createdAt: now,
    });
  }
  return {
    unit,
    visits: visitRows,
    events: eventRows,
    stats,
    statsDetail,
    madeUp,
    engineEvents,
    visitStats: result.visits,
  };
}
