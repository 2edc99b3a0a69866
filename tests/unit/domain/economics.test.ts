import { describe, expect, it } from 'vitest';
import {
  capitalRecoveryFactor,
  compareRepairOptions,
  DomainError,
  equivalentAnnualCost,
  netPresentValue,
  presentWorthFactor,
  unitAgeYears,
} from '../../../shared/domain';
import { settingsSchema } from '../../../shared/schemas/settings';

describe('compound-interest factors', () => {
  it('gives P/A(10 %, 10) = 6.1446', () => {
    // Source: standard compound-interest formula (Newnan, Engineering Economic Analysis); by hand:
    // 1.1^10 = 2.593742; (2.593742 − 1) / (0.1 × 2.593742) = 1.593742 / 0.2593742 = 6.1446
    expect(presentWorthFactor(0.1, 10)).toBeCloseTo(6.1446, 4);
  });

  it('gives A/P(8 %, 15) = 0.11683', () => {
    // Source: standard compound-interest formula (Newnan); by hand:
    // 1.08^15 = 3.172169; P/A = 2.172169 / (0.08 × 3.172169) = 2.172169 / 0.2537735 = 8.55948; A/P = 1/8.55948 = 0.11683
    expect(presentWorthFactor(0.08, 15)).toBeCloseTo(8.55948, 5);
    expect(capitalRecoveryFactor(0.08, 15)).toBeCloseTo(0.11683, 5);
  });

  it('gives P/A = n at a zero rate', () => {
    // Our arithmetic: with no discounting n payments of 1 are worth n
    expect(presentWorthFactor(0, 7)).toBe(7);
  });

  it('refuses a rate of −100 % or less and a horizon under a year', () => {
    expect(() => presentWorthFactor(-1, 5)).toThrow(DomainError);
    expect(() => presentWorthFactor(0.08, 0)).toThrow(/at least 1/);
    expect(() => presentWorthFactor(0.08, 2.5)).toThrow(/whole number/);
  });
});

describe('NPV and EAC', () => {
  it('discounts yearly costs and the salvage value', () => {
    // Source: NPV = upfront + Σ C_t/(1+r)^t − S/(1+r)^n (Newnan); by hand at 10 %, 3 years:
    // 1000 + 200 × (0.909091 + 0.826446 + 0.751315 = 2.486852) − 300 × 0.751315
    // = 1000 + 497.37 − 225.39 = 1271.98; EAC = 1271.98 × A/P(10 %, 3) = 1271.98 × 0.402115 = 511.48
    const npv = netPresentValue({ upfront: 1000, yearly: 200, salvage: 300 }, 0.1, 3);
    expect(npv).toBeCloseTo(1271.98, 2);
    expect(equivalentAnnualCost(npv, 0.1, 3)).toBeCloseTo(511.48, 2);
    expect(netPresentValue({ upfront: 1000, yearly: [200, 200, 200], salvage: 300 }, 0.1, 3)).toBeCloseTo(npv, 9);
  });

  it('refuses a cost list of the wrong length and values that are not numbers', () => {
    expect(() => netPresentValue({ upfront: 0, yearly: [1, 2], salvage: 0 }, 0.1, 3)).toThrow(/each of the 3 years/);
    expect(() => netPresentValue({ upfront: Number.NaN, yearly: 1, salvage: 0 }, 0.1, 3)).toThrow(/must be a number/);
    expect(() => equivalentAnnualCost(Number.POSITIVE_INFINITY, 0.1, 3)).toThrow(/must be a number/);
  });
});

describe('repair or retire', () => {
  const base = {
    refrigerant: 'R-134a',
    ageYears: 10,
    topUpIntervalDays: 100,
    madeUpKgPerVisit: 1,
    leakLocation: 'service_valve' as const,
  };

  it('prices the four options and marks repair as cheapest for a leaking 10-year-old unit', () => {
    // Our worked example, default settings (8 %, 15-year life → 5 years left; P/A(8 %, 5) = 3.99271, A/P = 0.250456):
    // keep: 365/100 = 3.65 visits × (1 kg × 30 + 120 labour + 150 downtime) = 1095.00 a year;
    //       NPV = 1095 × 3.99271 = 4372.02; EAC = 1095.00
    // repair: 180 (service valve) + 0.3 × 1095 = 328.50 a year → NPV = 180 + 328.5 × 3.99271 = 1491.61; EAC = 373.58
    // new machinery: NPV 8000; EAC = 8000 × 0.250456 = 2003.65
    // retire and sell: 17000 − 3000 = 14000 over 15 years; EAC = 14000 × 0.1168295 = 1635.61
    const r = compareRepairOptions(base);
    const byId = Object.fromEntries(r.options.map((o) => [o.id, o]));
    expect(byId.keep_topping_up).toMatchObject({ upfront: 0, yearlyCost: 1095, npv: 4372.02, eac: 1095, years: 5 });
    expect(byId.repair).toMatchObject({ upfront: 180, yearlyCost: 328.5, npv: 1491.61, eac: 373.58, cheapest: true });
    expect(byId.new_machinery).toMatchObject({ upfront: 8000, yearlyCost: 0, npv: 8000, eac: 2003.65 });
    expect(byId.retire_and_sell).toMatchObject({ upfront: 14000, npv: 14000, eac: 1635.61, years: 15 });
    expect(r.cheapestId).toBe('repair');
    expect(r.options.filter((o) => o.cheapest)).toHaveLength(1);
    expect(r.currency).toBe('USD');
    expect(r.assumptions).toMatchObject({
      remainingYears: 5,
      visitsPerYear: 3.65,
      recurrence: 0.3,
      recurrenceSource: 'default',
      repairCost: 180,
    });
  });

  it('uses the fleet’s recurrence once it has enough repairs at the location', () => {
    // Our worked example: 4 of 10 repairs recurred → 0.4; repair = 180 + 0.4 × 1095 = 618 a year
    // → NPV = 180 + 618 × 3.99271 = 1928.81; EAC = 483.08
    const r = compareRepairOptions({ ...base, fleetRepairs: { repairs: 10, recurred: 4 } });
    expect(r.assumptions).toMatchObject({ recurrence: 0.4, recurrenceSource: 'fleet' });
    expect(r.options.find((o) => o.id === 'repair')).toMatchObject({ npv: 1928.81, eac: 483.08 });
    // DOMAIN.md §9: fewer than 5 known repairs → default 0.3
    expect(compareRepairOptions({ ...base, fleetRepairs: { repairs: 4, recurred: 4 } }).assumptions.recurrence).toBe(
      0.3,
    );
  });

  it('keeps topping up when there is no leak evidence', () => {
    // Our arithmetic: no forecast → no top-ups → keep costs 0 a year, cheaper than any outlay
    const r = compareRepairOptions({ ...base, topUpIntervalDays: null, madeUpKgPerVisit: null, leakLocation: null });
    expect(r.cheapestId).toBe('keep_topping_up');
    expect(r.assumptions).toMatchObject({ visitsPerYear: 0, leakLocation: 'other', repairCost: 400 });
  });

  it('prices at least one year for a unit past its design life', () => {
    // DOMAIN.md §9: horizon = remaining design life, at least 1
    expect(compareRepairOptions({ ...base, ageYears: 20 }).assumptions.remainingYears).toBe(1);
  });

  it('follows the cost settings', () => {
    const settings = settingsSchema.parse({
      economics: { currency: 'EUR', discountRatePct: 0, refrigerantPricePerKg: { 'R-134a': 100 } },
    });
    // Our arithmetic at 0 %: keep = 3.65 × (100 + 120 + 150) = 1350.5 a year, NPV = 5 × 1350.5 = 6752.5
    const r = compareRepairOptions(base, settings);
    expect(r.currency).toBe('EUR');
    expect(r.options[0]).toMatchObject({ yearlyCost: 1350.5, npv: 6752.5 });
  });

  it('refuses impossible inputs', () => {
    expect(() => compareRepairOptions({ ...base, ageYears: -1 })).toThrow(DomainError);
    expect(() => compareRepairOptions({ ...base, topUpIntervalDays: 0 })).toThrow(/more than 0/);
    expect(() => compareRepairOptions({ ...base, madeUpKgPerVisit: -1 })).toThrow(/0 or more/);
    expect(() => compareRepairOptions({ ...base, refrigerant: 'R-22' })).toThrow(/Unknown refrigerant/);
  });

  it('counts the unit’s age from commissioning', () => {
    // Our arithmetic: 2015-06-30 → 2025-06-30 is 3653 days = 10.0 years of 365.25 days
    expect(unitAgeYears('2015-06-30', '2025-06-30')).toBeCloseTo(10.0, 2);
    expect(unitAgeYears('2030-01-01', '2025-06-30')).toBe(0);
  });
});
