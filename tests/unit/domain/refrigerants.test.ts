import { describe, expect, it } from 'vitest';
import {
  blendGwp,
  co2eTonnes,
  COMPONENT_GWP,
  DomainError,
  findRefrigerant,
  getRefrigerant,
  gwp,
  REFRIGERANTS,
} from '../../../shared/domain';

describe('GWP', () => {
  it('uses the AR4 and AR5 100-year values of the components', () => {
    // Source: IPCC AR4 / AR5 as tabulated in the CC0 dataset openclimatedata/globalwarmingpotentials
    expect(COMPONENT_GWP['R-32']).toEqual({ AR4: 675, AR5: 677 });
    expect(COMPONENT_GWP['R-125']).toEqual({ AR4: 3500, AR5: 3170 });
    expect(COMPONENT_GWP['R-134a']).toEqual({ AR4: 1430, AR5: 1300 });
    expect(COMPONENT_GWP['R-143a']).toEqual({ AR4: 4470, AR5: 4800 });
    expect(COMPONENT_GWP['R-744']).toEqual({ AR4: 1, AR5: 1 });
    // Source: Reg. (EU) 2024/573 Annex value for HFO-1234yf; the AR5 "< 1" (taken as 1) is From memory
    expect(COMPONENT_GWP['R-1234yf']).toEqual({ AR4: 4, AR5: 1 });
  });

  it('gives R-404A 3922 on the AR4 basis', () => {
    // Source: Reg. (EU) 2024/573 Annex VI mass-weighted method; DOMAIN.md §3 check value 3921.6 → 3922
    expect(blendGwp(getRefrigerant('R-404A').composition, 'AR4')).toBeCloseTo(3921.6, 6);
    expect(gwp('R-404A')).toBe(3922);
  });

  it('weights the other blends by mass', () => {
    // Our own arithmetic, compositions From memory (ASHRAE Standard 34):
    // R-452A AR4 = 0.30×4 + 0.11×675 + 0.59×3500 = 1.2 + 74.25 + 2065 = 2140.45 → 2140
    expect(gwp('R-452A', 'AR4')).toBe(2140);
    // R-513A AR4 = 0.56×4 + 0.44×1430 = 2.24 + 629.2 = 631.44 → 631
    expect(gwp('R-513A', 'AR4')).toBe(631);
    // R-404A AR5 = 0.44×3170 + 0.52×4800 + 0.04×1300 = 1394.8 + 2496 + 52 = 3942.8 → 3943
    expect(gwp('R-404A', 'AR5')).toBe(3943);
    // R-513A AR5 = 0.56×1 + 0.44×1300 = 572.56 → 573
    expect(gwp('R-513A', 'AR5')).toBe(573);
    // R-452A AR5 = 0.30×1 + 0.11×677 + 0.59×3170 = 0.3 + 74.47 + 1870.3 = 1945.07 → 1945
    expect(gwp('R-452A', 'AR5')).toBe(1945);
  });

  it('returns the pure-fluid values unchanged', () => {
    // Source: IPCC AR4 / AR5 (openclimatedata/globalwarmingpotentials)
    expect(gwp('R-134a')).toBe(1430);
    expect(gwp('R-134a', 'AR5')).toBe(1300);
    expect(gwp('R-744')).toBe(1);
  });

  it('refuses an unknown basis', () => {
    expect(() => gwp('R-134a', 'AR6' as 'AR4')).toThrow(/AR4 or AR5/);
  });
});

describe('CO2 equivalent', () => {
  it('makes a 5 kg R-134a charge 7.15 t CO2e', () => {
    // Source: DOMAIN.md §3 check value (t CO2e = kg × GWP / 1000, Reg. (EU) 2024/573)
    expect(co2eTonnes('R-134a', 5)).toBeCloseTo(7.15, 10);
  });

  it('uses the AR5 basis when asked', () => {
    // Our arithmetic: 5 kg × 1300 / 1000 = 6.5 t
    expect(co2eTonnes('R-134a', 5, 'AR5')).toBeCloseTo(6.5, 10);
  });

  it('refuses a negative charge', () => {
    expect(() => co2eTonnes('R-134a', -1)).toThrow(DomainError);
    expect(() => co2eTonnes('R-134a', Number.NaN)).toThrow(/0 kg or more/);
  });
});

describe('catalogue', () => {
  it('lists the six reefer refrigerants with mass shares that add up to 100 %', () => {
    expect(REFRIGERANTS.map((r) => r.code)).toEqual(['R-134a', 'R-404A', 'R-452A', 'R-513A', 'R-1234yf', 'R-744']);
    for (const r of REFRIGERANTS) expect(r.composition.reduce((s, c) => s + c.massPct, 0)).toBeCloseTo(100, 10);
  });

  it('marks R-1234yf mildly flammable, R-744 high-pressure and the blends as blends', () => {
    // From memory: safety classes per ASHRAE Standard 34
    expect(getRefrigerant('R-1234yf')).toMatchObject({ safetyClass: 'A2L', flammable: true, isBlend: false });
    expect(getRefrigerant('R-744')).toMatchObject({ safetyClass: 'A1', highPressure: true, flammable: false });
    expect(getRefrigerant('R-452A').isBlend).toBe(true);
    expect(getRefrigerant('R-134a')).toMatchObject({ isBlend: false, highPressure: false, flammable: false });
  });

  it('finds codes written loosely', () => {
    expect(findRefrigerant('r134a')?.code).toBe('R-134a');
    expect(findRefrigerant('R 404A')?.code).toBe('R-404A');
    expect(findRefrigerant('r-1234YF')?.code).toBe('R-1234yf');
    expect(findRefrigerant('CO2')?.code).toBe('R-744');
    expect(findRefrigerant('R-22')).toBeUndefined();
    expect(findRefrigerant(42 as unknown as string)).toBeUndefined();
  });

  it('names the known codes when a refrigerant is unknown', () => {
    expect(() => getRefrigerant('R-22')).toThrow(/Unknown refrigerant "R-22".*R-134a/);
  });
});
