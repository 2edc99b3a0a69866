// One entry written through the unit write path as a visit of its own, idempotent by the submission key: the depot's
// own writes (a structured PTI, a release, a quarantine mark or lift). The caller's check runs after the unit's lock,
// so what it reads (figures, quarantine) is what the previous writer committed.
import { asc, eq } from 'drizzle-orm';
import type { Tx } from '../../db/client';
import { events, visits } from '../../db/schema';
import { isDuplicateKeyError } from '../db-errors';
import { conflict } from '../http-error';
import type { SessionUser } from '../session';
import { writeUnit, type LockedUnit, type WriteContext } from './write-path';

export type EntryValues = Omit<
  typeof events.$inferInsert,
  'unitId' | 'visitId' | 'recordedBy' | 'occurredAt' | 'enteredAt' | 'siteId'
>;

export async function writeSingleEntry(
  ctx: WriteContext,
  user: SessionUser,
  unitId: number,
  opts: { key: string; occurredAt?: Date; siteId?: number | null },
  build: (tx: Tx, locked: LockedUnit, now: Date) => Promise<EntryValues>,
): Promise<{ eventId: number; replayed: boolean }> {
  const earlier = async () => {
    const [v] = await ctx.db
      .select({ id: visits.id, unitId: visits.unitId, recordedBy: visits.recordedBy })
      .from(visits)
      .where(eq(visits.idempotencyKey, opts.key));
    if (!v) return null;
    if (v.unitId !== unitId || v.recordedBy !== user.id)
      throw conflict('This submission key was already used for another entry.', { idempotencyKey: 'Already used' });
    const [e] = await ctx.db
      .select({ id: events.id })
      .from(events)
      .where(eq(events.visitId, v.id))
      .orderBy(asc(events.id))
      .limit(1);
    return { eventId: e.id, replayed: true };
  };
  const before = await earlier();
  if (before) return before;
  try {
    const { result } = await writeUnit(ctx, unitId, async (tx, locked, now) => {
      const values = await build(tx, locked, now);
      const at = opts.occurredAt ?? now;
      const siteId = opts.siteId === undefined ? locked.unit.siteId : opts.siteId;
      const [v] = await tx
        .insert(visits)
        .values({ unitId, siteId, recordedBy: user.id, occurredAt: at, enteredAt: now, idempotencyKey: opts.key })
        .$returningId();
      const [e] = await tx
        .insert(events)
        .values({ ...values, unitId, visitId: v.id, siteId, recordedBy: user.id, occurredAt: at, enteredAt: now })
        .$returningId();
      return { result: e.id };
    });
    return { eventId: result, replayed: false };
  } catch (err) {
    // A concurrent repeat of the same submission landed first.
    if (isDuplicateKeyError(err)) {
      const again = await earlier();
      if (again) return again;
    }
    throw err;
  }
}
