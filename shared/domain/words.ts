// The words people read for the product's internal codes: one map, used by the screens, the CSV exports and the mails,
// so an export never says `chronic` where the screen says "Repeat leaker". A unit's status words are
// UNIT_STATUS_LABELS in shared/schemas/units.ts.
import { fmtKg, fmtMoney, fmtNumber, fmtPct } from '../format';
import type { RepairOptionsResult } from './economics';
import type { PressureFlag } from './pressure-health';
import type { ScoreBand, ScoreFactorName } from './score';
import { LEAK_LOCATIONS, termLabel } from './service-terms';

/** The repeat-leak score's three bands in our own words; the engine's ids stay internal. */
export const SCORE_BAND_WORDS: Record<ScoreBand, { label: string; blurb: string }> = {
  tight: { label: 'Holding', blurb: 'The loop holds its charge.' },
  watch: { label: 'Slipping', blurb: 'Losing refrigerant; watch the next visits.' },
  chronic: { label: 'Repeat leaker', blurb: 'Leaks again and again; a proper repair or a decision is due.' },
};

/** What each kind of entry in a unit's history is called. */
export const ENTRY_KIND_WORDS = {
  top_up: 'Top-up',
  recovery: 'Recovery',
  recharge: 'Recharge',
  leak_check: 'Leak check',
  repair: 'Repair',
  pressure: 'Pressure reading',
  pti: 'PTI',
  component_replacement: 'Part replaced',
  status_change: 'Status change',
  note: 'Note',
  decision: 'Decision',
} as const;

/** The four reasons a repeat-leak score is made of. */
export const SCORE_FACTOR_WORDS: Record<ScoreFactorName, string> = {
  rate: 'Leak rate',
  count: 'Repeated top-ups',
  afterRepair: 'Back after a repair',
  sameSpot: 'Same spot again',
};

export const PRESSURE_FLAG_WORDS: Record<PressureFlag, string> = {
  ok: 'Charge looks right',
  possible_low_charge: 'Possible low charge',
  unknown: 'Not enough readings',
};

type DecisionAssumptions = RepairOptionsResult['assumptions'];

/**
 * What a repair-or-retire decision assumed, as the decision page names it (the page adds the unit to a field's label:
 * "Discount rate (%)"); the handover PDF lists a recorded decision's assumptions with these words.
 */
export const DECISION_ASSUMPTION_WORDS = {
  leakLocation: 'Leak to repair',
  visitsPerYear: 'Top-ups a year',
  madeUpKgPerVisit: 'Refrigerant per top-up',
  refrigerantPricePerKg: 'Refrigerant price',
  labourPerVisit: 'Labour per visit',
  downtimePerVisit: 'Downtime per visit',
  repairCost: 'Repair',
  machineryCost: 'New machinery',
  newUnitCost: 'New unit',
  residualValue: 'Residual value now',
  discountRatePct: 'Discount rate',
  designLifeYears: 'Design life',
  remainingYears: 'Remaining life',
  recurrence: 'Leaks again after repair',
} as const satisfies Partial<Record<keyof DecisionAssumptions, string>>;

/** Where the chance of a repair leaking again came from. */
export const RECURRENCE_SOURCE_WORDS: Record<DecisionAssumptions['recurrenceSource'], string> = {
  fleet: 'from the fleet’s repairs at this location',
  default: 'default: fewer than 5 fleet repairs here',
};

/**
 * A recorded decision's assumptions as "label: value" lines with their units, in the decision page's order. A key
 * these words do not know (an older record) is shown as it is rather than hidden.
 */
export function decisionAssumptionLines(assumptions: Record<string, unknown>, currency?: string): string[] {
  const a = assumptions as Partial<DecisionAssumptions>;
  const W = DECISION_ASSUMPTION_WORDS;
  const num = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);
  const money = (v: number) => fmtMoney(v, currency || undefined);
  const years = (v: number) => `${fmtNumber(v, 1)} year${v === 1 ? '' : 's'}`;
  const where = typeof a.leakLocation === 'string' ? termLabel(LEAK_LOCATIONS, a.leakLocation) : null;
  const value: Record<keyof typeof W, string | null> = {
    leakLocation: where,
    visitsPerYear: num(a.visitsPerYear) ? fmtNumber(a.visitsPerYear, 2) : null,
    madeUpKgPerVisit: num(a.madeUpKgPerVisit) ? fmtKg(a.madeUpKgPerVisit) : null,
    refrigerantPricePerKg: num(a.refrigerantPricePerKg) ? `${money(a.refrigerantPricePerKg)} per kg` : null,
    labourPerVisit: num(a.labourPerVisit) ? money(a.labourPerVisit) : null,
    downtimePerVisit: num(a.downtimePerVisit) ? money(a.downtimePerVisit) : null,
    repairCost: num(a.repairCost) ? money(a.repairCost) : null,
    machineryCost: num(a.machineryCost) ? money(a.machineryCost) : null,
    newUnitCost: num(a.newUnitCost) ? money(a.newUnitCost) : null,
    residualValue: num(a.residualValue) ? money(a.residualValue) : null,
    discountRatePct: num(a.discountRatePct) ? fmtPct(a.discountRatePct) : null,
    designLifeYears: num(a.designLifeYears) ? years(a.designLifeYears) : null,
    remainingYears: num(a.remainingYears) ? years(a.remainingYears) : null,
    recurrence: num(a.recurrence)
      ? `${fmtPct(a.recurrence * 100)}${a.recurrenceSource ? ` (${wordFor(RECURRENCE_SOURCE_WORDS, a.recurrenceSource)})` : ''}`
      : null,
  };
  const label = (k: keyof typeof W) =>
    k === 'repairCost' && where ? `${W.repairCost} at ${where.toLowerCase()}` : W[k];
  const known = (Object.keys(W) as (keyof typeof W)[]).flatMap((k) =>
    value[k] == null ? [] : [`${label(k)}: ${value[k]}`],
  );
  const skipped = new Set<string>([...Object.keys(W), 'recurrenceSource', 'notes']);
  const unknown = Object.entries(assumptions)
    .filter(([k, v]) => !skipped.has(k) && (typeof v === 'number' || typeof v === 'string'))
    .map(([k, v]) => `${k}: ${String(v)}`);
  return [...known, ...unknown];
}

/** The word for a code of `map`; a code the map does not know is shown as it is rather than hidden. */
export function wordFor<M extends Record<string, string>>(map: M, code: string): string {
  return (map as Record<string, string>)[code] ?? code;
}
