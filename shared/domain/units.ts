import { DomainError } from './errors';
import { isFiniteNumber } from './numbers';

// NIST SP 811, Appendix B.8: exact defining values.
export const KG_PER_LB = 0.45359237;
export const METRE_PER_INCH = 0.0254;
export const STANDARD_GRAVITY_M_S2 = 9.80665;
export const STANDARD_ATMOSPHERE_KPA = 101.325;
export const KPA_PER_BAR = 100;
export const KPA_PER_MPA = 1000;
/** 1 psi = 1 lbf/in² = 0.45359237 kg × 9.80665 m/s² / (0.0254 m)² = 6.894757293168361 kPa (NIST SP 811, B.8). */
export const KPA_PER_PSI = (KG_PER_LB * STANDARD_GRAVITY_M_S2) / METRE_PER_INCH ** 2 / 1000;
export const ABSOLUTE_ZERO_C = -273.15;

export const PRESSURE_UNITS = ['kPa', 'bar', 'psi', 'MPa'] as const;
export type PressureUnit = (typeof PRESSURE_UNITS)[number];
export const PRESSURE_REFERENCES = ['gauge', 'absolute'] as const;
export type PressureReference = (typeof PRESSURE_REFERENCES)[number];
export interface PressureScale {
  unit: PressureUnit;
  ref: PressureReference;
}

export const TEMPERATURE_UNITS = ['C', 'F', 'K'] as const;
export type TemperatureUnit = (typeof TEMPERATURE_UNITS)[number];

export const MASS_UNITS = ['kg', 'lb'] as const;
export type MassUnit = (typeof MASS_UNITS)[number];

const KPA_PER_UNIT: Record<PressureUnit, number> = { kPa: 1, bar: KPA_PER_BAR, psi: KPA_PER_PSI, MPa: KPA_PER_MPA };

// Rounding slack so that exactly −1 atm gauge is accepted as a perfect vacuum.
const VACUUM_SLACK_KPA = 1e-9;

function requireFinite(value: number, what: string): void {
  if (!isFiniteNumber(value)) throw new DomainError(`${what} must be a number, not ${String(value)}.`);
}

/** p_abs = p_gauge + 101.325 kPa (standard atmosphere, NIST SP 811; site elevation ignored). */
export function gaugeToAbsoluteKPa(kPaG: number): number {
  return kPaG + STANDARD_ATMOSPHERE_KPA;
}

/** p_gauge = p_abs − 101.325 kPa (standard atmosphere, NIST SP 811). */
export function absoluteToGaugeKPa(kPaAbs: number): number {
  return kPaAbs - STANDARD_ATMOSPHERE_KPA;
}

/** Converts a pressure between kPa, bar, psi and MPa, gauge or absolute. Below a perfect vacuum is an error. */
export function convertPressure(value: number, from: PressureScale, to: PressureScale): number {
  requireFinite(value, 'A pressure');
  const fromFactor = KPA_PER_UNIT[from.unit];
  const toFactor = KPA_PER_UNIT[to.unit];
  if (fromFactor === undefined || toFactor === undefined) {
    throw new DomainError(`Pressure units are ${PRESSURE_UNITS.join(', ')}.`);
  }
  const kPa = value * fromFactor;
  const kPaAbs = from.ref === 'gauge' ? gaugeToAbsoluteKPa(kPa) : kPa;
  if (kPaAbs < -VACUUM_SLACK_KPA) {
    throw new DomainError(
      `${value} ${from.unit} ${from.ref === 'gauge' ? '(gauge)' : '(absolute)'} is below a perfect vacuum; check the reading and whether it is gauge or absolute.`,
    );
  }
  const out = to.ref === 'gauge' ? absoluteToGaugeKPa(Math.max(0, kPaAbs)) : Math.max(0, kPaAbs);
  return out / toFactor;
}

function toCelsius(value: number, unit: TemperatureUnit): number {
  if (unit === 'C') return value;
  if (unit === 'F') return (value - 32) / 1.8; // t/°C = (t/°F − 32)/1.8 (NIST SP 811)
  if (unit === 'K') return value + ABSOLUTE_ZERO_C; // t/°C = T/K − 273.15 (NIST SP 811)
  throw new DomainError(`Temperature units are ${TEMPERATURE_UNITS.join(', ')}.`);
}

function fromCelsius(celsius: number, unit: TemperatureUnit): number {
  if (unit === 'C') return celsius;
  if (unit === 'F') return celsius * 1.8 + 32;
  if (unit === 'K') return celsius - ABSOLUTE_ZERO_C;
  throw new DomainError(`Temperature units are ${TEMPERATURE_UNITS.join(', ')}.`);
}

/** Converts between °C, °F and K. Below absolute zero is an error. */
export function convertTemperature(value: number, from: TemperatureUnit, to: TemperatureUnit): number {
  requireFinite(value, 'A temperature');
  const c = toCelsius(value, from);
  if (c < ABSOLUTE_ZERO_C - 1e-9) {
    throw new DomainError(`${value} ${from === 'K' ? 'K' : `°${from}`} is below absolute zero.`);
  }
  return fromCelsius(c, to);
}

/** Converts between kg and lb (1 lb = 0.45359237 kg exactly, NIST SP 811). Negative masses are an error. */
export function convertMass(value: number, from: MassUnit, to: MassUnit): number {
  requireFinite(value, 'A mass');
  if (value < 0) throw new DomainError(`A mass cannot be negative (${value} ${from}).`);
  const kg = from === 'kg' ? value : from === 'lb' ? value * KG_PER_LB : NaN;
  if (Number.isNaN(kg) || (to !== 'kg' && to !== 'lb')) {
    throw new DomainError(`Mass units are ${MASS_UNITS.join(', ')}.`);
  }
  return to === 'kg' ? kg : kg / KG_PER_LB;
}
