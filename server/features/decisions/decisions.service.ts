// Repair or retire (DOMAIN.md §9): the four options of a unit priced from its own history and the fleet's repair
// record, the fleet's candidates ranked by yearly saving, and recording a decision as a unit event.
import { writeUnit, type WriteContext } from '../../lib/record/write-path';
import { loadUnitWithStats } from '../../lib/record/stats';
import { isDuplicateKeyError } from '../../lib/db-errors';
import { createHash } from 'node:crypto';
import { and, asc, desc, eq, inArray, isNotNull, ne, or, sql } from 'drizzle-orm';
import type { Db, DbOrTx } from '../../db/client';
import {
  events,
  repairEffectivenessRows,
  sites,
  units,
  unitStats,
  unitStatsDetail,
  users,
  visits,
} from '../../db/schema';
import { conflict, HttpError } from '../../lib/http-error';
import type { SessionUser } from '../../lib/session';
import {
  compareRepairOptions,
  isLeakLocation,
  unitAgeYears,
  type LeakLocationId,
  type RepairOptionsInput,
} from '../../../shared/domain';
import {
  DECISION_OPTION,
  type DecisionChoice,
  type DecisionInputs,
  type DecisionRecordDto,
  type RecordDecisionInput,
  type RetirementCandidatesDto,
  type UnitDecisionDto,
} from '../../../shared/schemas/decisions';
import type { Settings } from '../../../shared/schemas/settings';
import type { SettingsCache } from '../../lib/settings';

/** How many of the highest-scoring units the candidate list prices. */
export const CANDIDATE_POOL = 500;

const notVoided = sql`NOT EXISTS (SELECT 1 FROM events v WHERE v.voids_event_id = ${events.id})`;
type LocationSource = UnitDecisionDto['sources']['leakLocation'];

/** The leak a repair would fix: the open one, else the last found, else the last repaired location. */
async function leakLocationsOf(db: DbOrTx, unitIds: number[], openLeaks: Map<number, string | null>) {
  const out = new Map<number, { location: LeakLocationId; source: LocationSource }>();
  for (const id of unitIds) {
    const open = openLeaks.get(id);
    if (open && isLeakLocation(open)) out.set(id, { location: open, source: 'open_leak' });
  }
  const rest = unitIds.filter((id) => !out.has(id));
  for (let i = 0; i < rest.length; i += 500) {
    const rows = await db
      .select({ unitId: events.unitId, kind: events.kind, location: events.location })
      .from(events)
      .where(
        and(
          inArray(events.unitId, rest.slice(i, i + 500)),
          isNotNull(events.location),
          or(and(eq(events.kind, 'leak_check'), eq(events.leakFound, true)), eq(events.kind, 'repair')),
          notVoided,
        ),
      )
      .orderBy(asc(events.unitId), desc(events.occurredAt), desc(events.id));
    const lastFound = new Map<number, LeakLocationId>();
    const lastRepair = new Map<number, LeakLocationId>();
    for (const r of rows) {
      if (!isLeakLocation(r.location)) continue;
      const map = r.kind === 'repair' ? lastRepair : lastFound;
      if (!map.has(r.unitId)) map.set(r.unitId, r.location);
    }
    for (const id of rest.slice(i, i + 500)) {
      const found = lastFound.get(id);
      const repaired = lastRepair.get(id);
      out.set(
        id,
        found
          ? { location: found, source: 'last_leak_found' }
          : repaired
            ? { location: repaired, source: 'last_repair' }
            : { location: 'other', source: 'none' },
      );
    }
  }
  return out;
}

async function fleetRepairsByLocation(db: DbOrTx): Promise<Map<string, { repairs: number; recurred: number }>> {
  const rows = await db
    .select({
      location: repairEffectivenessRows.location,
      repairs: repairEffectivenessRows.repairs,
      recurred: repairEffectivenessRows.recurred,
    })
    .from(repairEffectivenessRows)
    .where(eq(repairEffectivenessRows.action, ''));
  return new Map(rows.map((r) => [r.location, { repairs: r.repairs, recurred: r.recurred }]));
}

type Detail = {
  forecast?: { intervalDays?: number; expectedKg?: number } | null;
  openLeak?: { location?: string | null } | null;
};

function ageOf(u: { commissionedOn: string | null; createdAt: Date }, asOf: Date): number {
  // Without a commissioning date the record's start stands in for it (DOMAIN.md §4).
  return unitAgeYears(u.commissionedOn ?? u.createdAt.toISOString().slice(0, 10), asOf.toISOString());
}

const withEconomics = (settings: Settings, economics: Settings['economics']): Settings => ({ ...settings, economics });

const decisionFields = {
  id: events.id,
  at: events.occurredAt,
  details: events.details,
  note: events.note,
  userId: users.id,
  userName: users.name,
};

function toDecisionRecord(r: {
  id: number;
  at: Date;
  details: unknown;
  note: string | null;
  userId: string;
  userName: string;
}): DecisionRecordDto {
  const d = (r.details ?? {}) as { choice?: DecisionChoice; cheapestId?: DecisionRecordDto['cheapestId'] };
  return {
    eventId: r.id,
    choice: d.choice ?? 'keep',
    at: r.at.toISOString(),
    by: { id: r.userId, name: r.userName },
    cheapestId: d.cheapestId ?? 'keep_topping_up',
    note: r.note,
  };
}

async function decisionsOf(db: DbOrTx, unitId: number): Promise<DecisionRecordDto[]> {
  const rows = await db
    .select(decisionFields)
    .from(events)
    .innerJoin(users, eq(users.id, events.recordedBy))
    .where(and(eq(events.unitId, unitId), eq(events.kind, 'decision'), notVoided))
    .orderBy(desc(events.occurredAt), desc(events.id))
    .limit(10);
  return rows.map(toDecisionRecord);
}

/** One decision, voided or not and however old (a replay answers with what was recorded). */
async function decisionRecord(db: DbOrTx, eventId: number): Promise<DecisionRecordDto> {
  const [row] = await db
    .select(decisionFields)
    .from(events)
    .innerJoin(users, eq(users.id, events.recordedBy))
    .where(eq(events.id, eventId));
  return toDecisionRecord(row);
}

/** SHA-256 of what a submission says (everything but its key): a key sent again must come with the same decision. */
function submissionHash(unitId: number, body: RecordDecisionInput): string {
  const { idempotencyKey: _key, ...content } = body;
  return createHash('sha256')
    .update(JSON.stringify({ unitId, ...content }))
    .digest('hex');
}

async function engineInputOf(db: DbOrTx, row: Awaited<ReturnType<typeof loadUnitWithStats>>, asOf: Date) {
  const detail = (row.detail ?? {}) as Detail;
  const forecast = detail.forecast ?? null;
  const locations = await leakLocationsOf(db, [row.u.id], new Map([[row.u.id, detail.openLeak?.location ?? null]]));
  const loc = locations.get(row.u.id)!;
  const fleet = (await fleetRepairsByLocation(db)).get(loc.location) ?? null;
  const input: RepairOptionsInput = {
    refrigerant: row.u.refrigerant,
    ageYears: ageOf(row.u, asOf),
    topUpIntervalDays: forecast?.intervalDays ?? null,
    madeUpKgPerVisit: forecast?.expectedKg ?? null,
    leakLocation: loc.location,
    fleetRepairs: fleet,
  };
  return {
    input,
    sources: {
      leakLocation: loc.source,
      interval: forecast ? 'forecast' : 'no_leak_evidence',
    } as UnitDecisionDto['sources'],
  };
}

/** The engine's throw on a record it cannot price (a date it cannot place) as a 409 saying why, never a 500. */
async function pricing<T>(work: () => Promise<T> | T): Promise<T> {
  try {
    return await work();
  } catch (err) {
    if (err instanceof HttpError) throw err;
    const reason = err instanceof Error && err.message ? err.message : 'the record breaks a rule of the computation';
    throw new HttpError(
      409,
      'cannot_compute',
      `Cannot compute the options for this unit: ${reason} Correct the unit's details first.`,
    );
  }
}

export async function getUnitDecision(
  db: Db,
  cache: SettingsCache,
  unitId: number,
  now: Date,
): Promise<UnitDecisionDto> {
  const row = await loadUnitWithStats(db, unitId);
  const { settings } = await cache.current(db);
  const { input, sources } = await pricing(() => engineInputOf(db, row, now));
  const result = await pricing(() => compareRepairOptions(input, settings));
  return {
    asOf: now.toISOString().slice(0, 10),
    unit: {
      id: row.u.id,
      containerNumber: row.u.containerNumber,
      refrigerant: row.u.refrigerant,
      nominalChargeKg: row.u.nominalChargeKg,
      commissionedOn: row.u.commissionedOn,
      status: row.u.status,
      site: row.u.siteId != null ? { id: row.u.siteId, name: row.siteName ?? '' } : null,
    },
    stats: row.stats
      ? {
          score: row.stats.score,
          scoreBand: row.stats.scoreBand,
          rollingLeakRatePct: row.stats.rollingLeakRatePct,
          forecastDate: row.stats.forecastDate,
        }
      : null,
    engineInput: input,
    economics: settings.economics,
    result,
    sources,
    decisions: await decisionsOf(db, unitId),
  };
}

/** Records the decision with the figures and assumptions it was made on, in one transaction; retries replay. */
/** Records the owner's choice with its figures as a 'decision' entry, through the unit write path. */
export async function recordDecision(ctx: WriteContext, user: SessionUser, unitId: number, body: RecordDecisionInput) {
  const db = ctx.db;
  const submission = submissionHash(unitId, body);
  // Decisions share the visits' submission keys: a key may only ever replay the same decision by the same person.
  const replay = async () => {
    const [v] = await db
      .select({ id: visits.id, unitId: visits.unitId, recordedBy: visits.recordedBy })
      .from(visits)
      .where(eq(visits.idempotencyKey, body.idempotencyKey));
    if (!v) return null;
    const [e] = await db
      .select({ id: events.id, details: events.details })
      .from(events)
      .where(and(eq(events.visitId, v.id), eq(events.kind, 'decision')));
    if (!e || v.unitId !== unitId || v.recordedBy !== user.id) {
      throw conflict(
        'This submission key was already used for something else; nothing was recorded. Send the decision as a new submission.',
        {
          idempotencyKey: 'Already used',
        },
      );
    }
    // Decisions recorded before the content was kept have no hash: the key alone identifies them.
    const recorded = (e.details as { submission?: string } | null)?.submission;
    if (recorded && recorded !== submission) {
      throw conflict(
        'This submission key was already used for a different decision; nothing was recorded. Send the decision as a new submission.',
        {
          idempotencyKey: 'Already used for another decision',
        },
      );
    }
    return { decision: await decisionRecord(db, e.id), replayed: true };
  };
  const earlier = await replay();
  if (earlier) return earlier;
  try {
    const { result: eventId } = await writeUnit(ctx, unitId, async (tx, _locked, now) => {
      const row = await loadUnitWithStats(tx, unitId);
      const { settings, version } = await ctx.caches.settings.current(tx);
      const { input: facts } = await pricing(() => engineInputOf(tx, row, now));
      const inputs: DecisionInputs = body.inputs;
      const input: RepairOptionsInput = { ...facts, ...inputs };
      const result = await pricing(() => compareRepairOptions(input, withEconomics(settings, body.economics)));
      const [visit] = await tx
        .insert(visits)
        .values({
          unitId,
          siteId: row.u.siteId,
          recordedBy: user.id,
          occurredAt: now,
          enteredAt: now,
          idempotencyKey: body.idempotencyKey,
        })
        .$returningId();
      const [ev] = await tx
        .insert(events)
        .values({
          unitId,
          visitId: visit.id,
          siteId: row.u.siteId,
          recordedBy: user.id,
          kind: 'decision',
          occurredAt: now,
          enteredAt: now,
          note: body.note || null,
          details: {
            choice: body.choice,
            option: DECISION_OPTION[body.choice],
            cheapestId: result.cheapestId,
            currency: result.currency,
            options: result.options,
            assumptions: result.assumptions,
            inputs: input,
            economics: body.economics,
            settingsVersion: version,
            submission,
          },
        })
        .$returningId();
      return { result: ev.id };
    });
    const decision = (await decisionsOf(db, unitId)).find((d) => d.eventId === eventId)!;
    return { decision, replayed: false };
  } catch (err) {
    if (isDuplicateKeyError(err)) {
      const first = await replay();
      if (first) return first;
    }
    throw err;
  }
}

export async function retirementCandidates(
  db: Db,
  cache: SettingsCache,
  opts: { siteId?: number; limit: number },
  now: Date,
): Promise<RetirementCandidatesDto> {
  const { settings } = await cache.current(db);
  const where = [ne(units.status, 'retired'), sql`${unitStats.score} >= ${settings.score.watchFrom}`];
  if (opts.siteId) where.push(eq(units.siteId, opts.siteId));
  // The highest scores first (score index); their forecast comes out of the stored engine result.
  const pool = await db
    .select({
      unitId: units.id,
      containerNumber: units.containerNumber,
      refrigerant: units.refrigerant,
      commissionedOn: units.commissionedOn,
      createdAt: units.createdAt,
      siteName: sites.name,
      score: unitStats.score,
      scoreBand: unitStats.scoreBand,
      rate: unitStats.rollingLeakRatePct,
      intervalDays: sql<number | null>`JSON_VALUE(${unitStatsDetail.detail}, '$.forecast.intervalDays')`,
      expectedKg: sql<number | null>`JSON_VALUE(${unitStatsDetail.detail}, '$.forecast.expectedKg')`,
      openLeak: sql<string | null>`JSON_VALUE(${unitStatsDetail.detail}, '$.openLeak.location')`,
    })
    .from(unitStats)
    .innerJoin(units, eq(units.id, unitStats.unitId))
    .leftJoin(sites, eq(sites.id, units.siteId))
    .leftJoin(unitStatsDetail, eq(unitStatsDetail.unitId, unitStats.unitId))
    .where(and(...where))
    .orderBy(desc(unitStats.score), desc(unitStats.unitId))
    .limit(CANDIDATE_POOL);
  const locations = await leakLocationsOf(
    db,
    pool.map((p) => p.unitId),
    new Map(pool.map((p) => [p.unitId, p.openLeak])),
  );
  const fleet = await fleetRepairsByLocation(db);
  const candidates: RetirementCandidatesDto['candidates'] = [];
  for (const p of pool) {
    const location = locations.get(p.unitId)!.location;
    const interval = p.intervalDays == null ? null : Number(p.intervalDays);
    const kg = p.expectedKg == null ? null : Number(p.expectedKg);
    let r;
    let ageYears: number;
    try {
      ageYears = ageOf({ commissionedOn: p.commissionedOn, createdAt: p.createdAt }, now);
      r = compareRepairOptions(
        {
          refrigerant: p.refrigerant,
          ageYears,
          topUpIntervalDays: interval && interval > 0 ? interval : null,
          madeUpKgPerVisit: kg,
          leakLocation: location,
          fleetRepairs: fleet.get(location) ?? null,
        },
        settings,
      );
    } catch {
      continue; // a unit the engine cannot price (unknown refrigerant, a date it cannot place) is not a candidate
    }
    const keep = r.options.find((o) => o.id === 'keep_topping_up')!;
    const retire = r.options.find((o) => o.id === 'retire_and_sell')!;
    const cheapest = r.options.find((o) => o.cheapest)!;
    const saving = keep.eac - cheapest.eac;
    if (saving <= 0) continue;
    candidates.push({
      unitId: p.unitId,
      containerNumber: p.containerNumber,
      site: p.siteName,
      refrigerant: p.refrigerant,
      score: p.score,
      scoreBand: p.scoreBand,
      rollingLeakRatePct: p.rate,
      ageYears: Math.round(ageYears * 10) / 10,
      keepEac: keep.eac,
      cheapestId: cheapest.id,
      cheapestEac: cheapest.eac,
      retireEac: retire.eac,
      yearlySaving: Math.round(saving * 100) / 100,
      retireSaving: Math.round((keep.eac - retire.eac) * 100) / 100,
    });
  }
  candidates.sort((a, b) => b.yearlySaving - a.yearlySaving || b.score - a.score);
  return {
    asOf: now.toISOString().slice(0, 10),
    currency: settings.economics.currency,
    considered: pool.length,
    candidates: candidates.slice(0, opts.limit),
  };
}
