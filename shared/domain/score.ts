import { isoDate } from './dates';
import { fmtIsoDay } from '../format-dates';
import { DomainError } from './errors';
import { isFiniteNumber, roundTo } from './numbers';
import { termLabel, LEAK_LOCATIONS, type LeakLocationId } from './service-terms';
import type { Settings } from '../schemas/settings';
import { DEFAULT_SETTINGS } from '../schemas/settings';

export type ScoreBand = 'tight' | 'watch' | 'chronic';
export type ScoreFactorName = 'rate' | 'count' | 'afterRepair' | 'sameSpot';

export interface ScoreFactor {
  /** 0 … 1 */
  value: number;
  weight: number;
  /** 100 × weight × value, to 0.1 */
  points: number;
  explanation: string;
}

/** A re-check after a top-up or repair whose day passed without one (shared/domain/rechecks.ts). */
export interface MissedRecheck {
  reason: 'top_up' | 'repair';
  /** Day of the top-up or repair (ISO). */
  sourceOn: string;
  dueOn: string;
  /** Day it was done after all, or null. */
  doneOn: string | null;
}

/** Evidence the record holds beside the four factors: re-checks missed in the trailing window. Adds no points. */
export interface ScoreEvidence {
  explanation: string;
  /** One line per missed re-check, newest first; its length is the count. */
  items: string[];
}

export interface RepeatLeakScore {
  value: number;
  band: ScoreBand;
  factors: Record<ScoreFactorName, ScoreFactor>;
  missedRechecks: ScoreEvidence;
}

/** A missed re-check in words: "Re-check after the top-up of 3 Mar 2026 missed (due 4 Mar 2026, not done)". */
export function missedRecheckWords(m: MissedRecheck): string {
  const what =
    m.reason === 'top_up'
      ? `Re-check after the top-up of ${fmtIsoDay(m.sourceOn)}`
      : `Leak check after the repair of ${fmtIsoDay(m.sourceOn)}`;
  return `${what} missed (due ${fmtIsoDay(m.dueOn)}, ${m.doneOn ? `done ${fmtIsoDay(m.doneOn)}` : 'not done'}).`;
}

// Common practice, no published source: a re-check nobody made leaves a top-up or repair unverified, a fact of the
// record worth reading beside the factors. It is listed, not weighed, so the score stays the formula and check values
// of DOMAIN.md §6. The 30-day re-check after a repair is the leak check Regulation (EU) 2024/573 asks for within one
// month of a repair.
function missedRecheckEvidence(missed: readonly MissedRecheck[], rollingDays: number): ScoreEvidence {
  const n = missed.length;
  return {
    explanation:
      n === 0
        ? `No re-check missed in the last ${rollingDays} days.`
        : `${plural(n, 're-check', 're-checks')} after a top-up or repair missed in the last ${rollingDays} days — listed as evidence; ${n === 1 ? 'it does' : 'they do'} not change the score.`,
    items: [...missed].sort((a, b) => (a.dueOn < b.dueOn ? 1 : a.dueOn > b.dueOn ? -1 : 0)).map(missedRecheckWords),
  };
}

/** What the score is computed from (DOMAIN.md §6), all as of one day. */
export interface ScoreInputs {
  /** Rolling leak rate, % of full charge. */
  rollingLeakRatePct: number;
  /** Visits with made-up refrigerant in the trailing window. */
  visitsWithMadeUp: number;
  /** Shortest gap in days from a repair to a later visit with made-up refrigerant or a found leak, where that
   * visit is inside the trailing window; null when none. */
  daysFromRepairToRecurrence: number | null;
  /** The location with leaks found on the most visits in the same-spot window, or null. */
  sameSpot: { location: LeakLocationId; visits: number } | null;
  /** Start of the rolling window when a verified repair cut it short (ISO date), for the explanation. */
  rollingSince?: string | null;
  /** Re-checks missed with their due day in the trailing window: evidence listed in the reasons, no points. */
  missedRechecks?: readonly MissedRecheck[];
}

/** Band of a score: below watchFrom "tight", below chronicFrom "watch", else "chronic" (DOMAIN.md §6). */
export function scoreBand(value: number, settings: Settings = DEFAULT_SETTINGS): ScoreBand {
  if (value < settings.score.watchFrom) return 'tight';
  if (value < settings.score.chronicFrom) return 'watch';
  return 'chronic';
}

function plural(n: number, one: string, many: string): string {
  return `${n} ${n === 1 ? one : many}`;
}

/**
 * Repeat-leak score per DOMAIN.md §6 (our definition):
 * score = round(100 × (0.40 f_rate + 0.25 f_count + 0.20 f_after_repair + 0.15 f_same_spot)), weights from settings;
 * f_rate = min(1, rolling % / cap); f_count = min(1, max(0, visits − 1) / 3);
 * f_after_repair = 1 within 180 days of a repair, 0.5 within 181–365, else 0; f_same_spot = 1 for a location on ≥ 2
 * visits. Missed re-checks are listed beside the factors as evidence and add nothing.
 */
export function repeatLeakScore(inputs: ScoreInputs, settings: Settings = DEFAULT_SETTINGS): RepeatLeakScore {
  const { rollingLeakRatePct: rate, visitsWithMadeUp, daysFromRepairToRecurrence: gap, sameSpot } = inputs;
  if (!isFiniteNumber(rate) || rate < 0)
    throw new DomainError('The rolling leak rate must be 0 % or more.', 'rollingLeakRatePct');
  if (!Number.isInteger(visitsWithMadeUp) || visitsWithMadeUp < 0) {
    throw new DomainError('The number of visits must be a whole number, 0 or more.', 'visitsWithMadeUp');
  }
  if (gap !== null && (!isFiniteNumber(gap) || gap < 0)) {
    throw new DomainError('The days from a repair to the next leak must be 0 or more.', 'daysFromRepairToRecurrence');
  }
  const w = settings.score.weights;
  const cap = settings.score.rateCapPct;
  const { rollingDays, afterRepairDays, sameSpotDays } = settings.windows;

  const fRate = Math.min(1, rate / cap);
  const fCount = Math.min(1, Math.max(0, visitsWithMadeUp - 1) / 3);
  const fAfter = gap === null ? 0 : gap <= afterRepairDays ? 1 : gap <= rollingDays ? 0.5 : 0;
  const fSame = sameSpot !== null && sameSpot.visits >= 2 ? 1 : 0;

  const since = inputs.rollingSince
    ? ` since the verified repair on ${fmtIsoDay(inputs.rollingSince)}`
    : ` over ${rollingDays} days`;
  const factor = (value: number, weight: number, explanation: string): ScoreFactor => ({
    value: roundTo(value, 4),
    weight,
    points: roundTo(100 * weight * value, 1),
    explanation,
  });
  const factors: Record<ScoreFactorName, ScoreFactor> = {
    rate: factor(
      fRate,
      w.rate,
      `Rolling leak rate ${roundTo(rate, 1)} % of full charge${since}; ${cap} % or more counts in full.`,
    ),
    count: factor(
      fCount,
      w.count,
      visitsWithMadeUp === 0
        ? `No refrigerant added in the last ${rollingDays} days.`
        : `${plural(visitsWithMadeUp, 'visit', 'visits')} with refrigerant added in the last ${rollingDays} days; the first is not counted, 4 or more count in full.`,
    ),
    afterRepair: factor(
      fAfter,
      w.afterRepair,
      gap === null
        ? `No leak came back after a repair in the last ${rollingDays} days.`
        : `A leak came back ${plural(gap, 'day', 'days')} after a repair (full within ${afterRepairDays} days, half within ${rollingDays}).`,
    ),
    sameSpot: factor(
      fSame,
      w.sameSpot,
      fSame === 1 && sameSpot
        ? `Leaks found at the ${termLabel(LEAK_LOCATIONS, sameSpot.location).toLowerCase()} on ${sameSpot.visits} visits in ${sameSpotDays} days.`
        : `No leak location found twice in ${sameSpotDays} days.`,
    ),
  };
  const raw = 100 * (w.rate * fRate + w.count * fCount + w.afterRepair * fAfter + w.sameSpot * fSame);
  const value = Math.min(100, Math.max(0, Math.round(raw)));
  const missedRechecks = missedRecheckEvidence(inputs.missedRechecks ?? [], rollingDays);
  return { value, band: scoreBand(value, settings), factors, missedRechecks };
}

export interface ScoreVisit {
  readonly day: number;
  readonly madeUpKg: number;
  readonly leakFound: boolean;
  readonly leakLocations: readonly LeakLocationId[];
  readonly repaired: boolean;
}

/**
 * Score inputs other than the rate from visits in time order, as of `asOfDay`, in one pass.
 * A recurrence is a visit after a repair visit with made-up refrigerant or a found leak; the repair visit's own
 * addition and leak belong to the leak before it. "Other" is not a location, so it never counts as the same spot.
 */
export function scoreInputsFromVisits(
  visits: readonly ScoreVisit[],
  asOfDay: number,
  rollingLeakRatePct: number,
  settings: Settings = DEFAULT_SETTINGS,
  rollingSinceDay: number | null = null,
): ScoreInputs {
  const { rollingDays, sameSpotDays } = settings.windows;
  let count = 0;
  let gap: number | null = null;
  let lastRepairDay: number | null = null;
  const spots = new Map<LeakLocationId, number>();
  for (const v of visits) {
    if (v.day > asOfDay) break;
    const inWindow = v.day > asOfDay - rollingDays;
    if (inWindow && v.madeUpKg > 0) count++;
    if (inWindow && lastRepairDay !== null && (v.madeUpKg > 0 || v.leakFound)) {
      const g = v.day - lastRepairDay;
      if (gap === null || g < gap) gap = g;
    }
    if (v.repaired) lastRepairDay = v.day;
    if (v.day > asOfDay - sameSpotDays) {
      for (const loc of v.leakLocations) if (loc !== 'other') spots.set(loc, (spots.get(loc) ?? 0) + 1);
    }
  }
  let sameSpot: ScoreInputs['sameSpot'] = null;
  for (const [location, n] of spots) if (sameSpot === null || n > sameSpot.visits) sameSpot = { location, visits: n };
  return {
    rollingLeakRatePct,
    visitsWithMadeUp: count,
    daysFromRepairToRecurrence: gap,
    sameSpot,
    rollingSince: rollingSinceDay === null ? null : isoDate(rollingSinceDay),
  };
}
