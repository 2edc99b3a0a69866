import type { units } from '../../db/schema';
import { newToken } from '../ids';
import type { CreateUnitInput } from '../../../shared/schemas/units';

/** The row of a newly registered unit (the register's form and the CSV import), with a fresh label code. */
export function newUnitRow(
  d: Omit<CreateUnitInput, 'siteId'>,
  siteId: number | null,
  at: Date,
): typeof units.$inferInsert {
  return {
    containerNumber: d.containerNumber,
    refrigerant: d.refrigerant,
    nominalChargeKg: d.nominalChargeKg,
    commissionedOn: d.commissionedOn ?? null,
    siteId,
    status: d.status ?? 'in_service',
    qrToken: newToken(),
    machinerySerial: d.machinerySerial ?? null,
    model: d.model ?? null,
    manufactureYear: d.manufactureYear ?? null,
    purchaseCost: d.purchaseCost ?? null,
    residualValue: d.residualValue ?? null,
    notes: d.notes ?? null,
    qrIssuedAt: at,
    createdAt: at,
    updatedAt: at,
  };
}
