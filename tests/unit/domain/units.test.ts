import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  convertMass,
  convertPressure,
  convertTemperature,
  DomainError,
  KG_PER_LB,
  KPA_PER_PSI,
  PRESSURE_REFERENCES,
  PRESSURE_UNITS,
  STANDARD_ATMOSPHERE_KPA,
  TEMPERATURE_UNITS,
  absoluteToGaugeKPa,
  gaugeToAbsoluteKPa,
  type PressureScale,
} from '../../../shared/domain';

const psiG: PressureScale = { unit: 'psi', ref: 'gauge' };
const kPaG: PressureScale = { unit: 'kPa', ref: 'gauge' };
const barG: PressureScale = { unit: 'bar', ref: 'gauge' };

describe('pressure', () => {
  it('uses 1 psi = 6894.757293168361 Pa', () => {
    // Source: NIST SP 811, Appendix B.8 (lb, in and g_n exact; SP 811 lists 6.894 757 E+03 Pa)
    expect(KPA_PER_PSI * 1000).toBeCloseTo(6894.757293168361, 9);
    expect(KPA_PER_PSI * 1000).toBeCloseTo(6.894757e3, 3);
  });

  it('reads 125 psi as 861.84 kPa and 8.618 bar', () => {
    // Source: NIST SP 811, Appendix B.8. 125 × 6.894757 = 861.8447 kPa; DOMAIN.md §1 prints 861.85,
    // which is within 0.01 kPa but rounds the other way.
    expect(convertPressure(125, psiG, kPaG)).toBeCloseTo(861.8447, 4);
    expect(Math.abs(convertPressure(125, psiG, kPaG) - 861.85)).toBeLessThan(0.01);
    expect(convertPressure(125, psiG, barG)).toBeCloseTo(8.618, 3);
  });

  it('reads 140 psi as 965.27 kPa and 9.653 bar', () => {
    // Source: NIST SP 811, Appendix B.8 (DOMAIN.md §1 check value)
    expect(convertPressure(140, psiG, kPaG)).toBeCloseTo(965.27, 2);
    expect(convertPressure(140, psiG, barG)).toBeCloseTo(9.653, 3);
  });

  it('adds one standard atmosphere, 101.325 kPa, from gauge to absolute', () => {
    // Source: NIST SP 811 (standard atmosphere = 101 325 Pa exactly)
    expect(STANDARD_ATMOSPHERE_KPA).toBe(101.325);
    expect(gaugeToAbsoluteKPa(0)).toBe(101.325);
    expect(absoluteToGaugeKPa(101.325)).toBe(0);
    expect(convertPressure(0, kPaG, { unit: 'kPa', ref: 'absolute' })).toBe(101.325);
    expect(convertPressure(1, { unit: 'MPa', ref: 'absolute' }, { unit: 'bar', ref: 'absolute' })).toBe(10);
  });

  it('reads 0 psig as 14.696 psia', () => {
    // Source: NIST SP 811, Appendix B.8 (101.325 kPa / 6.894757 kPa per psi = 14.696)
    expect(convertPressure(0, psiG, { unit: 'psi', ref: 'absolute' })).toBeCloseTo(14.696, 3);
  });

  it('accepts a perfect vacuum and refuses anything below it', () => {
    expect(convertPressure(-101.325, kPaG, { unit: 'kPa', ref: 'absolute' })).toBe(0);
    expect(() => convertPressure(-102, kPaG, barG)).toThrow(DomainError);
    expect(() => convertPressure(-102, kPaG, barG)).toThrow(/below a perfect vacuum/);
    expect(() => convertPressure(-1, { unit: 'bar', ref: 'absolute' }, kPaG)).toThrow(/absolute/);
  });

  it('refuses a pressure that is not a number or a unit it does not know', () => {
    expect(() => convertPressure(Number.NaN, kPaG, barG)).toThrow(/must be a number/);
    expect(() => convertPressure(1, { unit: 'atm' as 'kPa', ref: 'gauge' }, barG)).toThrow(/Pressure units/);
  });

  it('round-trips every pair of units and references', () => {
    const scale = fc.record({ unit: fc.constantFrom(...PRESSURE_UNITS), ref: fc.constantFrom(...PRESSURE_REFERENCES) });
    fc.assert(
      fc.property(fc.double({ min: 0, max: 20_000, noNaN: true }), scale, scale, (kPaAbs, a, b) => {
        const v = convertPressure(kPaAbs, { unit: 'kPa', ref: 'absolute' }, a);
        const back = convertPressure(convertPressure(v, a, b), b, a);
        expect(Math.abs(back - v)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(v)));
      }),
    );
  });
});

describe('temperature', () => {
  it('meets at −40 and puts water at 32 °F and 212 °F', () => {
    // Source: NIST SP 811 (t/°C = (t/°F − 32)/1.8; T/K = t/°C + 273.15)
    expect(convertTemperature(-40, 'F', 'C')).toBeCloseTo(-40, 12);
    expect(convertTemperature(32, 'F', 'C')).toBeCloseTo(0, 12);
    expect(convertTemperature(212, 'F', 'C')).toBeCloseTo(100, 12);
    expect(convertTemperature(0, 'C', 'K')).toBe(273.15);
    expect(convertTemperature(0, 'K', 'F')).toBeCloseTo(-459.67, 9);
  });

  it('refuses temperatures below absolute zero and unknown units', () => {
    expect(() => convertTemperature(-300, 'C', 'K')).toThrow(/absolute zero/);
    expect(() => convertTemperature(-1, 'K', 'C')).toThrow(/absolute zero/);
    expect(() => convertTemperature(1, 'R' as 'C', 'K')).toThrow(/Temperature units/);
    expect(() => convertTemperature(1, 'C', 'R' as 'K')).toThrow(/Temperature units/);
    expect(() => convertTemperature(Number.POSITIVE_INFINITY, 'C', 'K')).toThrow(/must be a number/);
  });

  it('round-trips °C, °F and K', () => {
    const unit = fc.constantFrom(...TEMPERATURE_UNITS);
    fc.assert(
      fc.property(fc.double({ min: -273.15, max: 1000, noNaN: true }), unit, unit, (c, a, b) => {
        const v = convertTemperature(c, 'C', a);
        const back = convertTemperature(convertTemperature(v, a, b), b, a);
        expect(Math.abs(back - v)).toBeLessThanOrEqual(1e-9);
      }),
    );
  });
});

describe('mass', () => {
  it('uses 1 lb = 0.45359237 kg exactly', () => {
    // Source: NIST SP 811, Appendix B.8
    expect(KG_PER_LB).toBe(0.45359237);
    expect(convertMass(1, 'lb', 'kg')).toBe(0.45359237);
  });

  it('puts the US 15 lb duty line at 6.80 kg', () => {
    // Source: 89 FR 82682 (2024), 15 lb of HFC charge; NIST SP 811 for the factor
    expect(convertMass(15, 'lb', 'kg')).toBeCloseTo(6.8, 2);
  });

  it('refuses negative masses and unknown units', () => {
    expect(() => convertMass(-1, 'kg', 'lb')).toThrow(/cannot be negative/);
    expect(() => convertMass(1, 'oz' as 'kg', 'lb')).toThrow(/Mass units/);
    expect(() => convertMass(1, 'kg', 'oz' as 'lb')).toThrow(/Mass units/);
  });

  it('round-trips kg and lb', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1e6, noNaN: true }), (kg) => {
        expect(convertMass(convertMass(kg, 'kg', 'lb'), 'lb', 'kg')).toBeCloseTo(kg, 6);
        expect(convertMass(kg, 'kg', 'kg')).toBe(kg);
      }),
    );
  });
});
