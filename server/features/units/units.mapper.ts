import type { UnitDto } from '../../../shared/schemas/units';
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
