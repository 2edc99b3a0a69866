import { describe, expect, it } from 'vitest';
import { DEFAULT_SETTINGS, settingsSchema } from '../../../shared/schemas/settings';

describe('settings defaults', () => {
  it('start from the EU policy on the AR4 basis', () => {
    // Source: Reg. (EU) 2024/573 (EU default; AR4 is the legal basis)
    expect(DEFAULT_SETTINGS).toMatchObject({ policy: 'EU', gwpBasis: 'AR4' });
    expect(DEFAULT_SETTINGS.customLeakCheck.bands).toEqual([
      { fromTCO2e: 5, months: 12 },
      { fromTCO2e: 50, months: 6 },
      { fromTCO2e: 500, months: 3 },
    ]);
  });

  it('carry the score weights, cap, windows and bands of DOMAIN.md §6', () => {
    // Our definition (DOMAIN.md §6)
    expect(DEFAULT_SETTINGS.score).toEqual({
      weights: { rate: 0.4, count: 0.25, afterRepair: 0.2, sameSpot: 0.15 },
      rateCapPct: 50,
      watchFrom: 30,
      chronicFrom: 60,
    });
    expect(DEFAULT_SETTINGS.windows).toEqual({
      rollingDays: 365,
      afterRepairDays: 180,
      sameSpotDays: 730,
      repairHoldDays: 180,
    });
  });

  it('alert at the 20 % US commercial-refrigeration threshold', () => {
    // Source: 40 CFR 82.157(c)(2)
    expect(DEFAULT_SETTINGS.leakRateThresholdPct).toBe(20);
  });

  it('keep a PTI valid 90 days and a 30-day pressure baseline with a −3 K drift flag', () => {
    // Our definition (PTI validity, DOMAIN.md §8 baseline); the −3 K flag is common practice, no published source
    expect(DEFAULT_SETTINGS.ptiValidityDays).toBe(90);
    expect(DEFAULT_SETTINGS.pressure).toEqual({ baselineWindowDays: 30, driftFlagK: -3 });
  });

  it('price the repair-or-retire options with the DOMAIN.md §9 assumptions', () => {
    // Source: UNEP/COA 2012 (15-year life; new unit ≈ 17,000 USD, machinery ≈ 8,000 USD, approximate);
    // a lessor's public filing (residual ≈ 3,000 USD, approximate); Our definition (8 %, recurrence 0.3, 5 repairs)
    expect(DEFAULT_SETTINGS.economics).toMatchObject({
      currency: 'USD',
      discountRatePct: 8,
      designLifeYears: 15,
      newUnitCost: 17000,
      machineryCost: 8000,
      residualValue: 3000,
      defaultRecurrence: 0.3,
      minRepairsForRate: 5,
    });
    expect(Object.keys(DEFAULT_SETTINGS.economics.refrigerantPricePerKg)).toEqual([
      'R-134a',
      'R-404A',
      'R-452A',
      'R-513A',
      'R-1234yf',
      'R-744',
    ]);
    expect(Object.keys(DEFAULT_SETTINGS.economics.repairCostByLocation)).toHaveLength(11);
  });
});

describe('settings checks', () => {
  it('fills what is not given and keeps what is', () => {
    const s = settingsSchema.parse({
      economics: { refrigerantPricePerKg: { 'R-134a': 99 } },
      score: { rateCapPct: 40 },
    });
    expect(s.economics.refrigerantPricePerKg).toMatchObject({ 'R-134a': 99, 'R-404A': 45 });
    expect(s.score).toMatchObject({ rateCapPct: 40, watchFrom: 30 });
  });

  it('refuses weights that do not add up to 1', () => {
    const r = settingsSchema.safeParse({ score: { weights: { rate: 0.5 } } });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].message).toContain('add up to 1');
  });

  it('allows PTI validity from 30 up to 365 days', () => {
    expect(settingsSchema.safeParse({ ptiValidityDays: 365 }).success).toBe(true);
    expect(settingsSchema.safeParse({ ptiValidityDays: 29 }).success).toBe(false);
    expect(settingsSchema.safeParse({ ptiValidityDays: 366 }).success).toBe(false);
  });

  it('wants custom bands in rising order and band edges in order', () => {
    expect(
      settingsSchema.safeParse({
        customLeakCheck: {
          bands: [
            { fromTCO2e: 50, months: 6 },
            { fromTCO2e: 5, months: 12 },
          ],
        },
      }).success,
    ).toBe(false);
    expect(settingsSchema.safeParse({ score: { watchFrom: 70, chronicFrom: 60 } }).success).toBe(false);
    expect(settingsSchema.safeParse({ windows: { afterRepairDays: 400 } }).success).toBe(false);
    expect(settingsSchema.safeParse({ economics: { currency: 'dollars' } }).success).toBe(false);
  });
});
