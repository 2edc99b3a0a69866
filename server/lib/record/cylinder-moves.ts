// A visit's refrigerant movements against the cylinder register, inside the unit's write path (writeUnit): after the
// unit row, the cylinders named are locked in id order (SELECT … FOR UPDATE), checked, and each movement is linked
// to its cylinder. Weighings lock the same rows, so a weighing and a charge on one cylinder queue instead of both
// reading the old content. Lock order is always unit → cylinders; nothing locks a cylinder and then a unit.
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type { Tx } from '../../db/client';
import { cylinderMoves, cylinders, cylinderWeighings, events } from '../../db/schema';
import { badRequest, conflict } from '../http-error';
import { cylinderLedger, recoveryRoomKg } from '../../../shared/domain/cylinders';
import { cylinderSettingsOf } from '../../../shared/schemas/cylinders';

type Movement = { kind: string; kg?: number; cylinderId?: number; reusedRecovered?: boolean };
type CylinderRow = typeof cylinders.$inferSelect;

const notVoided = sql`NOT EXISTS (SELECT 1 FROM events v WHERE v.voids_event_id = ${cylinderMoves.eventId})`;

/** The cylinders' rows, locked in id order. */
export async function lockCylinders(tx: Tx, ids: readonly number[]): Promise<Map<number, CylinderRow>> {
  if (!ids.length) return new Map();
  const rows = await tx
    .select()
    .from(cylinders)
    .where(inArray(cylinders.id, [...new Set(ids)]))
    .orderBy(asc(cylinders.id))
    .for('update');
  return new Map(rows.map((r) => [r.id, r]));
}

/** The ledger of a cylinder read inside `tx` (after its lock, so it sees every committed move and weighing). */
export async function ledgerOf(tx: Tx, c: CylinderRow, settings: object) {
  const [weighings, moves] = await Promise.all([
    tx
      .select({ at: cylinderWeighings.weighedAt, grossKg: cylinderWeighings.grossKg })
      .from(cylinderWeighings)
      .where(eq(cylinderWeighings.cylinderId, c.id)),
    tx
      .select({ at: cylinderMoves.occurredAt, kg: cylinderMoves.kg, direction: cylinderMoves.direction })
      .from(cylinderMoves)
      .where(and(eq(cylinderMoves.cylinderId, c.id), notVoided)),
  ]);
  return cylinderLedger(
    {
      kind: c.kind,
      tareKg: c.tareKg,
      capacityKg: c.capacityKg,
      weighings: weighings.map((w) => ({ at: w.at.toISOString(), grossKg: w.grossKg })),
      moves: moves.map((m) => ({ at: m.at.toISOString(), kg: m.kg, direction: m.direction })),
    },
    cylinderSettingsOf(settings),
  );
}

const fmt = (kg: number) => `${Number(kg.toFixed(2))} kg`;

/**
 * Checks and records the cylinder of every movement that names one. Call it in the visit's writeUnit change after
 * the visit's events are inserted (`visitId` finds them in id order, the order of `entries`). Refuses with field
 * errors at `events.<i>.cylinderId`: an unknown cylinder, another refrigerant than the unit's, a recovery into a
 * supply cylinder, a quarantined or reclaimed cylinder, a recovery past the maker's marked maximum fill, or a charge
 * of more than the register says the cylinder holds.
 */
export async function recordCylinderMoves(
  tx: Tx,
  args: {
    unit: { id: number; refrigerant: string };
    visitId: number;
    occurredAt: Date;
    entries: readonly Movement[];
    /** The settings in force, read only when a movement names a cylinder. */
    settings: () => Promise<object>;
  },
): Promise<void> {
  const named = args.entries.flatMap((e, i) => (e.cylinderId != null && e.kg != null ? [{ ...e, i }] : []));
  if (!named.length) return;
  const settings = await args.settings();
  const locked = await lockCylinders(
    tx,
    named.map((e) => e.cylinderId!),
  );
  const fields: Record<string, string> = {};
  const ledgers = new Map<number, Awaited<ReturnType<typeof ledgerOf>>>();
  // Kilograms this visit already put into / took out of each cylinder, for several entries on one cylinder.
  const pending = new Map<number, number>();
  const { toleranceKg } = cylinderSettingsOf(settings);
  for (const e of named) {
    const at = `events.${e.i}.cylinderId`;
    const c = locked.get(e.cylinderId!);
    if (!c) {
      fields[at] = 'No such cylinder in the register';
      continue;
    }
    if (c.refrigerant !== args.unit.refrigerant) {
      fields[at] = `Cylinder ${c.code} holds ${c.refrigerant}; this unit runs on ${args.unit.refrigerant}`;
      continue;
    }
    if (c.status === 'quarantined') {
      fields[at] = `Cylinder ${c.code} is quarantined: do not use it`;
      continue;
    }
    if (c.status === 'sent_for_reclaim') {
      fields[at] = `Cylinder ${c.code} was sent for reclaim`;
      continue;
    }
    const recovery = e.kind === 'recovery';
    if (recovery && c.kind !== 'recovery') {
      fields[at] = `Cylinder ${c.code} is a supply cylinder; recover into a recovery cylinder`;
      continue;
    }
    if (!recovery && c.kind === 'recovery' && !e.reusedRecovered) {
      fields[at] = `Cylinder ${c.code} is a recovery cylinder; charge from it only when reusing recovered gas`;
      continue;
    }
    let ledger = ledgers.get(c.id);
    if (!ledger) ledgers.set(c.id, (ledger = await ledgerOf(tx, c, settings)));
    const already = pending.get(c.id) ?? 0;
    if (recovery) {
      const room = recoveryRoomKg(ledger, c.capacityKg) - already;
      if (e.kg! > room + 1e-9) {
        fields[at] =
          `Cylinder ${c.code} has room for about ${fmt(Math.max(0, room))} before the maker's marked maximum ` +
          `(${fmt(c.capacityKg)}); never overfill — use another recovery cylinder`;
        continue;
      }
      pending.set(c.id, already + e.kg!);
    } else {
      const content = ledger.contentKg;
      if (content != null && e.kg! > content - already + toleranceKg) {
        fields[at] =
          `The register says cylinder ${c.code} holds about ${fmt(Math.max(0, content - already))}; ` +
          'weigh it, or choose the cylinder you charged from';
        continue;
      }
      pending.set(c.id, already + e.kg!);
    }
  }
  if (Object.keys(fields).length) {
    const capacity = Object.values(fields).some((m) => m.includes('never overfill') || m.includes('holds about'));
    if (capacity) throw conflict('A cylinder cannot take or give that much; nothing was recorded.', fields);
    throw badRequest('Check the cylinders chosen; nothing was recorded.', fields);
  }
  const inserted = await tx
    .select({ id: events.id })
    .from(events)
    .where(eq(events.visitId, args.visitId))
    .orderBy(asc(events.id));
  await tx.insert(cylinderMoves).values(
    named.map((e) => ({
      cylinderId: e.cylinderId!,
      eventId: inserted[e.i].id,
      visitId: args.visitId,
      unitId: args.unit.id,
      direction: e.kind === 'recovery' ? ('in' as const) : ('out' as const),
      kg: e.kg!,
      occurredAt: args.occurredAt,
    })),
  );
  // A full cylinder that gave gas is in use; an empty recovery cylinder that took some is too.
  const touched = [...new Set(named.map((e) => e.cylinderId!))].filter((id) => {
    const s = locked.get(id)?.status;
    return s === 'full' || s === 'empty';
  });
  if (touched.length) {
    await tx
      .update(cylinders)
      .set({ status: 'in_use', updatedAt: sql`CURRENT_TIMESTAMP(3)` })
      .where(inArray(cylinders.id, touched));
  }
}
