import { dayOf, isoDate, parseAsOf, parseIso } from './dates';
import { DomainError } from './errors';
import { isFiniteNumber, median, roundTo } from './numbers';

export type ForecastReason = 'no_leak_evidence' | 'repaired_since_last_addition';

export interface ForecastInterval {
  from: string;
  to: string;
  days: number;
  /** Made-up refrigerant of the visit that ends the interval. */
  madeUpKg: number;
}

export interface TopUpForecast {
  /** Expected date of the next top-up. */
  date: string;
  /** From the fastest and slowest of the basis intervals; null with a single interval. */
  earliest: string | null;
  latest: string | null;
  /** The forecast date is before the "as of" day. */
  overdue: boolean;
  /** The last addition the forecast counts from. */
  lastAdditionDate: string;
  /** a / λ: expected days between top-ups. */
  intervalDays: number;
  /** a: expected made-up kg at the next top-up (median of the basis visits). */
  expectedKg: number;
  /** The ≤ 3 intervals used, oldest first. */
  basisIntervals: ForecastInterval[];
}

export interface ForecastResult {
  forecast: TopUpForecast | null;
  reason: ForecastReason | null;
}

export interface ForecastVisit {
  readonly day: number;
  readonly madeUpKg: number;
  readonly verifiedRepair: boolean;
}

const MAX_INTERVALS = 3;

/**
 * Next top-up forecast (DOMAIN.md §7, our definition). Uses visits with made-up refrigerant after the last verified
 * repair (all, if none); intervals run between consecutive additions, or with one such visit from the repair,
 * commissioning or record start (`startDay`). λ = Σ kg / Σ days over the last ≤ 3 intervals; a = median kg;
 * forecast = last addition + a/λ days; range from the fastest and slowest interval rate.
 */
export function forecastFromVisits(
  visits: readonly ForecastVisit[],
  startDay: number,
  asOfDay: number,
): ForecastResult {
  let lastRepair = -1;
  let anyAddition = false;
  let end = 0;
  for (; end < visits.length && visits[end].day <= asOfDay; end++) {
    if (visits[end].verifiedRepair) lastRepair = end;
    if (visits[end].madeUpKg > 0) anyAddition = true;
  }
  // Only the last MAX_INTERVALS + 1 additions after the repair can matter: walk back from the end.
  const picked: number[] = [];
  let countAfterRepair = 0;
  for (let i = end - 1; i > lastRepair; i--) {
    if (visits[i].madeUpKg > 0) {
      countAfterRepair++;
      if (picked.length < MAX_INTERVALS + 1) picked.push(i);
    }
  }
  if (countAfterRepair === 0) {
    return {
      forecast: null,
      reason: lastRepair >= 0 && anyAddition ? 'repaired_since_last_addition' : 'no_leak_evidence',
    };
  }
  picked.reverse();

  const intervals: { fromDay: number; toDay: number; days: number; kg: number }[] = [];
  if (picked.length === 1) {
    const v = visits[picked[0]];
    const fromDay = lastRepair >= 0 ? visits[lastRepair].day : startDay;
    intervals.push({ fromDay, toDay: v.day, days: Math.max(1, v.day - fromDay), kg: v.madeUpKg });
  } else {
    for (let k = 1; k < picked.length; k++) {
      const a = visits[picked[k - 1]];
      const b = visits[picked[k]];
      intervals.push({ fromDay: a.day, toDay: b.day, days: Math.max(1, b.day - a.day), kg: b.madeUpKg });
    }
  }

  let sumKg = 0;
  let sumDays = 0;
  let fastest = 0;
  let slowest = Number.POSITIVE_INFINITY;
  for (const iv of intervals) {
    sumKg += iv.kg;
    sumDays += iv.days;
    const rate = iv.kg / iv.days;
    if (rate > fastest) fastest = rate;
    if (rate < slowest) slowest = rate;
  }
  const lambda = sumKg / sumDays; // kg/day
  const a = median(intervals.map((iv) => iv.kg));
  const lastDay = visits[picked[picked.length - 1]].day;
  const intervalDays = a / lambda;
  const dateDay = lastDay + Math.round(intervalDays);
  const ranged = intervals.length >= 2;
  return {
    forecast: {
      date: isoDate(dateDay),
      earliest: ranged ? isoDate(lastDay + Math.round(a / fastest)) : null,
      latest: ranged ? isoDate(lastDay + Math.round(a / slowest)) : null,
      overdue: dateDay < asOfDay,
      lastAdditionDate: isoDate(lastDay),
      intervalDays: roundTo(intervalDays, 1),
      expectedKg: roundTo(a, 3),
      basisIntervals: intervals.map((iv) => ({
        from: isoDate(iv.fromDay),
        to: isoDate(iv.toDay),
        days: iv.days,
        madeUpKg: roundTo(iv.kg, 3),
      })),
    },
    reason: null,
  };
}

/** The naive benchmark forecast: the last interval between additions repeats. null with fewer than two additions. */
export function naiveForecastDay(additionDays: readonly number[]): number | null {
  const n = additionDays.length;
  if (n < 2) return null;
  return additionDays[n - 1] + (additionDays[n - 1] - additionDays[n - 2]);
}

export interface ForecastInputVisit {
  at: string;
  madeUpKg: number;
  verifiedRepair?: boolean;
}

/** Forecast from visits given with ISO dates; `startAt` is commissioning or the start of the record. */
export function forecastNextTopUp(
  visits: readonly ForecastInputVisit[],
  startAt: string,
  asOf: string,
): ForecastResult {
  const startDay = dayOf(parseIso(startAt, 'startAt', 'The start date'));
  const asOfDay = dayOf(parseAsOf(asOf));
  const days = visits.map((v, i) => {
    if (!isFiniteNumber(v.madeUpKg) || v.madeUpKg < 0) {
      throw new DomainError(`Visit ${i + 1}: made-up refrigerant must be 0 kg or more.`, `visits[${i}].madeUpKg`);
    }
    return {
      day: dayOf(parseIso(v.at, `visits[${i}].at`, `Visit ${i + 1} date`)),
      madeUpKg: v.madeUpKg,
      verifiedRepair: v.verifiedRepair === true,
    };
  });
  days.sort((x, y) => x.day - y.day);
  return forecastFromVisits(days, startDay, asOfDay);
}
