import { addMonthsToDay, dayFromCivil, dayOf, isoDate, isoToMs, parseAsOf, parseIso, yearOfDay } from './dates';
import { co2eTonnes as co2eOf, leakCheckIntervalForPolicy, CHRONIC_CALENDAR_YEAR_SHARE_PCT } from './emissions';
import { DomainError } from './errors';
import { prepareHistory, type PressureEvent, type PtiEvent, type UnitEvent, type VisitStats } from './events';
import { type ForecastReason, type TopUpForecast } from './forecast';
import {
  forecastState,
  learnedForecast,
  type ForecastCaseBase,
  type ForecastTimeline,
  type LearnedForecast,
  type TimelineVisit,
} from './learned-forecast';
import { annualizedLeakRatePct, firstVisitInWindow, rollingSeries } from './leak-rate';
import { isFiniteNumber, roundTo } from './numbers';
import { pressureHealthFromReadings, type PressureHealth, type PressureSnapshot } from './pressure-health';
import { getRefrigerant, type RefrigerantCode } from './refrigerants';
import { recheckDates, type DepotEvent } from './rechecks';
import { repeatLeakScore, scoreInputsFromVisits, type MissedRecheck, type RepeatLeakScore } from './score';
import type { LeakLocationId } from './service-terms';
import type { Settings } from '../schemas/settings';
import { DEFAULT_SETTINGS } from '../schemas/settings';

export interface UnitInput {
  refrigerant: string;
  /** Full (nameplate) charge in kg. */
  nominalChargeKg: number;
  /** ISO date; null when unknown (the record's first event stands in). */
  commissionedOn: string | null;
  /** A working leak detection system (EU intervals double). */
  leakDetection?: boolean;
  /** Hermetically sealed (EU: no checks below 10 t CO2e). */
  hermetic?: boolean;
}

export interface UnitStats {
  asOf: string;
  refrigerant: RefrigerantCode;
  rollingLeakRatePct: number;
  /** Start of the rolling window (ISO date): the day after the last verified repair, or 364 days back. */
  rollingSince: string;
  /** True when a verified repair inside the window moved its start (rollingSince is then the day after it). */
  rollingSinceRepair: boolean;
  leakRateAboveThreshold: boolean;
  calendarYearSharePct: number;
  /** Calendar-year share ≥ 125 % (40 CFR 82.157(m)). */
  chronicallyLeaking: boolean;
  totalMadeUpKg365: number;
  co2eTonnes: number;
  leakCheckIntervalMonths: number | null;
  lastLeakCheckAt: string | null;
  nextLeakCheckDue: string | null;
  leakCheckOverdue: boolean;
  lastPtiAt: string | null;
  ptiPassed: boolean | null;
  ptiValidUntil: string | null;
  ptiValid: boolean;
  score: RepeatLeakScore;
  /** The unit's own rhythm (DOMAIN.md §7a): last addition + I, with the range of its fastest and slowest intervals. */
  rhythm: TopUpForecast | null;
  /** The forecast the product shows (§7b): learned from the fleet's case base, or the scaled rhythm without one. */
  forecast: LearnedForecast | null;
  forecastReason: ForecastReason | null;
  pressureHealth: PressureHealth;
  openLeak: { foundAt: string; location: LeakLocationId | null } | null;
  visits: VisitStats[];
  snapshots: PressureSnapshot[];
  counts: {
    events: number;
    visits: number;
    topUps: number;
    repairs: number;
    leakChecks: number;
    afterAsOf: number;
    ignored: number;
  };
}

function checkUnit(unit: UnitInput): { code: RefrigerantCode; startMs: number | null } {
  if (unit === null || typeof unit !== 'object') throw new DomainError('The unit is missing.', 'unit');
  const code = getRefrigerant(unit.refrigerant).code;
  if (!isFiniteNumber(unit.nominalChargeKg) || unit.nominalChargeKg <= 0) {
    throw new DomainError(
      `The full refrigerant charge must be more than 0 kg, not ${String(unit.nominalChargeKg)}.`,
      'nominalChargeKg',
    );
  }
  const startMs =
    unit.commissionedOn == null ? null : parseIso(unit.commissionedOn, 'commissionedOn', 'The commissioning date');
  return { code, startMs };
}

/**
 * Every figure of one unit as of `asOf` (DOMAIN.md §4–§8), from its events in any order. One sort, then linear passes.
 * Figures that cannot be known are null, never NaN. `caseBase` is the fleet's learned record for the forecast (§7b);
 * without it the forecast falls back to the unit's rhythm.
 */
export function computeUnitStats(
  unit: UnitInput,
  events: readonly UnitEvent[],
  asOf: string,
  settings: Settings = DEFAULT_SETTINGS,
  caseBase: ForecastCaseBase | null = null,
): UnitStats {
  return computeAll(unit, events, asOf, settings, caseBase).stats;
}

/**
 * The record of one unit as the forecast reads it (§7b), as of `asOf`: the input of forecastCases when the case base
 * is built. Same checks as computeUnitStats.
 */
export function unitForecastTimeline(
  unit: UnitInput,
  events: readonly UnitEvent[],
  asOf: string,
  settings: Settings = DEFAULT_SETTINGS,
): ForecastTimeline {
  return computeAll(unit, events, asOf, settings, null).timeline;
}

/** Re-checks missed with their due day in the trailing window, from the events in time order (visits as the engine has them). */
function missedRechecksOf(
  history: ReturnType<typeof prepareHistory>,
  asOfDay: number,
  settings: Settings,
): MissedRecheck[] {
  const depotEvents: DepotEvent[] = [];
  for (let k = 0; k < history.count; k++) {
    const e = history.source[history.order[k]];
    if (e.kind !== 'top_up' && e.kind !== 'repair' && e.kind !== 'leak_check' && e.kind !== 'pressure') continue;
    depotEvents.push({
      id: k,
      kind: e.kind,
      at: e.at,
      visitId: String(history.visitOf[k]),
      leakFound: e.kind === 'leak_check' ? e.leakFound : null,
      excluded: e.kind === 'top_up' ? e.excluded : null,
    });
  }
  const windowStart = asOfDay - settings.windows.rollingDays;
  const out: MissedRecheck[] = [];
  for (const c of recheckDates(depotEvents, asOfDay, settings).rechecks) {
    if (!c.missed || dayOf(isoToMs(c.dueOn)) <= windowStart) continue;
    out.push({ reason: c.reason, sourceOn: isoDate(dayOf(isoToMs(c.sourceAt))), dueOn: c.dueOn, doneOn: c.doneOn });
  }
  return out;
}

function computeAll(
  unit: UnitInput,
  events: readonly UnitEvent[],
  asOf: string,
  settings: Settings,
  caseBase: ForecastCaseBase | null,
): { stats: UnitStats; timeline: ForecastTimeline } {
  const { code, startMs } = checkUnit(unit);
  const asOfMs = parseAsOf(asOf);
  const asOfDay = dayOf(asOfMs);
  const full = unit.nominalChargeKg;
  const { rollingDays } = settings.windows;
  const history = prepareHistory(events, asOfMs);
  const { visits, count, order, source } = history;
  const startDay = startMs !== null ? dayOf(startMs) : count > 0 ? history.day[0] : asOfDay;

  // Rates per visit and as of the day.
  const series = rollingSeries(visits, full, rollingDays);
  let lastAdditionDay = startDay;
  let calendarKg = 0;
  const yearStart = dayFromCivil(yearOfDay(asOfDay), 1, 1);
  for (let i = 0; i < visits.length; i++) {
    const v = visits[i];
    if (v.madeUpKg > 0) {
      const since = Math.max(0, v.day - lastAdditionDay);
      v.daysSincePreviousAddition = since;
      v.annualizedRatePct = roundTo(annualizedLeakRatePct(v.madeUpKg, full, since), 2);
      if (v.day >= yearStart) calendarKg += v.madeUpKg;
    }
    if (v.added) lastAdditionDay = v.day;
    v.rollingRatePct = roundTo(series.pctAtVisit[i], 2);
  }
  const windowStart = firstVisitInWindow(visits, asOfDay, rollingDays);
  const from = Math.max(windowStart, series.lastRepair + 1);
  const prefix = series.prefixKg;
  const rollingKg = from < visits.length ? prefix[visits.length] - prefix[from] : 0;
  const rollingPct = (rollingKg / full) * 100;
  const repairCutsWindow = series.lastRepair >= 0 && visits[series.lastRepair].day >= asOfDay - rollingDays;
  const rollingSinceDay = repairCutsWindow ? visits[series.lastRepair].day + 1 : asOfDay - rollingDays + 1;
  const madeUp365 = prefix[visits.length] - prefix[windowStart];
  const calendarPct = (calendarKg / full) * 100;

  const score = repeatLeakScore(
    {
      ...scoreInputsFromVisits(
        visits,
        asOfDay,
        rollingPct,
        settings,
        repairCutsWindow ? visits[series.lastRepair].day : null,
      ),
      missedRechecks: missedRechecksOf(history, asOfDay, settings),
    },
    settings,
  );

  // One pass over the events for what is read straight off them.
  const readings: PressureEvent[] = [];
  const readingMs: number[] = [];
  // For the forecast: which visits were routine calls (a PTI), and which readings came after refrigerant went in.
  const ptiVisit = new Uint8Array(visits.length);
  const filledVisit = new Uint8Array(visits.length);
  const readingVisit: number[] = [];
  const readingAfterFill: boolean[] = [];
  const resets: number[] = startMs !== null ? [startMs] : [];
  let topUps = 0;
  let repairs = 0;
  let leakChecks = 0;
  // Positions (in time order) of the last leak check and PTI, and of the first leak found since the last repair.
  let lastLeakCheck = -1;
  let lastPti = -1;
  let openLeak = -1;
  let openLeakLocation: LeakLocationId | null = null;
  let lastRepairDay: number | null = null;
  let checkedAfterRepair = false;
  const { ms: msAt, day: dayAt } = history;
  for (let k = 0; k < count; k++) {
    const e = source[order[k]];
    switch (e.kind) {
      case 'top_up':
        topUps++;
        if (e.kg > 0) filledVisit[history.visitOf[k]] = 1;
        break;
      case 'recharge':
        if (e.kg > 0) {
          resets.push(msAt[k]);
          filledVisit[history.visitOf[k]] = 1;
        }
        break;
      case 'leak_check':
        leakChecks++;
        lastLeakCheck = k;
        if (lastRepairDay !== null && dayAt[k] > lastRepairDay) checkedAfterRepair = true;
        if (e.leakFound) {
          if (openLeak < 0) {
            openLeak = k;
            openLeakLocation = e.location ?? null;
          } else if (openLeakLocation === null && e.location) openLeakLocation = e.location;
        }
        break;
      case 'repair':
        repairs++;
        lastRepairDay = dayAt[k];
        checkedAfterRepair = false;
        openLeak = -1;
        openLeakLocation = null;
        if (e.verified === true) resets.push(msAt[k]);
        break;
      case 'pressure':
        readings.push(e);
        readingMs.push(msAt[k]);
        readingVisit.push(history.visitOf[k]);
        readingAfterFill.push(filledVisit[history.visitOf[k]] === 1);
        break;
      case 'pti':
        lastPti = k;
        ptiVisit[history.visitOf[k]] = 1;
        break;
    }
  }
  // A repair recorded in the same visit as the find clears it, whatever order the two were entered in.
  if (openLeak >= 0 && visits[history.visitOf[openLeak]].repaired) openLeak = -1;
  const pti = lastPti >= 0 ? (source[order[lastPti]] as PtiEvent) : null;
  const leakCheckAt = lastLeakCheck >= 0 ? source[order[lastLeakCheck]].at : null;
  if (resets.length > 1 && startMs !== null) resets.sort((a, b) => a - b);

  const pressure = pressureHealthFromReadings(code, readings, readingMs, resets, settings);

  const approach = new Float64Array(visits.length).fill(Number.NaN);
  const approachAfterFill = new Float64Array(visits.length).fill(Number.NaN);
  for (let i = 0; i < readings.length; i++) {
    const a = pressure.snapshots[i].approachK;
    if (a === null) continue;
    approach[readingVisit[i]] = a;
    if (readingAfterFill[i]) approachAfterFill[readingVisit[i]] = a;
  }
  const timelineVisits: TimelineVisit[] = visits.map((v, i) => ({
    day: v.day,
    madeUpKg: v.madeUpKg,
    verifiedRepair: v.verifiedRepair,
    repaired: v.repaired,
    pti: ptiVisit[i] === 1,
    approachK: approach[i],
    approachAfterFillK: approachAfterFill[i],
  }));
  const timeline: ForecastTimeline = { startDay, fullKg: full, visits: timelineVisits };
  const { state, rhythm, reason } = forecastState(timeline, asOfDay);
  const forecast = state ? learnedForecast(state, caseBase, settings.forecast.neighbours) : null;

  const tCO2e = co2eOf(code, full, settings.gwpBasis);
  const interval = leakCheckIntervalForPolicy(
    {
      tCO2e,
      fullChargeKg: full,
      rollingLeakRatePct: rollingPct,
      leakDetection: unit.leakDetection,
      hermetic: unit.hermetic,
    },
    settings,
  );
  let dueDay: number | null = null;
  if (interval !== null) {
    dueDay = addMonthsToDay(lastLeakCheck >= 0 ? dayAt[lastLeakCheck] : startDay, interval);
    // Re-check within one month of a repair (Reg. (EU) 2024/573), unless a leak check on a later day did it.
    if (lastRepairDay !== null && !checkedAfterRepair) dueDay = Math.min(dueDay, addMonthsToDay(lastRepairDay, 1));
  }
  const ptiUntilDay = pti?.passed ? dayAt[lastPti] + settings.ptiValidityDays : null;

  const stats: UnitStats = {
    asOf: isoDate(asOfDay),
    refrigerant: code,
    rollingLeakRatePct: roundTo(rollingPct, 2),
    rollingSince: isoDate(rollingSinceDay),
    rollingSinceRepair: repairCutsWindow,
    leakRateAboveThreshold: rollingPct >= settings.leakRateThresholdPct,
    calendarYearSharePct: roundTo(calendarPct, 2),
    chronicallyLeaking: calendarPct >= CHRONIC_CALENDAR_YEAR_SHARE_PCT,
    totalMadeUpKg365: roundTo(madeUp365, 3),
    co2eTonnes: roundTo(tCO2e, 3),
    leakCheckIntervalMonths: interval,
    lastLeakCheckAt: leakCheckAt,
    nextLeakCheckDue: dueDay === null ? null : isoDate(dueDay),
    leakCheckOverdue: dueDay !== null && dueDay < asOfDay,
    lastPtiAt: pti?.at ?? null,
    ptiPassed: pti?.passed ?? null,
    ptiValidUntil: ptiUntilDay === null ? null : isoDate(ptiUntilDay),
    ptiValid: ptiUntilDay !== null && asOfDay <= ptiUntilDay,
    score,
    rhythm,
    forecast,
    forecastReason: reason,
    pressureHealth: pressure.health,
    openLeak: openLeak < 0 ? null : { foundAt: source[order[openLeak]].at, location: openLeakLocation },
    visits,
    snapshots: pressure.snapshots,
    counts: {
      events: count,
      visits: visits.length,
      topUps,
      repairs,
      leakChecks,
      afterAsOf: history.afterAsOf,
      ignored: history.ignored,
    },
  };
  return { stats, timeline };
}
