import { DomainError } from './errors';
import { isFiniteNumber } from './numbers';
import { gwp, type GwpBasis } from './refrigerants';
import { KG_PER_LB } from './units';
import type { Settings } from '../schemas/settings';

/** t CO2e = charge kg × GWP / 1000 (Reg. (EU) 2024/573 definition of CO2 equivalent). */
export function co2eTonnes(refrigerant: string, chargeKg: number, basis: GwpBasis = 'AR4'): number {
  if (!isFiniteNumber(chargeKg) || chargeKg < 0) {
    throw new DomainError(`A refrigerant charge must be 0 kg or more, not ${String(chargeKg)}.`, 'chargeKg');
  }
  return (chargeKg * gwp(refrigerant, basis)) / 1000;
}

export interface LeakCheckOptions {
  /** A working leak detection system halves the check frequency. */
  leakDetection?: boolean;
  /** Hermetically sealed equipment below 10 t CO2e needs no checks. */
  hermetic?: boolean;
}

/**
 * Months between leak checks under Reg. (EU) 2024/573: < 5 t none; 5–<50 t 12; 50–<500 t 6; ≥ 500 t 3;
 * 24/12/6 with leak detection; hermetically sealed and < 10 t none. null = no periodic check required.
 */
export function leakCheckIntervalMonths(tCO2e: number, opts: LeakCheckOptions = {}): number | null {
  if (!isFiniteNumber(tCO2e) || tCO2e < 0) {
    throw new DomainError(`A charge in t CO2e must be 0 or more, not ${String(tCO2e)}.`, 'tCO2e');
  }
  if (opts.hermetic && tCO2e < 10) return null;
  const detection = opts.leakDetection === true;
  if (tCO2e < 5) return null;
  if (tCO2e < 50) return detection ? 24 : 12;
  if (tCO2e < 500) return detection ? 12 : 6;
  return detection ? 6 : 3;
}

/** Leak-rate thresholds of 40 CFR 82.157(c)(2), % of full charge per year. */
export const US_LEAK_RATE_THRESHOLDS_PCT = {
  commercial_refrigeration: 20,
  industrial_process_refrigeration: 30,
  comfort_cooling_and_other: 10,
} as const;

/** US duties apply from 15 lb (6.80 kg) of HFC full charge (89 FR 82682, 2024). */
export const US_MIN_FULL_CHARGE_KG = 15 * KG_PER_LB;

/** A calendar-year share at or above this marks a chronically leaking appliance (40 CFR 82.157(m)). */
export const CHRONIC_CALENDAR_YEAR_SHARE_PCT = 125;

export interface PolicyIntervalInput extends LeakCheckOptions {
  tCO2e: number;
  fullChargeKg: number;
  /** The unit's rolling leak rate, used by the US reference policy. */
  rollingLeakRatePct: number;
}

/** Leak-check interval in months under the policy chosen in settings, or null when none applies. */
export function leakCheckIntervalForPolicy(input: PolicyIntervalInput, settings: Settings): number | null {
  if (settings.policy === 'EU') return leakCheckIntervalMonths(input.tCO2e, input);
  if (settings.policy === 'US') {
    // Reference only. Below 15 lb there is no federal duty; above it, a unit over the threshold is
    // inspected annually until it is back under it (40 CFR 82.157(g), below 500 lb). From memory.
    if (input.fullChargeKg < US_MIN_FULL_CHARGE_KG) return null;
    return input.rollingLeakRatePct > settings.leakRateThresholdPct ? 12 : null;
  }
  let months: number | null = null;
  for (const band of settings.customLeakCheck.bands) if (input.tCO2e >= band.fromTCO2e) months = band.months;
  return months;
}
