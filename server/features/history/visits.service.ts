// Recording visits and voids: append-only, through the unit write path.
import { recordCylinderMoves } from '../../lib/record/cylinder-moves';
import { createHash } from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { events, sites, unitChanges, units, users, visits } from '../../db/schema';
import type { AppContext } from '../../lib/app-context';
import { isDuplicateKeyError } from '../../lib/db-errors';
import { badRequest, conflict, forbidden, notFound } from '../../lib/http-error';
import { toStatsDto } from '../../lib/record/stats';
import { writeUnit } from '../../lib/record/write-path';
import { assertPtiMayPass } from '../../lib/record/depot-state';
import type { SessionUser } from '../../lib/session';
import { REFRIGERANT_MOVEMENT_KINDS } from '../../../shared/domain';
import { can } from '../../../shared/permissions';
import {
  VOID_WINDOW_HOURS,
  type RecordVisitByLabelInput,
  type RecordVisitInput,
  type RecordVisitResultDto,
} from '../../../shared/schemas/history';
import { visitPlausibilityIssues } from '../../../shared/schemas/visit-rules';
import { eventRow } from './history.mapper';
import { eventDtos, eventQuery, reads, unitIdByToken } from './history.queries';
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

/**
 * A visit recorded offline at a label the phone had never opened: the label's unit, then the same path as any visit
 * (its key, content hash and replay are those of the visit with the unit's id).
 */
export async function recordVisitByLabel(ctx: AppContext, user: SessionUser, input: RecordVisitByLabelInput) {
  const { qrToken, ...visit } = input;
  return recordVisit(ctx, user, { ...visit, unitId: await unitIdByToken(ctx.db, qrToken) });
}

export async function recordVisit(ctx: AppContext, user: SessionUser, input: RecordVisitInput) {
  const earlier = await replay(ctx.db, user, input);
  if (earlier) return earlier;
  try {
    const written = await writeUnit(ctx, input.unitId, async (tx, locked, now) => {
      const { unit } = locked;
      if (unit.status === 'retired' && input.events.some((e) => e.kind !== 'note' && e.kind !== 'status_change')) {
        throw conflict('This unit is retired. Record a status change first if it is back in service.');
      }
      const issues = visitPlausibilityIssues(unit, input, now);
      if (Object.keys(issues).length) throw badRequest('Some entries are not plausible.', issues);
      await assertPtiMayPass(tx, locked, input.events);
      const siteId = input.siteId ?? unit.siteId ?? null;
      if (input.siteId && input.siteId !== unit.siteId) {
        const [site] = await tx.select({ id: sites.id }).from(sites).where(eq(sites.id, input.siteId));
        if (!site) throw badRequest('Choose a known site.', { siteId: 'Unknown site' });
      }
      const occurredAt = new Date(input.occurredAt);
      // The certificate as it stands now stays with the visit: the refrigerant log shows what was held on the day.
      const [cert] = await tx
        .select({ number: users.certificateNumber, expiresOn: users.certificateExpiresOn })
        .from(users)
        .where(eq(users.id, user.id));
      const [inserted] = await tx
        .insert(visits)
        .values({
          unitId: unit.id,
          siteId,
          recordedBy: user.id,
          occurredAt,
          enteredAt: now,
          certificateNumber: cert?.number ?? null,
          certificateExpiresOn: cert?.expiresOn ?? null,
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
      await recordCylinderMoves(tx, {
        unit,
        visitId: inserted.id,
        occurredAt,
        entries: input.events,
        settings: () => ctx.caches.settings.get(tx),
      });
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
