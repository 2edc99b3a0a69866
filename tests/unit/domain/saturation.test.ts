import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  DomainError,
  REFRIGERANT_CODES,
  saturationPressureKPa,
  saturationRange,
  saturationTemperatureC,
  saturationTemperatureFromGaugeC,
  type SaturationSide,
} from '../../../shared/domain';

const within = (actual: number, expected: number, relative: number) =>
  expect(Math.abs(actual / expected - 1)).toBeLessThanOrEqual(relative);

describe('saturation pressure check values', () => {
  // Source: CoolProp 8.0.0 (tolerance ±0.1 %)
  const checks: [string, number, SaturationSide, number][] = [
    ['R-134a', -40, 'dew', 51.21],
    ['R-134a', -26.074, 'dew', 101.325], // normal boiling point
    ['R-134a', 0, 'dew', 292.8],
    ['R-134a', 25, 'dew', 665.38],
    ['R-134a', 60, 'dew', 1681.78],
    ['R-404A', -40, 'bubble', 135.3],
    ['R-404A', -40, 'dew', 131.0],
    ['R-404A', 0, 'bubble', 610.2],
    ['R-404A', 0, 'dew', 600.3],
    ['R-404A', 40, 'bubble', 1829.5],
    ['R-404A', 40, 'dew', 1815.0],
    ['R-452A', 0, 'bubble', 637.3],
    ['R-452A', 0, 'dew', 556.8],
    ['R-513A', 0, 'bubble', 323.4],
    ['R-513A', 0, 'dew', 323.2],
    ['R-1234yf', 0, 'dew', 315.88],
  ];
  for (const [code, c, side, kPa] of checks) {
    it(`gives ${kPa} kPa for ${code} ${side} at ${c} °C`, () => {
      // Source: CoolProp 8.0.0 (tolerance ±0.1 %)
      within(saturationPressureKPa(code, c, side), kPa, 0.001);
      // and back: the inverse lands on the same temperature
      expect(saturationTemperatureC(code, saturationPressureKPa(code, c, side), side)).toBeCloseTo(c, 6);
    });
  }

  it('gives 3485.1 kPa for R-744 at 0 °C', () => {
    // From memory: R-744 check value via Span & Wagner (1996) ancillary equation, ±0.1 %
    within(saturationPressureKPa('R-744', 0), 3485.1, 0.001);
  });

  it('finds the R-134a normal boiling point from a 0 kPa(g) reading', () => {
    // Source: CoolProp 8.0.0 (normal boiling point −26.074 °C at 101.325 kPa), tolerance ±0.1 % in pressure ≈ ±0.03 K
    expect(Math.abs(saturationTemperatureFromGaugeC('R-134a', 0) - -26.074)).toBeLessThan(0.03);
  });

  it('uses the dew curve unless told otherwise', () => {
    expect(saturationPressureKPa('R-404A', 0)).toBe(saturationPressureKPa('R-404A', 0, 'dew'));
    expect(saturationTemperatureC('R-452A', 600)).toBe(saturationTemperatureC('R-452A', 600, 'dew'));
  });

  it('shows about 4 K of glide for R-452A', () => {
    // From memory: DOMAIN.md §3 catalogue note "~4 K glide" (ASHRAE Standard 34 data)
    const p = saturationPressureKPa('R-452A', 0, 'bubble');
    const glide = saturationTemperatureC('R-452A', p, 'dew') - 0;
    expect(glide).toBeGreaterThan(3.5);
    expect(glide).toBeLessThan(4.5);
  });
});

describe('valid range', () => {
  it('reports each curve’s range', () => {
    // Our definition (DOMAIN.md §3): fitted curves −50 … +60 °C; R-134a 170 K … Tc; R-744 triple point … Tc
    expect(saturationRange('R-404A', 'bubble')).toMatchObject({ minC: -50, maxC: 60, endsAtCritical: false });
    expect(saturationRange('R-134a').minC).toBeCloseTo(-103.15, 9);
    expect(saturationRange('R-134a').maxC).toBeCloseTo(101.03, 9);
    expect(saturationRange('R-744').maxC).toBeCloseTo(30.9782, 4);
    expect(saturationRange('R-744').minC).toBeCloseTo(-56.558, 3);
    // At Tc the equation returns pc exactly (θ = 0)
    expect(saturationRange('R-744').maxKPaAbs).toBeCloseTo(7377.3, 6);
  });

  it('refuses to extrapolate a fitted curve', () => {
    expect(() => saturationPressureKPa('R-404A', -55)).toThrow(DomainError);
    expect(() => saturationPressureKPa('R-404A', 61)).toThrow(/covers -50.0 °C to 60.0 °C/);
    expect(() => saturationPressureKPa('R-452A', 70, 'bubble')).toThrow(/bubble-point saturation data/);
    expect(() => saturationTemperatureC('R-404A', 3000)).toThrow(/outside the R-404A dew-point saturation data/);
    expect(() => saturationTemperatureC('R-404A', 50)).toThrow(/outside/);
  });

  it('says R-744 is supercritical above 31 °C', () => {
    expect(() => saturationPressureKPa('R-744', 35)).toThrow(/supercritical/);
    expect(() => saturationTemperatureC('R-744', 9000)).toThrow(/above the critical pressure.*supercritical/);
    expect(() => saturationPressureKPa('R-134a', 105)).toThrow(/above the critical point/);
    expect(() => saturationTemperatureC('R-134a', 4100)).toThrow(/critical pressure of R-134a/);
  });

  it('refuses pressures at or below a perfect vacuum and values that are not numbers', () => {
    expect(() => saturationTemperatureC('R-134a', 0)).toThrow(/perfect vacuum/);
    expect(() => saturationTemperatureC('R-134a', -5)).toThrow(/gauge reading entered as absolute/);
    expect(() => saturationTemperatureC('R-134a', Number.NaN)).toThrow(/must be a number/);
    expect(() => saturationPressureKPa('R-134a', Number.NaN)).toThrow(/must be a number/);
    expect(() => saturationTemperatureFromGaugeC('R-134a', Number.NaN)).toThrow(/must be a number/);
    expect(() => saturationPressureKPa('R-134a', 0, 'liquid' as 'dew')).toThrow(/bubble" or "dew/);
    expect(() => saturationPressureKPa('R-22', 0)).toThrow(/Unknown refrigerant/);
  });
});

describe('inverse T(p)', () => {
  for (const code of REFRIGERANT_CODES) {
    for (const side of ['bubble', 'dew'] as const) {
      it(`returns T for p(T) over the whole ${code} ${side} range`, () => {
        const { minC, maxC } = saturationRange(code, side);
        fc.assert(
          fc.property(fc.double({ min: minC, max: maxC, noNaN: true }), (c) => {
            const p = saturationPressureKPa(code, c, side);
            expect(Math.abs(saturationTemperatureC(code, p, side) - c)).toBeLessThan(1e-6);
          }),
          { numRuns: 300 },
        );
      });
    }
  }

  it('rises with temperature on every curve', () => {
    for (const code of REFRIGERANT_CODES) {
      const { minC, maxC } = saturationRange(code);
      let prev = 0;
      for (let c = minC; c <= maxC; c += 0.25) {
        const p = saturationPressureKPa(code, c);
        expect(p).toBeGreaterThan(prev);
        prev = p;
      }
    }
  });
});
