// Plausibility rules of a visit that need the unit (its charge and refrigerant) and the clock.
// Used by the form as a preview and by the server as the rule.
import { dayOf } from '../domain/dates';
import { BEFORE_COMMISSIONING_MARGIN_DAYS, CLOCK_SKEW_MS } from './common';
import type { RecordVisitInput } from './history';
import { fmtIsoDay } from '../format-dates';

// Our definition: a single movement above twice the nominal charge is a typing error, not a service.
export const MAX_MOVEMENT_CHARGE_RATIO = 2;

// Highest gauge pressure accepted per refrigerant, kPa. Our definition, set above each fluid's highest
// condensing pressure at 60 °C (DOMAIN.md §3 curves) and, for R-744, above the usual high-side relief setting.
export const MAX_PLAUSIBLE_KPAG: Record<string, number> = {
  'R-134a': 2_600,
  'R-513A': 2_600,
  'R-1234yf': 2_600,
  'R-404A': 3_600,
  'R-452A': 3_600,
  'R-744': 14_000,
};

/**
 * The date rule for a visit (shared/schemas/common.ts has the rest): not in the future beyond the clock skew, and
 * not long before the unit was commissioned. The commissioning date is optional: the form may not know it.
 */
export function visitPlausibilityIssues(
  unit: { refrigerant: string; nominalChargeKg: number; commissionedOn?: string | null },
  input: Pick<RecordVisitInput, 'occurredAt' | 'events'>,
  now: Date,
): Record<string, string> {
  const fields: Record<string, string> = {};
  const atMs = Date.parse(input.occurredAt);
  const commissioned = unit.commissionedOn?.slice(0, 10) ?? null;
  if (atMs > now.getTime() + CLOCK_SKEW_MS) {
    fields.occurredAt = 'That time is in the future';
  } else if (commissioned && dayOf(Date.parse(commissioned)) - dayOf(atMs) > BEFORE_COMMISSIONING_MARGIN_DAYS) {
    fields.occurredAt = `That is more than a year before this unit was commissioned (${fmtIsoDay(commissioned)}); check the date, or the unit's commissioning date`;
  }
  const maxKg = unit.nominalChargeKg * MAX_MOVEMENT_CHARGE_RATIO;
  const maxKPaG = MAX_PLAUSIBLE_KPAG[unit.refrigerant] ?? 14_000;
  input.events.forEach((e, i) => {
    const at = (f: string) => `events.${i}.${f}`;
    if ((e.kind === 'top_up' || e.kind === 'recharge' || e.kind === 'recovery') && e.kg > maxKg) {
      fields[at('kg')] =
        `${e.kg} kg is more than twice this unit's ${unit.nominalChargeKg} kg charge; check the figure and the unit`;
    }
    if (e.kind === 'pressure') {
      for (const key of ['suctionKPaG', 'dischargeKPaG'] as const) {
        const v = e[key];
        if (v !== undefined && v > maxKPaG) {
          fields[at(key)] =
            `${Math.round(v)} kPa is above what an ${unit.refrigerant} unit shows; check the gauge and the unit`;
        }
      }
      if (e.suctionKPaG !== undefined && e.dischargeKPaG !== undefined && e.suctionKPaG > e.dischargeKPaG) {
        fields[at('suctionKPaG')] = 'Suction is higher than discharge; are the two readings swapped?';
      }
    }
  });
  return fields;
}
