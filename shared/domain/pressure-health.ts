import { MS_PER_DAY, parseIso } from './dates';
import { DomainError } from './errors';
import { median, roundTo } from './numbers';
import { getRefrigerant, type RefrigerantCode } from './refrigerants';
import { lookupSaturationK } from './saturation';
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
  readonly ms: number;
  readonly at: string;
  readonly suctionKPaG?: number | null;
  readonly dischargeKPaG?: number | null;
  readonly ambientC?: number | null;
  readonly sightGlass?: SightGlassState | null;
}

function dewC(code: RefrigerantCode, kPaG: number | null | undefined): { c: number | null; out: OutOfRange | null } {
  if (kPaG === null || kPaG === undefined) return { c: null, out: null };
  // Gauge readings use the dew point on both sides (DOMAIN.md §3); p_abs = p_g + 101.325 kPa.
  const found = lookupSaturationK(code, Math.max(gaugeToAbsoluteKPa(kPaG), 1e-9), 'dew');
  if (found.ok) return { c: found.tK + ABSOLUTE_ZERO_C, out: null };
  return { c: null, out: found.reason === 'above_range' && code === 'R-744' ? 'supercritical' : found.reason };
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
  resetsMs: readonly number[],
  settings: Settings = DEFAULT_SETTINGS,
): { snapshots: PressureSnapshot[]; health: PressureHealth } {
  const windowMs = settings.pressure.baselineWindowDays * MS_PER_DAY;
  const n = readings.length;
  const approach = new Float64Array(n);
  const segment = new Int32Array(n);
  const snapshots: PressureSnapshot[] = new Array<PressureSnapshot>(n);
  const windows: number[][] = [];
  let r = -1;
  for (let i = 0; i < n; i++) {
    const p = readings[i];
    while (r + 1 < resetsMs.length && resetsMs[r + 1] <= p.ms) r++;
    segment[i] = r;
    const cond = dewC(refrigerant, p.dischargeKPaG);
    const evap = dewC(refrigerant, p.suctionKPaG);
    const amb = p.ambientC ?? null;
    const appr = cond.c !== null && amb !== null ? cond.c - amb : null;
    approach[i] = appr ?? Number.NaN;
    if (r >= 0 && appr !== null && p.ms <= resetsMs[r] + windowMs) (windows[r] ??= []).push(appr);
    snapshots[i] = {
      at: p.at,
      condensingC: cond.c === null ? null : roundTo(cond.c, 2),
      evaporatingC: evap.c === null ? null : roundTo(evap.c, 2),
      approachK: appr === null ? null : roundTo(appr, 2),
      driftK: null,
      ambientC: amb,
      sightGlass: p.sightGlass ?? null,
      dischargeOutOfRange: cond.out,
      suctionOutOfRange: evap.out,
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
    return { snapshots, health: { latest: null, baselineApproachK: null, driftK: null, flag: 'unknown', explanation: 'No pressure readings yet.' } };
  }
  const latest = snapshots[n - 1];
  const latestMs = readings[n - 1].ms;
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
    explanation = `The condenser approach is within ${-threshold} K of its post-charge baseline.`;
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
    return { ...s, ms: parseIso(s.at, `snapshots[${i}].at`, `Snapshot ${i + 1} date`) };
  });
  readings.sort((a, b) => a.ms - b.ms);
  const resetMs = resets.map((r, i) => parseIso(r, `resets[${i}]`, `Reset ${i + 1} date`)).sort((a, b) => a - b);
  return pressureHealthFromReadings(code, readings, resetMs, settings);
}
