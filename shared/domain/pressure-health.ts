import { MS_PER_DAY, parseIso } from './dates';
import { DomainError } from './errors';
import { median, roundTo } from './numbers';
import { getRefrigerant, type RefrigerantCode } from './refrigerants';
import { ABOVE_RANGE, saturationKOrSentinel } from './saturation';
import type { SightGlassState } from './service-terms';
import { ABSOLUTE_ZERO_C, gaugeToAbsoluteKPa, STANDARD_ATMOSPHERE_KPA } from './units';
import type { Settings } from '../schemas/settings';
import { DEFAULT_SETTINGS } from '../schemas/settings';

export type PressureFlag = 'ok' | 'possible_low_charge' | 'unknown';

/** A gauge reading outside the saturation data is kept, with its temperature left out and the reason. */
export type OutOfRange = 'supercritical' | 'above_range' | 'below_range';

export interface PressureSnapshot {
  at: string;
  /** Dew temperature at the absolute discharge pressure. */
  condensingC: number | null;
  /** Dew temperature at the absolute suction pressure. */
  evaporatingC: number | null;
  /** condensing − ambient */
  approachK: number | null;
  /** approach − baseline approach */
  driftK: number | null;
  ambientC: number | null;
  sightGlass: SightGlassState | null;
  dischargeOutOfRange: OutOfRange | null;
  suctionOutOfRange: OutOfRange | null;
}

export interface PressureHealth {
  latest: PressureSnapshot | null;
  baselineApproachK: number | null;
  driftK: number | null;
  flag: PressureFlag;
  /** Why the flag is what it is, in a sentence. */
  explanation: string;
}

export interface PressureReading {
  readonly at: string;
  readonly suctionKPaG?: number | null;
  readonly dischargeKPaG?: number | null;
  readonly ambientC?: number | null;
  readonly sightGlass?: SightGlassState | null;
}

/** Dew temperature (°C) of a gauge reading, or NaN with the reason in `outOfRange`. */
function dewC(code: RefrigerantCode, kPaG: number, out: { reason: OutOfRange | null }): number {
  // Gauge readings use the dew point on both sides (DOMAIN.md §3); p_abs = p_g + 101.325 kPa.
  const tK = saturationKOrSentinel(code, Math.max(gaugeToAbsoluteKPa(kPaG), 1e-9), 'dew');
  if (tK > 0) {
    out.reason = null;
    return tK + ABSOLUTE_ZERO_C;
  }
  out.reason = tK === ABOVE_RANGE ? (code === 'R-744' ? 'supercritical' : 'above_range') : 'below_range';
  return Number.NaN;
}

/**
 * Pressure health (DOMAIN.md §8, with common practice): condensing = dew T at the absolute discharge pressure;
 * approach = condensing − ambient; baseline = median approach in the window after the latest reset (recharge,
 * verified repair, commissioning); drift = approach − baseline; "possible low charge" when drift ≤ −3 K or the sight
 * glass shows bubbles or is empty. Readings and resets must be in time order; O(readings + resets) plus the medians.
 */
export function pressureHealthFromReadings(
  refrigerant: RefrigerantCode,
  readings: readonly PressureReading[],
  readingMs: ArrayLike<number>,
  resetsMs: readonly number[],
  settings: Settings = DEFAULT_SETTINGS,
): { snapshots: PressureSnapshot[]; health: PressureHealth } {
  const windowMs = settings.pressure.baselineWindowDays * MS_PER_DAY;
  const n = readings.length;
  const approach = new Float64Array(n);
  const segment = new Int32Array(n);
  const snapshots: PressureSnapshot[] = new Array<PressureSnapshot>(n);
  const windows: number[][] = [];
  const cond = { reason: null as OutOfRange | null };
  const evap = { reason: null as OutOfRange | null };
  let r = -1;
  for (let i = 0; i < n; i++) {
    const p = readings[i];
    const t = readingMs[i];
    while (r + 1 < resetsMs.length && resetsMs[r + 1] <= t) r++;
    segment[i] = r;
    const discharge = p.dischargeKPaG;
    const suction = p.suctionKPaG;
    const c = discharge == null ? Number.NaN : dewC(refrigerant, discharge, cond);
    const ev = suction == null ? Number.NaN : dewC(refrigerant, suction, evap);
    const amb = p.ambientC ?? null;
    const appr = amb === null ? Number.NaN : c - amb;
    approach[i] = appr;
    if (r >= 0 && !Number.isNaN(appr) && t <= resetsMs[r] + windowMs) (windows[r] ??= []).push(appr);
    snapshots[i] = {
      at: p.at,
      condensingC: Number.isNaN(c) ? null : roundTo(c, 2),
      evaporatingC: Number.isNaN(ev) ? null : roundTo(ev, 2),
      approachK: Number.isNaN(appr) ? null : roundTo(appr, 2),
      driftK: null,
      ambientC: amb,
      sightGlass: p.sightGlass ?? null,
      dischargeOutOfRange: discharge == null ? null : cond.reason,
      suctionOutOfRange: suction == null ? null : evap.reason,
    };
  }
  const baselines = windows.map((w) => (w.length > 0 ? median(w) : Number.NaN));
  const baselineOf = (seg: number): number | null => {
    const b = seg >= 0 ? baselines[seg] : undefined;
    return b === undefined || Number.isNaN(b) ? null : b;
  };
  let lastDrift: number | null = null;
  for (let i = 0; i < n; i++) {
    const b = baselineOf(segment[i]);
    const a = approach[i];
    const drift = b !== null && !Number.isNaN(a) ? a - b : null;
    snapshots[i].driftK = drift === null ? null : roundTo(drift, 2);
    if (i === n - 1) lastDrift = drift;
  }

  if (n === 0) {
    return {
      snapshots,
      health: {
        latest: null,
        baselineApproachK: null,
        driftK: null,
        flag: 'unknown',
        explanation: 'No pressure readings yet.',
      },
    };
  }
  const latest = snapshots[n - 1];
  const latestMs = readingMs[n - 1];
  if (resetsMs.length > 0 && resetsMs[resetsMs.length - 1] > latestMs) {
    return {
      snapshots,
      health: {
        latest,
        baselineApproachK: null,
        driftK: null,
        flag: 'unknown',
        explanation: 'No pressure reading since the last recharge or verified repair.',
      },
    };
  }
  const baseline = baselineOf(segment[n - 1]);
  const threshold = settings.pressure.driftFlagK;
  let flag: PressureFlag = 'unknown';
  let explanation = 'Not enough readings to judge: a discharge pressure and ambient after a recharge are needed.';
  if (latest.sightGlass === 'bubbles' || latest.sightGlass === 'empty') {
    flag = 'possible_low_charge';
    explanation = `The sight glass showed ${latest.sightGlass === 'empty' ? 'no liquid' : 'bubbles'} at the latest reading.`;
  } else if (lastDrift !== null && lastDrift <= threshold) {
    flag = 'possible_low_charge';
    explanation = `The condenser approach is ${roundTo(-lastDrift, 1)} K below its post-charge baseline (flag at ${-threshold} K).`;
  } else if (lastDrift !== null) {
    flag = 'ok';
    explanation = `The condenser approach ${approachDriftWords(lastDrift, threshold)}.`;
  } else if (latest.sightGlass === 'full') {
    flag = 'ok';
    explanation = 'The sight glass was full at the latest reading.';
  }
  return {
    snapshots,
    health: {
      latest,
      baselineApproachK: baseline === null ? null : roundTo(baseline, 2),
      driftK: lastDrift === null ? null : roundTo(lastDrift, 2),
      flag,
      explanation,
    },
  };
}

export interface PressureSnapshotInput {
  at: string;
  suctionKPaG?: number | null;
  dischargeKPaG?: number | null;
  ambientC?: number | null;
  sightGlass?: SightGlassState | null;
}

const signedK = (k: number) => `${k > 0 ? '+' : k < 0 ? '−' : '±'}${Math.abs(k)} K`;

/**
 * What a drift of the condenser approach from its post-charge baseline says, only what is true: "is within 3 K of
 * its post-charge baseline (+1.2 K)" when it is, else the drift with its sign ("is +5.9 K from its post-charge
 * baseline: higher, not a sign of lost charge"). `flagK` is the (negative) drift that flags a possible low charge.
 */
export function approachDriftWords(driftK: number, flagK: number): string {
  const d = roundTo(driftK, 1);
  const limit = Math.abs(flagK);
  if (Math.abs(d) <= limit) return `is within ${limit} K of its post-charge baseline (${signedK(d)})`;
  if (d > 0) return `is ${signedK(d)} from its post-charge baseline: higher, not a sign of lost charge`;
  return `is ${signedK(d)} from its post-charge baseline (flag at ${signedK(flagK)})`;
}

/**
 * Pressure health from snapshots and the dates the charge was last known to be right (recharges, verified repairs,
 * commissioning), all ISO strings in any order.
 */
export function assessPressureHealth(
  refrigerant: string,
  snapshots: readonly PressureSnapshotInput[],
  resets: readonly string[],
  settings: Settings = DEFAULT_SETTINGS,
): { snapshots: PressureSnapshot[]; health: PressureHealth } {
  const code = getRefrigerant(refrigerant).code;
  const readings = snapshots.map((s, i) => {
    for (const side of ['suctionKPaG', 'dischargeKPaG'] as const) {
      const v = s[side];
      if (v != null && (!Number.isFinite(v) || v < -STANDARD_ATMOSPHERE_KPA - 1e-9)) {
        throw new DomainError(`Snapshot ${i + 1}: ${v} kPa(g) is below a perfect vacuum.`, `snapshots[${i}].${side}`);
      }
    }
    return { s, ms: parseIso(s.at, `snapshots[${i}].at`, `Snapshot ${i + 1} date`) };
  });
  readings.sort((a, b) => a.ms - b.ms);
  const resetMs = resets.map((r, i) => parseIso(r, `resets[${i}]`, `Reset ${i + 1} date`)).sort((a, b) => a - b);
  return pressureHealthFromReadings(
    code,
    readings.map((x) => x.s),
    readings.map((x) => x.ms),
    resetMs,
    settings,
  );
}
