import { describe, expect, it } from 'vitest';
import {
  co2eTonnes,
  DomainError,
  leakCheckIntervalForPolicy,
  leakCheckIntervalMonths,
  US_LEAK_RATE_THRESHOLDS_PCT,
  US_MIN_FULL_CHARGE_KG,
  CHRONIC_CALENDAR_YEAR_SHARE_PCT,
} from '../../../shared/domain';
import { settingsSchema } from '../../../shared/schemas/settings';

describe('EU leak-check interval', () => {
  it('follows the charge bands in t CO2e', () => {
    // Source: Reg. (EU) 2024/573 (synopsis): < 5 none; 5–<50 12; 50–<500 6; ≥ 500 3 months
    expect(leakCheckIntervalMonths(4.99)).toBeNull();
    expect(leakCheckIntervalMonths(5)).toBe(12);
    expect(leakCheckIntervalMonths(49.99)).toBe(12);
    expect(leakCheckIntervalMonths(50)).toBe(6);
    expect(leakCheckIntervalMonths(499.9)).toBe(6);
    expect(leakCheckIntervalMonths(500)).toBe(3);
  });

  it('halves the frequency with a working leak detection system', () => {
    // Source: Reg. (EU) 2024/573 (synopsis): 24/12/6 months with leak detection
    expect(leakCheckIntervalMonths(7, { leakDetection: true })).toBe(24);
    expect(leakCheckIntervalMonths(60, { leakDetection: true })).toBe(12);
    expect(leakCheckIntervalMonths(600, { leakDetection: true })).toBe(6);
  });

  it('needs no checks on hermetically sealed equipment under 10 t', () => {
    // Source: Reg. (EU) 2024/573 (synopsis): hermetically sealed and < 10 t CO2e → none
    expect(leakCheckIntervalMonths(9.9, { hermetic: true })).toBeNull();
    expect(leakCheckIntervalMonths(10, { hermetic: true })).toBe(12);
  });

  it('checks a 5 kg R-134a unit every 12 months', () => {
    // Source: DOMAIN.md §3 (7.15 t CO2e) and Reg. (EU) 2024/573 bands
    expect(leakCheckIntervalMonths(co2eTonnes('R-134a', 5))).toBe(12);
  });

  it('needs no checks for a CO2 unit', () => {
    // Our arithmetic: 5 kg × GWP 1 = 0.005 t, far below 5 t
    expect(leakCheckIntervalMonths(co2eTonnes('R-744', 5))).toBeNull();
  });

  it('refuses a negative charge', () => {
    expect(() => leakCheckIntervalMonths(-1)).toThrow(DomainError);
  });
});

describe('US reference and custom policies', () => {
  it('knows the 40 CFR 82.157 thresholds and the 15 lb duty line', () => {
    // Source: 40 CFR 82.157(c)(2) thresholds; 89 FR 82682 (2024) for 15 lb; 40 CFR 82.157(m) for 125 %
    expect(US_LEAK_RATE_THRESHOLDS_PCT).toEqual({
      commercial_refrigeration: 20,
      industrial_process_refrigeration: 30,
      comfort_cooling_and_other: 10,
    });
    expect(US_MIN_FULL_CHARGE_KG).toBeCloseTo(6.8, 2);
    expect(CHRONIC_CALENDAR_YEAR_SHARE_PCT).toBe(125);
  });

  it('sets no interval for a reefer below 15 lb under the US policy', () => {
    // Source: 89 FR 82682 (2024): duties from 15 lb; a 5 kg unit is below it
    const us = settingsSchema.parse({ policy: 'US' });
    expect(leakCheckIntervalForPolicy({ tCO2e: 7.15, fullChargeKg: 5, rollingLeakRatePct: 80 }, us)).toBeNull();
  });

  it('asks for annual checks on a US-size unit over the threshold', () => {
    // From memory: 40 CFR 82.157(g), annual leak inspections after exceeding the threshold, below 500 lb
    const us = settingsSchema.parse({ policy: 'US' });
    expect(leakCheckIntervalForPolicy({ tCO2e: 10, fullChargeKg: 7, rollingLeakRatePct: 25 }, us)).toBe(12);
    expect(leakCheckIntervalForPolicy({ tCO2e: 10, fullChargeKg: 7, rollingLeakRatePct: 15 }, us)).toBeNull();
  });

  it('uses the custom bands when the policy is custom', () => {
    // Our definition (DOMAIN.md §5: policy is a setting)
    const custom = settingsSchema.parse({
      policy: 'custom',
      customLeakCheck: {
        bands: [
          { fromTCO2e: 0, months: 6 },
          { fromTCO2e: 5, months: 3 },
        ],
      },
    });
    expect(leakCheckIntervalForPolicy({ tCO2e: 1, fullChargeKg: 1, rollingLeakRatePct: 0 }, custom)).toBe(6);
    expect(leakCheckIntervalForPolicy({ tCO2e: 7, fullChargeKg: 5, rollingLeakRatePct: 0 }, custom)).toBe(3);
    const defaults = settingsSchema.parse({ policy: 'custom' });
    expect(leakCheckIntervalForPolicy({ tCO2e: 4, fullChargeKg: 5, rollingLeakRatePct: 0 }, defaults)).toBeNull();
    expect(leakCheckIntervalForPolicy({ tCO2e: 60, fullChargeKg: 5, rollingLeakRatePct: 0 }, defaults)).toBe(6);
  });

  it('uses the EU rules by default', () => {
    const eu = settingsSchema.parse({});
    expect(
      leakCheckIntervalForPolicy({ tCO2e: 7.15, fullChargeKg: 5, rollingLeakRatePct: 0, leakDetection: true }, eu),
    ).toBe(24);
  });
});
