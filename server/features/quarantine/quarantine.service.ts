// Quarantine of units: a mark (a note with details.quarantine) on each unit, by hand or for the units a trace search
// found, and a lift (details.quarantineLifted) by an engineer with what was found. Every mark goes through the unit
// write path, so the depot state (and with it My day, the fleet filter and release) follows in the same transaction.
import { asc, inArray } from 'drizzle-orm';
import { units } from '../../db/schema';
import type { AppContext } from '../../lib/app-context';
import { badRequest, HttpError } from '../../lib/http-error';
import { depotStateOf, loadDepotHistory } from '../../lib/record/depot-state';
import { writeSingleEntry } from '../../lib/record/entry';
import type { SessionUser } from '../../lib/session';
import { QUARANTINE_RESULTS } from '../../../shared/domain/quarantine';
import type {
  LiftQuarantineInput,
  LiftQuarantineResultDto,
  QuarantineUnitsInput,
  QuarantineUnitsResultDto,
} from '../../../shared/schemas/quarantine';

export async function quarantineUnits(
  ctx: AppContext,
  user: SessionUser,
  input: QuarantineUnitsInput,
): Promise<QuarantineUnitsResultDto> {
  const ids = [...new Set(input.unitIds)].sort((a, b) => a - b);
  const found = await ctx.db.select({ id: units.id }).from(units).where(inArray(units.id, ids)).orderBy(asc(units.id));
  if (found.length !== ids.length) {
    const known = new Set(found.map((f) => f.id));
    throw badRequest(`No such unit: ${ids.filter((i) => !known.has(i)).join(', ')}.`, { unitIds: 'Unknown unit' });
  }
  const result: QuarantineUnitsResultDto = { quarantined: [], alreadyQuarantined: [] };
  const how = input.source === 'trace' ? `trace search${input.search ? ` (${input.search})` : ''}` : 'by hand';
  // One unit per transaction, in id order: each through the write path with its own lock and retry.
  for (const id of ids) {
    let already = false;
    await writeSingleEntry(
      ctx,
      user,
      id,
      { key: `${input.idempotencyKey}-${id}`.slice(0, 64) },
      async (tx, { unit }, now) => {
        const settings = await ctx.caches.settings.get(tx);
        already = depotStateOf(unit, await loadDepotHistory(tx, id), now, settings).quarantine != null;
        return {
          kind: 'note',
          note: `Quarantined ${how}: ${input.reason}`.slice(0, 2000),
          details: {
            quarantine: { reason: input.reason, source: input.source, search: input.search ?? null, by: user.id },
          },
        };
      },
    );
    (already ? result.alreadyQuarantined : result.quarantined).push(id);
  }
  return result;
}

export async function liftQuarantine(
  ctx: AppContext,
  user: SessionUser,
  unitId: number,
  input: LiftQuarantineInput,
): Promise<LiftQuarantineResultDto & { replayed: boolean }> {
  const label = QUARANTINE_RESULTS.find((r) => r.id === input.result)!.label;
  const { eventId, replayed } = await writeSingleEntry(
    ctx,
    user,
    unitId,
    { key: input.idempotencyKey },
    async (tx, { unit }, now) => {
      const settings = await ctx.caches.settings.get(tx);
      const q = depotStateOf(unit, await loadDepotHistory(tx, unitId), now, settings).quarantine;
      if (!q) throw new HttpError(409, 'not_quarantined', `${unit.containerNumber} is not in quarantine.`);
      return {
        kind: 'note',
        note: `Quarantine lifted: ${label}. ${input.note}`.slice(0, 2000),
        details: {
          quarantineLifted: { result: input.result, note: input.note, by: user.id, since: q.since, reason: q.reason },
        },
      };
    },
  );
  return { unitId, eventId, replayed };
}
