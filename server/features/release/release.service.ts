// A structured PTI and the release for loading it allows. Both are entries written through the unit write path; what
// stands in the way is read after the unit's lock.
import { eq } from 'drizzle-orm';
import { events } from '../../db/schema';
import type { AppContext } from '../../lib/app-context';
import { forbidden, HttpError } from '../../lib/http-error';
import { depotStateOf, loadDepotHistory } from '../../lib/record/depot-state';
import { writeSingleEntry } from '../../lib/record/entry';
import type { SessionUser } from '../../lib/session';
import { ptiBlockers, ptiOverall, type PtiBlocker, type PtiOverall } from '../../../shared/domain/pti';
import { fmtIsoDay } from '../../../shared/format-dates';
import { can } from '../../../shared/permissions';
import type {
  RecordPtiInput,
  RecordPtiResultDto,
  ReleaseResultDto,
  ReleaseUnitInput,
} from '../../../shared/schemas/release';

const blockedWords = (b: PtiBlocker[]) => b.map((x) => x.words).join(' ');

export async function recordPti(
  ctx: AppContext,
  user: SessionUser,
  unitId: number,
  input: RecordPtiInput,
): Promise<RecordPtiResultDto & { replayed: boolean }> {
  if (input.override && !can(user, 'override:pti'))
    throw forbidden('Only an engineer can record a PTI as passed in spite of what stands in the way.');
  let outcome: RecordPtiResultDto | null = null;
  const { eventId, replayed } = await writeSingleEntry(
    ctx,
    user,
    unitId,
    {
      key: input.idempotencyKey,
      occurredAt: input.occurredAt ? new Date(input.occurredAt) : undefined,
      siteId: input.siteId,
    },
    async (tx, { unit, stats }, now) => {
      const settings = await ctx.caches.settings.get(tx);
      const depot = depotStateOf(unit, await loadDepotHistory(tx, unit.id), now, settings);
      const blockers = ptiBlockers({
        items: input.items,
        openLeakFoundAt: stats?.openLeakFoundAt ? stats.openLeakFoundAt.toISOString() : null,
        pressureFlag: stats?.pressureFlag ?? 'unknown',
        quarantined: depot.quarantine != null,
      });
      const overall = ptiOverall(input.items);
      const unitBlockers = blockers.filter((b) => b.code !== 'failed_item');
      if (overall === 'passed' && unitBlockers.length && !input.override && !input.recordAsNotPassed) {
        throw new HttpError(
          409,
          'pti_blocked',
          `This PTI cannot be recorded as passed: ${blockedWords(unitBlockers)} Record it as not passed, or ask an engineer to override with a reason.`,
          { items: blockedWords(unitBlockers) },
        );
      }
      const overridden = Boolean(input.override) && (overall !== 'passed' || unitBlockers.length > 0);
      const passed = overridden || (overall === 'passed' && unitBlockers.length === 0);
      outcome = { eventId: 0, overall, passed, blockers, overridden };
      return {
        kind: 'pti',
        passed,
        note: input.note ?? null,
        details: {
          pti: {
            items: input.items,
            overall,
            blockers,
            ...(overridden ? { override: { by: user.id, byName: user.name, reason: input.override!.reason } } : {}),
          },
        },
      };
    },
  );
  if (!outcome) {
    // A replay: the first submission's result stands.
    const [e] = await ctx.db
      .select({ passed: events.passed, details: events.details })
      .from(events)
      .where(eq(events.id, eventId));
    const pti = (e.details?.pti ?? {}) as { overall?: PtiOverall; blockers?: PtiBlocker[]; override?: unknown };
    return {
      eventId,
      overall: pti.overall ?? 'incomplete',
      passed: Boolean(e.passed),
      blockers: pti.blockers ?? [],
      overridden: pti.override != null,
      replayed,
    };
  }
  return { ...(outcome as RecordPtiResultDto), eventId, replayed };
}

export async function releaseUnit(
  ctx: AppContext,
  user: SessionUser,
  unitId: number,
  input: ReleaseUnitInput,
): Promise<ReleaseResultDto & { replayed: boolean }> {
  let validUntil = '';
  const { eventId, replayed } = await writeSingleEntry(
    ctx,
    user,
    unitId,
    { key: input.idempotencyKey, siteId: input.siteId },
    async (tx, { unit, stats }, now) => {
      const settings = await ctx.caches.settings.get(tx);
      const depot = depotStateOf(unit, await loadDepotHistory(tx, unit.id), now, settings);
      if (depot.quarantine)
        throw new HttpError(
          409,
          'quarantined',
          `${unit.containerNumber} is in quarantine (${depot.quarantine.reason}). An engineer must lift the quarantine with a recorded result before it can be released.`,
        );
      if (unit.status !== 'in_service')
        throw new HttpError(409, 'not_in_service', `${unit.containerNumber} is not in service; it cannot be released.`);
      const today = now.toISOString().slice(0, 10);
      if (!stats?.ptiPassed || !stats.ptiValidUntil || stats.ptiValidUntil < today)
        throw new HttpError(
          409,
          'pti_invalid',
          stats?.ptiValidUntil && stats.ptiPassed
            ? `The PTI expired on ${fmtIsoDay(stats.ptiValidUntil)}; run a new one before release.`
            : 'The unit has no passed PTI; run one before release.',
        );
      validUntil = stats.ptiValidUntil;
      return {
        kind: 'status_change',
        note: input.note ? `Released for loading. ${input.note}` : 'Released for loading.',
        details: { status: 'in_service', release: { forLoading: true, ptiValidUntil: stats.ptiValidUntil } },
      };
    },
  );
  return { eventId, ptiValidUntil: validUntil, replayed };
}
