import type { CreateUnitInput, UnitDto } from '../../../shared/schemas/units';
import { newToken } from '../../lib/ids';
import type { sites, units } from '../../db/schema';

type UnitRow = typeof units.$inferSelect;
type SiteRow = typeof sites.$inferSelect;

const iso = (d: Date | string) => new Date(d).toISOString();

export function toUnitDto(u: UnitRow, site: SiteRow | null): UnitDto {
  return {
    id: u.id,
    containerNumber: u.containerNumber,
    refrigerant: u.refrigerant,
    nominalChargeKg: Number(u.nominalChargeKg),
    commissionedOn: u.commissionedOn ?? null,
    status: u.status,
    site: site ? { id: site.id, code: site.code, name: site.name, kind: site.kind } : null,
    machinerySerial: u.machinerySerial ?? null,
    model: u.model ?? null,
    manufactureYear: u.manufactureYear ?? null,
    purchaseCost: u.purchaseCost == null ? null : Number(u.purchaseCost),
    residualValue: u.residualValue == null ? null : Number(u.residualValue),
    notes: u.notes ?? null,
    qrIssuedAt: iso(u.qrIssuedAt),
    createdAt: iso(u.createdAt),
    updatedAt: iso(u.updatedAt),
  };
}

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
