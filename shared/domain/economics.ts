import { dayOf, parseAsOf, parseIso } from './dates';
import { DomainError } from './errors';
import { isFiniteNumber, roundTo } from './numbers';
import { getRefrigerant } from './refrigerants';
import { termLabel, LEAK_LOCATIONS, type LeakLocationId } from './service-terms';
import type { Settings } from '../schemas/settings';
import { DEFAULT_SETTINGS } from '../schemas/settings';

function requireRate(r: number): void {
  if (!isFiniteNumber(r) || r <= -1) throw new DomainError('The discount rate must be a number above −100 %.', 'rate');
}
function requireYears(n: number): void {
  if (!Number.isInteger(n) || n < 1)
    throw new DomainError('The horizon must be a whole number of years, at least 1.', 'years');
}

/** P/A(r, n) = ((1+r)^n − 1) / (r(1+r)^n); n when r = 0 (standard compound-interest formula, Newnan). */
export function presentWorthFactor(r: number, n: number): number {
  requireRate(r);
  requireYears(n);
  if (r === 0) return n;
  const g = (1 + r) ** n;
  return (g - 1) / (r * g);
}

/** A/P(r, n) = 1 / (P/A(r, n)) (standard compound-interest formula, Newnan). */
export function capitalRecoveryFactor(r: number, n: number): number {
  return 1 / presentWorthFactor(r, n);
}

export interface CashFlows {
  /** Paid now (a negative value is money received now). */
  upfront: number;
  /** Paid at the end of each year 1 … n: one figure for every year, or a list of n figures. */
  yearly: number | readonly number[];
  /** Received at the end of year n. */
  salvage: number;
}

/** NPV = upfront + Σ_{t=1..n} C_t/(1+r)^t − S/(1+r)^n (costs positive; standard formula, Newnan). */
export function netPresentValue(flows: CashFlows, r: number, n: number): number {
  requireRate(r);
  requireYears(n);
  const { upfront, yearly, salvage } = flows;
  if (typeof yearly !== 'number' && yearly.length !== n) {
    throw new DomainError(`Give one yearly cost for each of the ${n} years.`, 'yearly');
  }
  for (const v of [upfront, salvage, ...(typeof yearly === 'number' ? [yearly] : yearly)]) {
    if (!isFiniteNumber(v)) throw new DomainError('Every cash flow must be a number.', 'flows');
  }
  let pv = upfront;
  let discount = 1;
  for (let t = 1; t <= n; t++) {
    discount /= 1 + r;
    pv += (typeof yearly === 'number' ? yearly : yearly[t - 1]) * discount;
  }
  return pv - salvage * discount;
}

/** EAC = NPV × A/P(r, n) (standard formula, Newnan). */
export function equivalentAnnualCost(npv: number, r: number, n: number): number {
  if (!isFiniteNumber(npv)) throw new DomainError('The NPV must be a number.', 'npv');
  return npv * capitalRecoveryFactor(r, n);
}

/** Whole years from commissioning to `asOf` (365.25-day years), 0 when commissioning is in the future. */
export function unitAgeYears(commissionedOn: string, asOf: string): number {
  const days = dayOf(parseAsOf(asOf)) - dayOf(parseIso(commissionedOn, 'commissionedOn', 'The commissioning date'));
  return Math.max(0, days / 365.25);
}

export type EconomicOptionId = 'keep_topping_up' | 'repair' | 'new_machinery' | 'retire_and_sell';

export interface EconomicOption {
  id: EconomicOptionId;
  label: string;
  upfront: number;
  yearlyCost: number;
  salvage: number;
  years: number;
  npv: number;
  eac: number;
  cheapest: boolean;
  description: string;
}

export interface RepairOptionsInput {
  refrigerant: string;
  ageYears: number;
  /** Expected days between top-ups (the forecast's a/λ); null when there is no leak evidence. */
  topUpIntervalDays: number | null;
  /** Expected made-up kg per top-up (the forecast's a); null when there is no leak evidence. */
  madeUpKgPerVisit: number | null;
  leakLocation?: LeakLocationId | null;
  /** The fleet's record of repairs at this location, from repairEffectiveness; fewer than the minimum uses the default. */
  fleetRepairs?: { repairs: number; recurred: number } | null;
}

export interface RepairOptionsResult {
  currency: string;
  options: EconomicOption[];
  cheapestId: EconomicOptionId;
  assumptions: {
    discountRatePct: number;
    designLifeYears: number;
    remainingYears: number;
    visitsPerYear: number;
    madeUpKgPerVisit: number;
    refrigerantPricePerKg: number;
    labourPerVisit: number;
    downtimePerVisit: number;
    repairCost: number;
    leakLocation: LeakLocationId;
    recurrence: number;
    recurrenceSource: 'fleet' | 'default';
    newUnitCost: number;
    machineryCost: number;
    residualValue: number;
    notes: string[];
  };
}

/**
 * Prices the four options of DOMAIN.md §9 over the remaining design life (at least 1 year) and marks the one with the
 * lowest equivalent annual cost. Retiring compares a new unit over a full design life, so EAC, not NPV, decides.
 */
export function compareRepairOptions(
  input: RepairOptionsInput,
  settings: Settings = DEFAULT_SETTINGS,
): RepairOptionsResult {
  const e = settings.economics;
  const code = getRefrigerant(input.refrigerant).code;
  if (!isFiniteNumber(input.ageYears) || input.ageYears < 0)
    throw new DomainError('The unit age must be 0 years or more.', 'ageYears');
  const interval = input.topUpIntervalDays;
  const kg = input.madeUpKgPerVisit;
  if (interval !== null && (!isFiniteNumber(interval) || interval <= 0)) {
    throw new DomainError('The days between top-ups must be more than 0.', 'topUpIntervalDays');
  }
  if (kg !== null && (!isFiniteNumber(kg) || kg < 0))
    throw new DomainError('The kg per top-up must be 0 or more.', 'madeUpKgPerVisit');

  const r = e.discountRatePct / 100;
  const remaining = Math.max(1, Math.round(e.designLifeYears - input.ageYears));
  const visitsPerYear = interval === null || kg === null ? 0 : 365 / interval;
  const kgPerVisit = visitsPerYear === 0 ? 0 : (kg ?? 0);
  const price = e.refrigerantPricePerKg[code];
  const keepYearly = visitsPerYear * (kgPerVisit * price + e.labourPerVisit + e.downtimePerVisit);
  const location: LeakLocationId = input.leakLocation ?? 'other';
  const repairCost = e.repairCostByLocation[location];
  const fleet = input.fleetRepairs;
  const useFleet = fleet != null && fleet.repairs >= e.minRepairsForRate;
  const recurrence = useFleet ? fleet.recurred / fleet.repairs : e.defaultRecurrence;

  const make = (
    id: EconomicOptionId,
    label: string,
    upfront: number,
    yearlyCost: number,
    years: number,
    description: string,
  ): EconomicOption => {
    // Each option runs a box to the end of its design life, when it is worth nothing; the residual value is what
    // this unit fetches now, so it only enters the retire option.
    const flows = { upfront, yearly: yearlyCost, salvage: 0 };
    const npv = netPresentValue(flows, r, years);
    return {
      id,
      label,
      upfront: roundTo(upfront, 2),
      yearlyCost: roundTo(yearlyCost, 2),
      salvage: flows.salvage,
      years,
      npv: roundTo(npv, 2),
      eac: roundTo(equivalentAnnualCost(npv, r, years), 2),
      cheapest: false,
      description,
    };
  };
  const where = termLabel(LEAK_LOCATIONS, location).toLowerCase();
  const options = [
    make(
      'keep_topping_up',
      'Keep topping up',
      0,
      keepYearly,
      remaining,
      `${roundTo(visitsPerYear, 2)} top-ups a year at the current leak rate.`,
    ),
    make(
      'repair',
      'Repair the leak',
      repairCost,
      keepYearly * recurrence,
      remaining,
      `Repair at the ${where}; ${Math.round(recurrence * 100)} % chance it leaks again.`,
    ),
    make(
      'new_machinery',
      'Fit new machinery',
      e.machineryCost,
      0,
      remaining,
      'New refrigeration machinery on the same box, assumed tight.',
    ),
    make(
      'retire_and_sell',
      'Retire and sell',
      e.newUnitCost - e.residualValue,
      0,
      e.designLifeYears,
      'Sell this unit at its residual value and buy a new one, priced over a full design life.',
    ),
  ];
  let cheapest = options[0];
  for (const o of options) if (o.eac < cheapest.eac) cheapest = o;
  cheapest.cheapest = true;

  return {
    currency: e.currency,
    options,
    cheapestId: cheapest.id,
    assumptions: {
      discountRatePct: e.discountRatePct,
      designLifeYears: e.designLifeYears,
      remainingYears: remaining,
      visitsPerYear: roundTo(visitsPerYear, 3),
      madeUpKgPerVisit: roundTo(kgPerVisit, 3),
      refrigerantPricePerKg: price,
      labourPerVisit: e.labourPerVisit,
      downtimePerVisit: e.downtimePerVisit,
      repairCost,
      leakLocation: location,
      recurrence: roundTo(recurrence, 4),
      recurrenceSource: useFleet ? 'fleet' : 'default',
      newUnitCost: e.newUnitCost,
      machineryCost: e.machineryCost,
      residualValue: e.residualValue,
      notes: [
        'Costs are yearly, paid at year end, and discounted at the rate shown.',
        'Each option runs to the end of a design life with nothing left; retiring sells this unit now at the residual value.',
        'New machinery and a new unit are assumed not to leak.',
        'Refrigerant price, labour, downtime and repair costs are settings; their defaults are invented demo figures.',
      ],
    },
  };
}
