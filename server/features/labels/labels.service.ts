// The units a label sheet prints: their numbers and label codes.
import { eq, inArray } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { units } from '../../db/schema';
import { notFound } from '../../lib/http-error';

/** Units and their label codes in the order asked for; 404 naming the ids that do not exist. */
export async function unitsForLabels(db: Db, ids: number[]) {
  const unique = [...new Set(ids)];
  const rows = await db
    .select({
      id: units.id,
      containerNumber: units.containerNumber,
      refrigerant: units.refrigerant,
      nominalChargeKg: units.nominalChargeKg,
      qrToken: units.qrToken,
    })
    .from(units)
    .where(unique.length === 1 ? eq(units.id, unique[0]) : inArray(units.id, unique));
  const byId = new Map(rows.map((r) => [r.id, r]));
  const missing = unique.filter((id) => !byId.has(id));
  if (missing.length > 0)
    throw notFound(`No such unit: ${missing.slice(0, 10).join(', ')}${missing.length > 10 ? ' …' : ''}.`);
  return unique.map((id) => byId.get(id)!);
}
