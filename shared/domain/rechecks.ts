// Re-checks: coming back to a unit after refrigerant went in or a leak was repaired, to see that the charge held.
import { assessPressureHealth, type PressureSnapshotInput } from './pressure-health';
import { dayOf, isoDate, isoToMs } from './dates';
import { roundTo } from './numbers';
import { fmtIsoDay } from '../format-dates';
import type { SightGlassState } from './service-terms';
import { DEFAULT_SETTINGS, type Settings } from '../schemas/settings';

export type RecheckReason = 'top_up' | 'repair';
/** open: not due yet; due: due today; overdue: past its day; done: a later reading or leak check answered it. */
export type RecheckStatus = 'open' | 'due' | 'overdue' | 'done';
export type RecheckOutcome = 'held' | 'not_held' | 'unclear';

/** The events re-checks are made of (voided ones already left out), in time order. */
export interface DepotEvent {
  id: number;
  kind: string;
  /** ISO timestamp. */
  at: string;
  visitId: string | null;
  leakFound?: boolean | null;
  /** A first fill or retrofit charge (not made-up refrigerant). */
  excluded?: boolean | null;
  verified?: boolean | null;
  dischargeKPaG?: number | null;
  suctionKPaG?: number | null;
  ambientC?: number | null;
  sightGlass?: SightGlassState | null;
}

export interface Recheck {
  sourceEventId: number;
  reason: RecheckReason;
  /** When the top-up or repair was done. */
  sourceAt: string;
  dueOn: string;
  status: RecheckStatus;
  /** Done after its day, or still open after it. */
  missed: boolean;
  doneByEventId: number | null;
  doneOn: string | null;
  outcome: RecheckOutcome | null;
  /** The answer in words: "charge held: …" / "charge did not hold: …". */
  outcomeWords: string | null;
}

export interface RecheckSummary {
  rechecks: Recheck[];
  /** The open re-check due first, or null. */
  open: Recheck | null;
  /** Re-checks missed in the trailing 365 days (by their due day). */
  missed365: number;
}

const dayText = (at: string) => isoDate(dayOf(isoToMs(at)));

/**
 * Re-checks from a unit's history as of `asOf` (ISO date or timestamp):
 * - a top-up in a visit where no leak was both found and repaired → due `afterTopUpDays` later (default 1).
 *   Common practice, no published source: the technician comes back the next day to see that the charge held.
 * - every repair → due `afterRepairDays` later (default 30).
 *   Source: Regulation (EU) 2024/573 — a leak check within one month after a repair.
 * A top-up's re-check is answered by the first pressure reading or leak check in a later visit; a repair's by the first
 * leak check in a later visit (the regulation asks for a leak check). The answer says whether the charge held: a leak
 * check that found a leak, or a reading whose condenser approach drifted to the flag below the post-charge baseline
 * or a sight glass with bubbles or empty (DOMAIN.md §8, common practice), did not hold.
 */
export function rechecksFromHistory(
  unit: { refrigerant: string; commissionedOn: string | null },
  events: readonly DepotEvent[],
  asOf: string,
  settings: Settings = DEFAULT_SETTINGS,
): RecheckSummary {
  return rechecksOf(events, dayOf(isoToMs(asOf)), settings, pressureVerdicts(unit, events, settings));
}

/**
 * The re-checks of a history already in time order, as of a day number, without judging the readings that answered
 * them (the repeat-leak score needs only which were missed).
 */
export function recheckDates(
  events: readonly DepotEvent[],
  asOfDay: number,
  settings: Settings = DEFAULT_SETTINGS,
): RecheckSummary {
  return rechecksOf(events, asOfDay, settings, new Map());
}

function rechecksOf(
  events: readonly DepotEvent[],
  asOfDay: number,
  settings: Settings,
  verdicts: Map<number, Verdict>,
): RecheckSummary {
  const repairedVisits = new Set<string>();
  const leakVisits = new Set<string>();
  for (const e of events) {
    if (e.visitId == null) continue;
    if (e.kind === 'leak_check' && e.leakFound) leakVisits.add(e.visitId);
    if (e.kind === 'repair') repairedVisits.add(e.visitId);
  }
  const rechecks: Recheck[] = [];
  events.forEach((e, i) => {
    let reason: RecheckReason | null = null;
    if (e.kind === 'repair') reason = 'repair';
    else if (e.kind === 'top_up' && !e.excluded) {
      const fixed = e.visitId != null && leakVisits.has(e.visitId) && repairedVisits.has(e.visitId);
      if (!fixed) reason = 'top_up';
    }
    if (!reason) return;
    const days = reason === 'top_up' ? settings.rechecks.afterTopUpDays : settings.rechecks.afterRepairDays;
    const dueDay = dayOf(isoToMs(e.at)) + days;
    const answer = findAnswer(events, i, reason, verdicts);
    const doneDay = answer ? dayOf(isoToMs(answer.event.at)) : null;
    const status: RecheckStatus = answer ? 'done' : asOfDay > dueDay ? 'overdue' : asOfDay === dueDay ? 'due' : 'open';
    rechecks.push({
      sourceEventId: e.id,
      reason,
      sourceAt: e.at,
      dueOn: isoDate(dueDay),
      status,
      missed: doneDay != null ? doneDay > dueDay : asOfDay > dueDay,
      doneByEventId: answer?.event.id ?? null,
      doneOn: answer ? dayText(answer.event.at) : null,
      outcome: answer?.outcome ?? null,
      outcomeWords: answer?.words ?? null,
    });
  });
  // Several top-ups before one reading are answered together; one open re-check per reason is enough to show.
  const open = rechecks
    .filter((c) => c.status !== 'done')
    .reduce<Recheck | null>((a, c) => (a == null || c.dueOn < a.dueOn ? c : a), null);
  const missed365 = rechecks.filter((c) => c.missed && dayOf(isoToMs(c.dueOn)) > asOfDay - 365).length;
  return { rechecks, open, missed365 };
}

type Verdict = { outcome: RecheckOutcome; words: string };

function findAnswer(
  events: readonly DepotEvent[],
  from: number,
  reason: RecheckReason,
  verdicts: Map<number, Verdict>,
): ({ event: DepotEvent } & Verdict) | null {
  const source = events[from];
  const sourceMs = isoToMs(source.at);
  for (let j = from + 1; j < events.length; j++) {
    const e = events[j];
    const sameVisit = e.visitId != null && e.visitId === source.visitId;
    if (sameVisit || isoToMs(e.at) <= sourceMs) continue;
    if (e.kind === 'leak_check') {
      return e.leakFound
        ? { event: e, outcome: 'not_held', words: 'Charge did not hold: the leak check found a leak.' }
        : { event: e, outcome: 'held', words: 'Charge held: the leak check found no leak.' };
    }
    if (e.kind === 'pressure' && reason === 'top_up') {
      return { event: e, ...(verdicts.get(e.id) ?? { outcome: 'unclear', words: 'Pressure reading taken.' }) };
    }
  }
  return null;
}

/** Each pressure reading judged against the post-charge baseline (DOMAIN.md §8). */
function pressureVerdicts(
  unit: { refrigerant: string; commissionedOn: string | null },
  events: readonly DepotEvent[],
  settings: Settings,
): Map<number, Verdict> {
  const readings = events.filter((e) => e.kind === 'pressure');
  const out = new Map<number, Verdict>();
  if (!readings.length) return out;
  // Resets as the engine has them: recharges, verified repairs, commissioning.
  const resets = events
    .filter((e) => e.kind === 'recharge' || (e.kind === 'repair' && e.verified))
    .map((e) => e.at)
    .concat(unit.commissionedOn ? [unit.commissionedOn] : []);
  let snapshots;
  try {
    const inputs: PressureSnapshotInput[] = readings.map((r) => ({
      at: r.at,
      dischargeKPaG: r.dischargeKPaG ?? null,
      suctionKPaG: r.suctionKPaG ?? null,
      ambientC: r.ambientC ?? null,
      sightGlass: r.sightGlass ?? null,
    }));
    snapshots = assessPressureHealth(unit.refrigerant, inputs, resets, settings).snapshots;
  } catch {
    return out;
  }
  const limit = settings.pressure.driftFlagK;
  readings.forEach((r, i) => {
    const s = snapshots[i];
    if (s.sightGlass === 'bubbles' || s.sightGlass === 'empty') {
      out.set(r.id, {
        outcome: 'not_held',
        words: `Charge did not hold: the sight glass showed ${s.sightGlass === 'empty' ? 'no liquid' : 'bubbles'}.`,
      });
    } else if (s.driftK != null && s.driftK <= limit) {
      out.set(r.id, {
        outcome: 'not_held',
        words: `Charge did not hold: the condenser approach is ${roundTo(-s.driftK, 1)} K below its post-charge baseline.`,
      });
    } else if (s.driftK != null) {
      out.set(r.id, {
        outcome: 'held',
        words: `Charge held: the condenser approach is within ${-limit} K of its post-charge baseline.`,
      });
    } else if (s.sightGlass === 'full') {
      out.set(r.id, { outcome: 'held', words: 'Charge held: the sight glass was full (no post-charge baseline yet).' });
    } else {
      out.set(r.id, {
        outcome: 'unclear',
        words: 'Reading taken; no post-charge baseline to judge it against (note the sight glass next time).',
      });
    }
  });
  return out;
}

/** A re-check's reason in words, for lists. */
export function recheckWords(c: Pick<Recheck, 'reason' | 'sourceAt' | 'dueOn'>): string {
  return c.reason === 'top_up'
    ? `Re-check after the top-up of ${fmtIsoDay(dayText(c.sourceAt))}: see that the charge held (due ${fmtIsoDay(c.dueOn)}).`
    : `Leak check after the repair of ${fmtIsoDay(dayText(c.sourceAt))} (due ${fmtIsoDay(c.dueOn)}).`;
}
