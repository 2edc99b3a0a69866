// The next top-up forecast learned from the fleet's own record (DOMAIN.md §7b, our definition): the unit's situation
// and features at day D, and the 10/50/90 % quantiles of "days from D to the next top-up" among the K most similar
// past cases of the fleet in the same situation. The rhythm of §7a (forecast.ts) stays the unit's own evidence.
import { isoDate } from './dates';
import { forecastFromVisits, type ForecastReason, type ForecastVisit, type TopUpForecast } from './forecast';
import { median, roundTo } from './numbers';

export const FORECAST_SITUATIONS = [
  'first_top_up',
  'after_repair',
  'one_interval',
  'two_intervals',
  'three_or_more',
  'unverified_repair',
] as const;
/** What the unit's record looks like at D; cases are only compared within one situation. */
export type ForecastSituation = (typeof FORECAST_SITUATIONS)[number];

/** Each situation in a few words (the unit card says more, with its dates). */
export const FORECAST_SITUATION_LABELS: Readonly<Record<ForecastSituation, string>> = {
  first_top_up: 'First top-up on record',
  after_repair: 'First top-up after a repair',
  one_interval: 'One interval between top-ups',
  two_intervals: 'Two intervals between top-ups',
  three_or_more: 'Three or more intervals',
  unverified_repair: 'Unverified repair since the last top-up',
};

/** The features observable at D, in the order the case base stores them. */
export const FORECAST_FEATURES = [
  'logRhythmDays',
  'logWaitedDays',
  'logDaysLeft',
  'logDaysOver',
  'logPreRepairDays',
  'logSinceRepairDays',
  'logCallSpacingDays',
  'callPhase',
  'callsSinceTopUp',
  'approachDriftK',
  'lastTopUpWithoutCall',
  'lastKgShare',
  'minCallKgShare',
  'logExpectedDays',
] as const;
export type ForecastFeature = (typeof FORECAST_FEATURES)[number];
const F = FORECAST_FEATURES.length;

/**
 * How much each standardised feature counts in the distance. Our definition: chosen by coordinate descent on the
 * pinball loss, learning from a simulated fleet of seed 7 and judged on one of seed 5 (2,500 units each), never on a
 * fleet the backtest reports on. The spacing of routine calls alone did not help once its phase was known (0).
 */
export const FEATURE_WEIGHTS: Readonly<Record<ForecastFeature, number>> = {
  logRhythmDays: 8,
  logWaitedDays: 2,
  logDaysLeft: 8,
  logDaysOver: 1,
  logPreRepairDays: 2,
  logSinceRepairDays: 2,
  logCallSpacingDays: 0,
  callPhase: 1,
  callsSinceTopUp: 1,
  approachDriftK: 2,
  lastTopUpWithoutCall: 4,
  lastKgShare: 1,
  minCallKgShare: 1,
  logExpectedDays: 1,
};
// The features that count, heaviest first: a case's partial distance passes the K-th best sooner and is dropped.
const ORDER = Int32Array.from(
  FORECAST_FEATURES.map((f, i) => [FEATURE_WEIGHTS[f], i] as const)
    .filter(([w]) => w > 0)
    .sort((a, b) => b[0] - a[0] || a[1] - b[1])
    .map(([, i]) => i),
);
const ORDER_WEIGHTS = Float64Array.from(ORDER, (i) => FEATURE_WEIGHTS[FORECAST_FEATURES[i]]);

/** One visit as the forecast reads it (a visit with its made-up kg, repairs, routine call and readings). */
export interface TimelineVisit extends ForecastVisit {
  readonly repaired: boolean;
  /** A routine depot call: the visit recorded a PTI. */
  readonly pti: boolean;
  /** Condenser approach (K) of the visit's last reading; NaN without one. */
  readonly approachK: number;
  /** Approach of a reading taken after refrigerant went in at this visit; NaN without one. */
  readonly approachAfterFillK: number;
}

/** A unit's record as the forecast needs it: visits in time order, the day the record starts and the full charge. */
export interface ForecastTimeline {
  readonly startDay: number;
  readonly fullKg: number;
  readonly visits: readonly TimelineVisit[];
}

/** The unit at the end of day D: its rhythm (§7a), its situation and the features of §7b. */
export interface ForecastState {
  asOfDay: number;
  situation: ForecastSituation;
  features: Float64Array;
  rhythm: TopUpForecast;
  lastAdditionDay: number;
  /** The repair the situation speaks of (the verified one before the first top-up, or the unverified one). */
  repairDay: number | null;
  /** Rhythm interval I in days (unrounded). */
  rhythmDays: number;
}

const LN = Math.log;
const MAX_CALL_GAPS = 4;
const MAX_FILL_READINGS = 5;

/**
 * The rhythm (§7a) and, when there is one, the state of §7b at the end of day `asOfDay`. O(visits up to D).
 */
export function forecastState(
  t: ForecastTimeline,
  asOfDay: number,
): { state: ForecastState | null; rhythm: TopUpForecast | null; reason: ForecastReason | null } {
  const { forecast: rhythm, reason } = forecastFromVisits(t.visits, t.startDay, asOfDay);
  if (!rhythm) return { state: null, rhythm: null, reason };
  const v = t.visits;
  let end = 0;
  while (end < v.length && v[end].day <= asOfDay) end++;
  let lastVerified = -1;
  let lastAddition = -1;
  let lastRepair = -1;
  for (let i = 0; i < end; i++) {
    if (v[i].verifiedRepair) lastVerified = i;
    if (v[i].repaired) lastRepair = i;
    if (v[i].madeUpKg > 0) lastAddition = i;
  }
  let additions = 0;
  let minCallKg = Number.POSITIVE_INFINITY;
  for (let i = lastVerified + 1; i < end; i++) {
    if (v[i].madeUpKg > 0) {
      additions++;
      if (v[i].pti && v[i].madeUpKg < minCallKg) minCallKg = v[i].madeUpKg;
    }
  }
  const unverified = lastRepair >= lastAddition && !v[lastRepair].verifiedRepair;
  let situation: ForecastSituation;
  if (unverified) situation = 'unverified_repair';
  else if (additions === 1) situation = lastVerified >= 0 ? 'after_repair' : 'first_top_up';
  else if (additions === 2) situation = 'one_interval';
  else if (additions === 3) situation = 'two_intervals';
  else situation = 'three_or_more';

  const L = v[lastAddition].day;
  const waited = asOfDay - L;
  const sumKg = rhythm.basisIntervals.reduce((s, iv) => s + iv.madeUpKg, 0);
  const sumDays = rhythm.basisIntervals.reduce((s, iv) => s + iv.days, 0);
  const rateKgPerDay = sumKg / sumDays;
  const I = rhythm.expectedKg / rateKgPerDay;

  // The interval between the two additions before the last repair, and the days since that repair.
  let preRepair = Number.NaN;
  if (lastRepair >= 0) {
    let b = -1;
    for (let i = lastRepair - 1; i >= 0; i--) {
      if (v[i].madeUpKg > 0) {
        if (b < 0) b = i;
        else {
          preRepair = LN(Math.max(1, v[b].day - v[i].day));
          break;
        }
      }
    }
  }
  const sinceRepair = lastRepair >= 0 ? LN(1 + asOfDay - v[lastRepair].day) : Number.NaN;

  // Routine calls (PTIs): their usual spacing, where D falls between two, and how many passed since the top-up.
  const callDays: number[] = [];
  let callsSince = 0;
  for (let i = end - 1; i >= 0 && (callDays.length <= MAX_CALL_GAPS || i > lastAddition); i--) {
    if (!v[i].pti) continue;
    if (callDays.length <= MAX_CALL_GAPS) callDays.push(v[i].day);
    if (i > lastAddition) callsSince++;
  }
  let spacing = Number.NaN;
  let phase = Number.NaN;
  if (callDays.length >= 2) {
    const gaps: number[] = [];
    for (let i = 1; i < callDays.length; i++) gaps.push(Math.max(1, callDays[i - 1] - callDays[i]));
    spacing = median(gaps);
    phase = (asOfDay - callDays[0]) / spacing;
  }

  // Approach drift since the fills: the latest reading after the last top-up against readings taken just after fills.
  const fills: number[] = [];
  let current = Number.NaN;
  for (let i = end - 1; i >= 0 && fills.length < MAX_FILL_READINGS; i--) {
    if (i > lastAddition && Number.isNaN(current) && !Number.isNaN(v[i].approachK)) current = v[i].approachK;
    if (!Number.isNaN(v[i].approachAfterFillK)) fills.push(v[i].approachAfterFillK);
  }
  const drift = !Number.isNaN(current) && fills.length ? current - median(fills) : Number.NaN;

  // A model-free guess would ignore how top-ups happen: at the first routine call after the charge runs low. The
  // expected day of that call is one feature among the others (the smallest top-up at a call marks "low").
  const lowAfter = Number.isFinite(minCallKg) ? minCallKg / rateKgPerDay : I;
  const lowDay = Math.max(asOfDay + 1, L + lowAfter);
  let expected = lowDay - asOfDay;
  if (!Number.isNaN(spacing)) expected = callDays[0] + spacing * Math.ceil((lowDay - callDays[0]) / spacing) - asOfDay;

  const x = new Float64Array(F);
  x[0] = LN(I);
  x[1] = LN(1 + waited);
  x[2] = LN(1 + Math.max(0, I - waited));
  x[3] = LN(1 + Math.max(0, waited - I));
  x[4] = preRepair;
  x[5] = sinceRepair;
  x[6] = Number.isNaN(spacing) ? Number.NaN : LN(spacing);
  x[7] = phase;
  x[8] = LN(1 + callsSince);
  x[9] = drift;
  x[10] = v[lastAddition].pti ? 0 : 1;
  x[11] = v[lastAddition].madeUpKg / t.fullKg;
  x[12] = Number.isFinite(minCallKg) ? minCallKg / t.fullKg : Number.NaN;
  x[13] = LN(Math.max(1, expected));

  let repairDay: number | null = null;
  if (situation === 'unverified_repair') repairDay = v[lastRepair].day;
  else if (situation === 'after_repair') repairDay = v[lastVerified].day;
  return {
    state: { asOfDay, situation, features: x, rhythm, lastAdditionDay: L, repairDay, rhythmDays: I },
    rhythm,
    reason,
  };
}

// --- the case base ---------------------------------------------------------------------------------------------

/** A past cut-off: the state at D and what followed (null days = no top-up on record yet, censored). */
export interface ForecastCase {
  situation: ForecastSituation;
  features: Float64Array;
  /** Days from D to the next top-up; null while the interval is still open at the end of the record. */
  days: number | null;
  /** Days from D to the end of the record (what a still-open interval has lasted so far). */
  observedDays: number;
  waitedDays: number;
  rhythmDays: number;
  /** Which unit it came from (keeps one unit's cut-offs together when the fleet is split for measuring). */
  unitKey: number;
}

/**
 * Every cut-off of one unit's record, each `stepDays` from `fromDay` (a per-unit phase avoids everyone being cut on
 * the same days) to `toDay`, where the rhythm exists.
 */
export function forecastCases(
  t: ForecastTimeline,
  opts: { fromDay: number; toDay: number; stepDays: number; unitKey: number },
): ForecastCase[] {
  const out: ForecastCase[] = [];
  const v = t.visits;
  let next = 0;
  for (let d = opts.fromDay; d < opts.toDay; d += opts.stepDays) {
    const { state } = forecastState(t, d);
    if (!state) continue;
    while (next < v.length && (v[next].day <= d || !(v[next].madeUpKg > 0))) next++;
    const days = next < v.length ? v[next].day - d : null;
    out.push({
      situation: state.situation,
      features: state.features,
      days,
      observedDays: opts.toDay - d,
      waitedDays: d - state.lastAdditionDay,
      rhythmDays: state.rhythmDays,
      unitKey: opts.unitKey,
    });
  }
  return out;
}

/** The cases of one situation, standardised, as the forecast searches them. */
export interface SituationCases {
  /** Cases kept (a deterministic sample when the fleet has more than the cap). */
  n: number;
  /** Cases with a known next top-up before sampling. */
  total: number;
  mean: number[];
  sd: number[];
  /** n × features, standardised (a missing feature is 0, the mean). */
  x: Float32Array;
  /** Days from D to the next top-up. */
  y: Float32Array;
  /**
   * Quantiles 0, 5 %, …, 100 % of (actual interval ÷ rhythm interval) over every case of the situation, for the
   * small-fleet fallback; null with under 10 cases.
   */
  ratio: number[] | null;
  /**
   * Which quantiles of the neighbours' outcomes make the 80 % range: [0.1, 0.9] until calibrated on the fleet's own
   * record (the levels at which held-out cases fell below 10 % and above 90 % of the time).
   */
  levels: [number, number];
}

/** Accuracy of the forecast measured on the fleet's own record (or a test fleet). */
export interface SituationAccuracy {
  situation: ForecastSituation;
  /** Cases judged (outcome known, or still open past the range's upper end). */
  cases: number;
  /** Still-open intervals not yet past the range's upper end: not judged. */
  open: number;
  maeDays: number | null;
  coveragePct: number | null;
  pinballDays: number | null;
}
export interface ForecastAccuracy {
  measuredAt: string;
  k: number;
  cases: number;
  open: number;
  maeDays: number | null;
  coveragePct: number | null;
  pinballDays: number | null;
  bySituation: SituationAccuracy[];
}

export interface ForecastCaseBase {
  builtAt: string;
  features: readonly string[];
  situations: Partial<Record<ForecastSituation, SituationCases>>;
  accuracy: ForecastAccuracy | null;
}

/** Most cases kept per situation: enough for K = 100 neighbours, small enough for a forecast within 2 ms. */
export const MAX_CASES_PER_SITUATION = 25_000;
/** Fewer cases than this in a situation: the rhythm, scaled by the fleet's ratio (§7b small-fleet fallback). */
export const MIN_CASES_FOR_NEIGHBOURS = 100;
/** Fewer judged cases than this in a situation: its measured coverage is too uncertain to quote (our definition). */
export const MIN_JUDGED_FOR_COVERAGE = 30;
/** Held-out cases per situation and half of the fleet that the accuracy is measured on. */
export const MAX_MEASURED_PER_SITUATION = 5_000;

const RATIO_LEVELS = Array.from({ length: 21 }, (_, i) => i / 20);

/** The level p at which the quantile table `q` (at RATIO_LEVELS) reaches x, by linear interpolation. */
function levelOf(q: readonly number[], x: number): number {
  if (x <= q[0]) return 0;
  for (let i = 1; i < q.length; i++) {
    if (x <= q[i]) return RATIO_LEVELS[i - 1] + (q[i] > q[i - 1] ? ((x - q[i - 1]) / (q[i] - q[i - 1])) * 0.05 : 0);
  }
  return 1;
}

/** A 32-bit mix (for deterministic samples and folds). */
function mix(a: number, b: number): number {
  let h = Math.imul(a ^ 0x9e3779b9, 0x85ebca6b) ^ Math.imul(b + 0x165667b1, 0xc2b2ae35);
  h ^= h >>> 15;
  h = Math.imul(h, 0x27d4eb2f);
  return (h ^ (h >>> 13)) >>> 0;
}

function quantileSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 1) return sorted[0];
  const h = Math.min(1, Math.max(0, p)) * (n - 1);
  const lo = Math.floor(h);
  const hi = Math.min(n - 1, lo + 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

/**
 * Cut-offs of a whole fleet in columns (a few bytes a case, so a 100,000-unit fleet fits in memory): situation,
 * features, outcome days (NaN while open), days observed, waited and rhythm, and the unit.
 */
export interface CaseTable {
  n: number;
  situation: Uint8Array;
  x: Float32Array;
  days: Float32Array;
  observed: Float32Array;
  waited: Float32Array;
  rhythm: Float32Array;
  unitKey: Int32Array;
}

export function createCaseTable(capacity = 1024): CaseTable {
  return {
    n: 0,
    situation: new Uint8Array(capacity),
    x: new Float32Array(capacity * F),
    days: new Float32Array(capacity),
    observed: new Float32Array(capacity),
    waited: new Float32Array(capacity),
    rhythm: new Float32Array(capacity),
    unitKey: new Int32Array(capacity),
  };
}

function grow<T extends Float32Array | Uint8Array | Int32Array>(a: T, size: number): T {
  const b = new (a.constructor as new (n: number) => T)(size);
  b.set(a);
  return b;
}

/** Appends cases to the table (growing it as needed). */
export function appendCases(t: CaseTable, cases: readonly ForecastCase[]): void {
  const need = t.n + cases.length;
  if (need > t.situation.length) {
    const size = Math.max(need, t.situation.length * 2);
    t.situation = grow(t.situation, size);
    t.x = grow(t.x, size * F);
    t.days = grow(t.days, size);
    t.observed = grow(t.observed, size);
    t.waited = grow(t.waited, size);
    t.rhythm = grow(t.rhythm, size);
    t.unitKey = grow(t.unitKey, size);
  }
  for (const c of cases) {
    const i = t.n++;
    t.situation[i] = FORECAST_SITUATIONS.indexOf(c.situation);
    t.x.set(c.features, i * F);
    t.days[i] = c.days ?? Number.NaN;
    t.observed[i] = c.observedDays;
    t.waited[i] = c.waitedDays;
    t.rhythm[i] = c.rhythmDays;
    t.unitKey[i] = c.unitKey;
  }
}

export function caseTableOf(cases: readonly ForecastCase[]): CaseTable {
  const t = createCaseTable(Math.max(1, cases.length));
  appendCases(t, cases);
  return t;
}

/** The standardised cases of one situation from the rows `rows` of the table that have a known outcome. */
function situationCases(t: CaseTable, rows: readonly number[], cap: number): SituationCases {
  const known = rows.filter((i) => !Number.isNaN(t.days[i]));
  const ratios = known.map((i) => (t.waited[i] + t.days[i]) / Math.max(1, t.rhythm[i])).sort((a, b) => a - b);
  let kept = known;
  if (known.length > cap) {
    // The cap smallest hashes of (unit, position in its record): a sample that does not depend on row order.
    const keyed = known.map((i) => ({
      i,
      h: mix(t.unitKey[i], Math.round(t.waited[i] * 7919 + t.rhythm[i] * 104_729)),
    }));
    keyed.sort((a, b) => a.h - b.h || a.i - b.i);
    kept = keyed.slice(0, cap).map((k) => k.i);
  }
  const n = kept.length;
  const mean = new Array<number>(F).fill(0);
  const sd = new Array<number>(F).fill(0);
  for (let f = 0; f < F; f++) {
    let sum = 0;
    let count = 0;
    for (const i of kept) {
      const val = t.x[i * F + f];
      if (!Number.isNaN(val)) {
        sum += val;
        count++;
      }
    }
    const m = count ? sum / count : 0;
    let ss = 0;
    for (const i of kept) {
      const val = t.x[i * F + f];
      if (!Number.isNaN(val)) ss += (val - m) ** 2;
    }
    mean[f] = m;
    sd[f] = count > 1 ? Math.sqrt(ss / (count - 1)) : 0;
  }
  const x = new Float32Array(n * F);
  const y = new Float32Array(n);
  kept.forEach((row, j) => {
    y[j] = t.days[row];
    for (let f = 0; f < F; f++) x[j * F + f] = standardise(t.x[row * F + f], mean[f], sd[f]);
  });
  const ratio = ratios.length >= 10 ? RATIO_LEVELS.map((p) => roundTo(quantileSorted(ratios, p), 4)) : null;
  return { n, total: known.length, mean, sd, x, y, ratio, levels: [0.1, 0.9] };
}

function rowsBySituation(t: CaseTable, keep: (i: number) => boolean): number[][] {
  const out: number[][] = FORECAST_SITUATIONS.map(() => []);
  for (let i = 0; i < t.n; i++) if (keep(i)) out[t.situation[i]].push(i);
  return out;
}

/** The case base of the rows `keep` admits (all by default), with the levels uncalibrated. */
export function buildCaseBase(
  input: CaseTable | readonly ForecastCase[],
  opts: { builtAt: string; maxPerSituation?: number; keep?: (row: number) => boolean },
): ForecastCaseBase {
  const t = 'situation' in input ? input : caseTableOf(input);
  const cap = opts.maxPerSituation ?? MAX_CASES_PER_SITUATION;
  const situations: ForecastCaseBase['situations'] = {};
  rowsBySituation(t, opts.keep ?? (() => true)).forEach((rows, s) => {
    if (rows.some((i) => !Number.isNaN(t.days[i]))) situations[FORECAST_SITUATIONS[s]] = situationCases(t, rows, cap);
  });
  return { builtAt: opts.builtAt, features: [...FORECAST_FEATURES], situations, accuracy: null };
}

const pinball = (y: number, q: number, tau: number) => (y >= q ? tau * (y - q) : (1 - tau) * (q - y));

/**
 * Learns the case base from the fleet's cut-offs (§7b), and measures it on the fleet's own record: the units are split
 * in two halves, and each half's cases are forecast from the other half's (K neighbours, as in use). Where held-out
 * outcomes fell among their neighbours' outcomes sets the range's quantile levels (calibration: the 80 % range is
 * widened or narrowed until 10 % of outcomes fall below it and 10 % above), and the same held-out cases give MAE,
 * coverage of the 80 % range and pinball loss by situation; intervals still open count once they have outlasted the
 * range (a miss, with their error so far), else not at all.
 */
export function learnCaseBase(
  t: CaseTable,
  opts: { builtAt: string; k: number; maxPerSituation?: number; maxMeasuredPerSituation?: number },
): ForecastCaseBase {
  const steps = learnCaseBaseInSteps(t, opts);
  for (;;) {
    const r = steps.next();
    if (r.done) return r.value;
  }
}

/** Held-out forecasts between two pauses of learnCaseBaseInSteps. */
const QUERIES_PER_STEP = 100;

/**
 * learnCaseBase in steps: yields every few dozen milliseconds of work, so a server can let requests through between
 * steps; the return value is the case base.
 */
export function* learnCaseBaseInSteps(
  t: CaseTable,
  opts: { builtAt: string; k: number; maxPerSituation?: number; maxMeasuredPerSituation?: number },
): Generator<void, ForecastCaseBase> {
  const base = buildCaseBase(t, opts);
  yield;
  const maxMeasured = opts.maxMeasuredPerSituation ?? MAX_MEASURED_PER_SITUATION;
  const fold = (i: number) => mix(t.unitKey[i], 17) & 1;
  type Held = { row: number; ys: Float64Array };
  const held: Held[][] = FORECAST_SITUATIONS.map(() => []);
  for (const f of [0, 1]) {
    const other = buildCaseBase(t, { ...opts, keep: (i) => fold(i) !== f });
    yield;
    const bySituation = rowsBySituation(t, (i) => fold(i) === f);
    for (let s = 0; s < bySituation.length; s++) {
      const rows = bySituation[s];
      const cases = other.situations[FORECAST_SITUATIONS[s]];
      if (!cases || cases.n < MIN_CASES_FOR_NEIGHBOURS / 2) continue;
      let sample = rows;
      if (rows.length > maxMeasured) {
        sample = rows
          .map((i) => ({ i, h: mix(t.unitKey[i], Math.round(t.waited[i] * 31 + t.observed[i])) }))
          .sort((a, b) => a.h - b.h || a.i - b.i)
          .slice(0, maxMeasured)
          .map((k) => k.i);
      }
      const q = new Float64Array(F);
      let sinceYield = 0;
      for (const i of sample) {
        for (let j = 0; j < F; j++) q[j] = t.x[i * F + j];
        held[s].push({ row: i, ys: nearestOutcomes(cases, q, opts.k) });
        if (++sinceYield === QUERIES_PER_STEP) {
          sinceYield = 0;
          yield;
        }
      }
    }
  }
  const bySituation: SituationAccuracy[] = [];
  const totals = { cases: 0, open: 0, abs: 0, covered: 0, pin: 0 };
  FORECAST_SITUATIONS.forEach((name, s) => {
    const cases = base.situations[name];
    if (!cases) return;
    // Calibration: the PIT of each held-out outcome among its neighbours' outcomes (ties count half).
    const pit: number[] = [];
    for (const h of held[s]) {
      const y = t.days[h.row];
      if (Number.isNaN(y)) continue;
      let below = 0;
      let equal = 0;
      for (const v of h.ys) {
        if (v < y) below++;
        else if (v === y) equal++;
      }
      pit.push((below + equal / 2) / h.ys.length);
    }
    if (pit.length >= 200) {
      pit.sort((a, b) => a - b);
      cases.levels = [roundTo(quantileSorted(pit, 0.1), 4), roundTo(quantileSorted(pit, 0.9), 4)];
    }
    const acc = { cases: 0, open: 0, abs: 0, covered: 0, pin: 0 };
    for (const h of held[s]) {
      const r = rangeOf(h.ys, cases.levels);
      const y = t.days[h.row];
      if (Number.isNaN(y)) {
        const seen = t.observed[h.row];
        if (seen <= r.hi) {
          acc.open++;
          continue;
        }
        acc.cases++;
        acc.abs += seen - r.mid;
        acc.pin += (pinball(seen, r.lo, 0.1) + pinball(seen, r.hi, 0.9)) / 2;
        continue;
      }
      acc.cases++;
      acc.abs += Math.abs(y - r.mid);
      if (y >= r.lo && y <= r.hi) acc.covered++;
      acc.pin += (pinball(y, r.lo, 0.1) + pinball(y, r.hi, 0.9)) / 2;
    }
    for (const key of ['cases', 'open', 'abs', 'covered', 'pin'] as const) totals[key] += acc[key];
    bySituation.push({
      situation: name,
      cases: acc.cases,
      open: acc.open,
      maeDays: acc.cases ? roundTo(acc.abs / acc.cases, 1) : null,
      coveragePct: acc.cases ? roundTo((100 * acc.covered) / acc.cases, 1) : null,
      pinballDays: acc.cases ? roundTo(acc.pin / acc.cases, 1) : null,
    });
  });
  base.accuracy = {
    measuredAt: opts.builtAt,
    k: opts.k,
    cases: totals.cases,
    open: totals.open,
    maeDays: totals.cases ? roundTo(totals.abs / totals.cases, 1) : null,
    coveragePct: totals.cases ? roundTo((100 * totals.covered) / totals.cases, 1) : null,
    pinballDays: totals.cases ? roundTo(totals.pin / totals.cases, 1) : null,
    bySituation,
  };
  return base;
}

/** Median and 80 % range (whole days from D, at least 1) from sorted neighbour outcomes. */
function rangeOf(ys: ArrayLike<number>, levels: readonly [number, number]): { lo: number; mid: number; hi: number } {
  const mid = Math.max(1, Math.round(quantileSorted(ys, 0.5)));
  return {
    mid,
    lo: Math.max(1, Math.min(mid, Math.floor(quantileSorted(ys, levels[0])))),
    hi: Math.max(mid, Math.ceil(quantileSorted(ys, levels[1]))),
  };
}

function standardise(value: number, mean: number, sd: number): number {
  return Number.isNaN(value) || !(sd > 0) ? 0 : (value - mean) / sd;
}

/** The learned forecast as the product shows it. */
export interface LearnedForecast {
  /** Median date of the next top-up; never before the day after D. */
  date: string;
  /** The 80 % range (10 % and 90 % quantiles); null when there is no basis for one. */
  earliest: string | null;
  latest: string | null;
  /** Days from D to the median date (and to the range's ends). */
  withinDays: number;
  earliestDays: number | null;
  latestDays: number | null;
  /** Always false: the date is conditioned on the wait, so it is never before D (kept for the stored column). */
  overdue: boolean;
  situation: ForecastSituation;
  /** The repair the situation speaks of (ISO date), if any. */
  repairDate: string | null;
  /** 'cases': the K most similar past cases of the fleet; 'rhythm': too few cases, the scaled rhythm. */
  basis: 'cases' | 'rhythm';
  /** Cases the quantiles come from (K), or the fleet's cases in this situation for the fallback. */
  neighbours: number;
  /** Cases of this situation in the fleet's case base. */
  situationCases: number;
  lastAdditionDate: string;
  waitedDays: number;
  /** The unit has waited longer than its own rhythm interval. */
  pastRhythm: boolean;
  /** The forecast's median interval, last top-up → median date: the rhythm the economics use. */
  intervalDays: number;
  /** Expected made-up kg at the next top-up (the rhythm's a). */
  expectedKg: number;
  /** The rhythm's basis (§7a): its intervals, oldest first. */
  basisIntervals: TopUpForecast['basisIntervals'];
  rhythmIntervalDays: number;
  /** On this fleet, how often ranges of this situation held the next top-up (latest measurement); null unmeasured. */
  coveragePct: number | null;
}

/** K nearest cases by weighted squared distance on standardised features; returns their outcome days, sorted. */
function nearestOutcomes(cases: SituationCases, query: Float64Array, k: number): Float64Array {
  const { n, x, y, mean, sd } = cases;
  const q = new Float64Array(F);
  for (let f = 0; f < F; f++) q[f] = standardise(query[f], mean[f], sd[f]);
  const kk = Math.min(k, n);
  // A max-heap of the kk best distances so far.
  const heapD = new Float64Array(kk);
  const heapI = new Int32Array(kk);
  const A = ORDER.length;
  let size = 0;
  for (let i = 0; i < n; i++) {
    const bound = size < kk ? Number.POSITIVE_INFINITY : heapD[0];
    const o = i * F;
    let d = 0;
    let j = 0;
    for (; j < A; j++) {
      const diff = x[o + ORDER[j]] - q[ORDER[j]];
      d += ORDER_WEIGHTS[j] * diff * diff;
      if (d >= bound) break;
    }
    if (j < A) continue;
    if (size < kk) {
      let j = size++;
      while (j > 0) {
        const p = (j - 1) >> 1;
        if (heapD[p] >= d) break;
        heapD[j] = heapD[p];
        heapI[j] = heapI[p];
        j = p;
      }
      heapD[j] = d;
      heapI[j] = i;
    } else if (d < heapD[0]) {
      let j = 0;
      for (;;) {
        const l = 2 * j + 1;
        if (l >= kk) break;
        const r = l + 1;
        const c = r < kk && heapD[r] > heapD[l] ? r : l;
        if (heapD[c] <= d) break;
        heapD[j] = heapD[c];
        heapI[j] = heapI[c];
        j = c;
      }
      heapD[j] = d;
      heapI[j] = i;
    }
  }
  const out = new Float64Array(size);
  for (let i = 0; i < size; i++) out[i] = y[heapI[i]];
  return out.sort();
}

/** Median and 80 % range in whole days from D (at least 1), from the cases or the fallback; null ends: no basis. */
export function forecastQuantiles(
  state: ForecastState,
  caseBase: ForecastCaseBase | null,
  k: number,
): {
  lo: number | null;
  mid: number;
  hi: number | null;
  basis: 'cases' | 'rhythm';
  neighbours: number;
  situationCases: number;
} {
  const cases = caseBase?.situations[state.situation];
  const situationCases = cases?.total ?? 0;
  if (cases && cases.n >= MIN_CASES_FOR_NEIGHBOURS) {
    const ys = nearestOutcomes(cases, state.features, k);
    return { ...rangeOf(ys, cases.levels), basis: 'cases', neighbours: ys.length, situationCases };
  }
  // Our definition (§7b): too few cases → the rhythm scaled by the fleet's ratio of actual to rhythm intervals in this
  // situation, conditioned on the wait like the cases: the ratio's 10/50/90 % among intervals that lasted at least as
  // long as this unit has waited. Without a ratio (no fleet record yet) the rhythm itself, its range from the fastest
  // and slowest intervals. Never before the day after D; no range once the unit has outlasted every basis.
  const waited = state.asOfDay - state.lastAdditionDay;
  const I = state.rhythmDays;
  const r = cases?.ratio ?? null;
  const fallback = { basis: 'rhythm' as const, neighbours: situationCases, situationCases };
  let lo: number;
  let mid: number;
  let hi: number;
  if (r) {
    const p0 = levelOf(r, waited / I);
    if (p0 >= 0.999) return { lo: null, mid: 1, hi: null, ...fallback };
    const at = (p: number) => quantileSorted(r, p0 + (1 - p0) * p) * I - waited;
    [lo, mid, hi] = [at(0.1), at(0.5), at(0.9)];
  } else {
    mid = I - waited;
    if (!state.rhythm.earliest || !state.rhythm.latest)
      return { lo: null, mid: Math.max(1, Math.round(mid)), hi: null, ...fallback };
    lo = dayNumber(state.rhythm.earliest) - state.asOfDay;
    hi = dayNumber(state.rhythm.latest) - state.asOfDay;
  }
  const m = Math.max(1, Math.round(mid));
  if (hi < 1) return { lo: null, mid: m, hi: null, ...fallback };
  return { lo: Math.max(1, Math.min(m, Math.floor(lo))), mid: m, hi: Math.max(m, Math.ceil(hi)), ...fallback };
}

function dayNumber(iso: string): number {
  return Math.floor(Date.parse(`${iso.slice(0, 10)}T00:00:00Z`) / 86_400_000);
}

/** The forecast of §7b from the unit's state at D and the fleet's case base (null = none learned yet). */
export function learnedForecast(state: ForecastState, caseBase: ForecastCaseBase | null, k: number): LearnedForecast {
  const q = forecastQuantiles(state, caseBase, k);
  const D = state.asOfDay;
  const { lo, mid, hi } = q;
  const waited = D - state.lastAdditionDay;
  const measured =
    q.basis === 'cases' ? caseBase?.accuracy?.bySituation.find((s) => s.situation === state.situation) : undefined;
  const coverage = measured && measured.cases >= MIN_JUDGED_FOR_COVERAGE ? measured.coveragePct : null;
  return {
    date: isoDate(D + mid),
    earliest: lo === null ? null : isoDate(D + lo),
    latest: hi === null ? null : isoDate(D + hi),
    withinDays: mid,
    earliestDays: lo,
    latestDays: hi,
    overdue: false,
    situation: state.situation,
    repairDate: state.repairDay === null ? null : isoDate(state.repairDay),
    basis: q.basis,
    neighbours: q.neighbours,
    situationCases: q.situationCases,
    lastAdditionDate: isoDate(state.lastAdditionDay),
    waitedDays: waited,
    pastRhythm: waited > state.rhythmDays,
    intervalDays: roundTo(waited + mid, 1),
    expectedKg: state.rhythm.expectedKg,
    basisIntervals: state.rhythm.basisIntervals,
    rhythmIntervalDays: state.rhythm.intervalDays,
    coveragePct: coverage,
  };
}

// --- storage form -----------------------------------------------------------------------------------------------

const FORMAT = 1;
/** Standardised features are kept as 16-bit integers in steps of 1/2048 (±16 standard deviations). */
const FEATURE_SCALE = 2048;

/** The case base as bytes (a JSON header, then each situation's features as Int16 and outcomes as Float32). */
export function encodeCaseBase(cb: ForecastCaseBase): Uint8Array {
  const names = FORECAST_SITUATIONS.filter((s) => cb.situations[s]);
  const header = {
    format: FORMAT,
    builtAt: cb.builtAt,
    features: cb.features,
    accuracy: cb.accuracy,
    situations: names.map((s) => {
      const { x: _x, y: _y, ...rest } = cb.situations[s]!;
      return { situation: s, ...rest };
    }),
  };
  const head = new TextEncoder().encode(JSON.stringify(header));
  const headLen = 4 + head.length + ((4 - ((4 + head.length) % 4)) % 4);
  let size = headLen;
  for (const s of names) {
    const c = cb.situations[s]!;
    size += c.n * F * 2 + ((c.n * F * 2) % 4) + c.n * 4;
  }
  const out = new Uint8Array(size);
  const view = new DataView(out.buffer);
  view.setUint32(0, head.length, true);
  out.set(head, 4);
  let o = headLen;
  for (const s of names) {
    const c = cb.situations[s]!;
    for (let i = 0; i < c.n * F; i++, o += 2) {
      view.setInt16(o, Math.max(-32767, Math.min(32767, Math.round(c.x[i] * FEATURE_SCALE))), true);
    }
    o += (c.n * F * 2) % 4;
    for (let i = 0; i < c.n; i++, o += 4) view.setFloat32(o, c.y[i], true);
  }
  return out;
}

/** Reads what encodeCaseBase wrote; throws on a different format or a truncated buffer. */
export function decodeCaseBase(bytes: Uint8Array): ForecastCaseBase {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const len = view.getUint32(0, true);
  const header = JSON.parse(new TextDecoder().decode(bytes.subarray(4, 4 + len))) as {
    format: number;
    builtAt: string;
    features: string[];
    accuracy: ForecastAccuracy | null;
    situations: (Omit<SituationCases, 'x' | 'y'> & { situation: ForecastSituation })[];
  };
  if (header.format !== FORMAT) throw new Error(`Unknown case-base format ${header.format}.`);
  if (header.features.join() !== FORECAST_FEATURES.join())
    throw new Error('The case base was built with other features.');
  let o = 4 + len + ((4 - ((4 + len) % 4)) % 4);
  const situations: ForecastCaseBase['situations'] = {};
  for (const { situation, ...rest } of header.situations) {
    const x = new Float32Array(rest.n * F);
    for (let i = 0; i < rest.n * F; i++, o += 2) x[i] = view.getInt16(o, true) / FEATURE_SCALE;
    o += (rest.n * F * 2) % 4;
    const y = new Float32Array(rest.n);
    for (let i = 0; i < rest.n; i++, o += 4) y[i] = view.getFloat32(o, true);
    situations[situation] = { ...rest, x, y };
  }
  if (o !== bytes.byteLength) throw new Error('The case base is truncated.');
  return { builtAt: header.builtAt, features: header.features, situations, accuracy: header.accuracy };
}
