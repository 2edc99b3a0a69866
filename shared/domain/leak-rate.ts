import { dayOf, parseAsOf, yearOfDay } from './dates';
import { DomainError } from './errors';
import type { Visit } from './events';
import { isFiniteNumber } from './numbers';

export { groupVisits, madeUpRefrigerantKg } from './events';

function requireFullCharge(fullChargeKg: number): void {
  if (!isFiniteNumber(fullChargeKg) || fullChargeKg <= 0) {
    throw new DomainError(`The full charge must be more than 0 kg, not ${String(fullChargeKg)}.`, 'fullChargeKg');
  }
}

/**
 * Annualized leak rate (%) = (made-up kg / full charge) × 365 / min(days since the previous addition, 365) × 100,
 * with at least 1 day (40 CFR 82.152 definition, EPA method).
 */
export function annualizedLeakRatePct(
  madeUpKg: number,
  fullChargeKg: number,
  daysSincePreviousAddition: number,
): number {
  requireFullCharge(fullChargeKg);
  if (!isFiniteNumber(madeUpKg) || madeUpKg < 0) {
    throw new DomainError(`Made-up refrigerant must be 0 kg or more, not ${String(madeUpKg)}.`, 'madeUpKg');
  }
  if (!isFiniteNumber(daysSincePreviousAddition) || daysSincePreviousAddition < 0) {
    throw new DomainError('The days since the previous addition must be 0 or more.', 'daysSincePreviousAddition');
  }
  const days = Math.min(Math.max(daysSincePreviousAddition, 1), 365);
  return (madeUpKg / fullChargeKg) * (365 / days) * 100;
}

export interface RateVisit {
  readonly day: number;
  readonly madeUpKg: number;
  readonly verifiedRepair: boolean;
}

export interface RollingSeries {
  /** Rolling rate (%) as of each visit's day. */
  readonly pctAtVisit: Float64Array;
  /** Index of the last verified repair visit, or -1. */
  readonly lastRepair: number;
  readonly prefixKg: Float64Array;
}

/**
 * Rolling rate as of day D = Σ made-up in the `windowDays` days up to D, or only after the last verified repair
 * visit if that is later (the repair visit's own addition belongs to the leak before it), / full charge × 100
 * (DOMAIN.md §4). One pass with a prefix sum and a trailing pointer: O(visits).
 */
export function rollingSeries(visits: readonly RateVisit[], fullChargeKg: number, windowDays: number): RollingSeries {
  const n = visits.length;
  const prefix = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) prefix[i + 1] = prefix[i] + visits[i].madeUpKg;
  const pct = new Float64Array(n);
  let left = 0;
  let lastRepair = -1;
  for (let i = 0; i < n; i++) {
    const day = visits[i].day;
    while (visits[left].day <= day - windowDays) left++;
    if (visits[i].verifiedRepair) lastRepair = i;
    const from = Math.max(left, lastRepair + 1);
    pct[i] = from <= i ? ((prefix[i + 1] - prefix[from]) / fullChargeKg) * 100 : 0;
  }
  return { pctAtVisit: pct, lastRepair, prefixKg: prefix };
}

/** Index of the first visit whose day is inside the `windowDays` days up to `day` (binary search). */
export function firstVisitInWindow(visits: readonly { day: number }[], day: number, windowDays: number): number {
  let lo = 0;
  let hi = visits.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (visits[mid].day <= day - windowDays) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Rolling rate (%) as of `asOf` from visits in time order (see rollingSeries). */
export function rollingLeakRatePct(
  visits: readonly RateVisit[],
  asOf: string,
  fullChargeKg: number,
  windowDays = 365,
): number {
  requireFullCharge(fullChargeKg);
  const asOfDay = dayOf(parseAsOf(asOf));
  let end = visits.length;
  while (end > 0 && visits[end - 1].day > asOfDay) end--;
  const start = firstVisitInWindow(visits, asOfDay, windowDays);
  let lastRepair = -1;
  for (let i = 0; i < end; i++) if (visits[i].verifiedRepair) lastRepair = i;
  let kg = 0;
  for (let i = Math.max(start, lastRepair + 1); i < end; i++) kg += visits[i].madeUpKg;
  return (kg / fullChargeKg) * 100;
}

/** Calendar-year share (%) = Σ made-up in the calendar year / full charge × 100; ≥ 125 % is chronic (40 CFR 82.157(m)). */
export function calendarYearSharePct(
  visits: readonly Pick<Visit, 'day' | 'madeUpKg'>[],
  year: number,
  fullChargeKg: number,
): number {
  requireFullCharge(fullChargeKg);
  let kg = 0;
  for (const v of visits) if (yearOfDay(v.day) === year) kg += v.madeUpKg;
  return (kg / fullChargeKg) * 100;
}
