import { DomainError } from './errors';
import { roundTo } from './numbers';
import { getRefrigerant, type RefrigerantCode } from './refrigerants';
import { ABSOLUTE_ZERO_C, gaugeToAbsoluteKPa } from './units';

export type SaturationSide = 'bubble' | 'dew';

/**
 * ln(p/pr) = (Tr/T)·Σ nᵢ θ^eᵢ with θ = 1 − T/Tr.
 * Form A: exponents 1, 1.5, 2, 4 (Tillner-Roth & Baehr 1994; Span & Wagner 1996 ancillary).
 * Form B: exponents 1, 1.5, 2.5, 5 (our fits to CoolProp 8.0.0, DOMAIN.md §3).
 */
interface Coefficients {
  readonly form: 'A' | 'B';
  readonly trK: number;
  readonly lnPr: number;
  readonly n1: number;
  readonly n2: number;
  readonly n3: number;
  readonly n4: number;
}

interface Curve extends Coefficients {
  readonly prKPa: number;
  readonly minK: number;
  readonly maxK: number;
  /** True when the top of the range is the critical point (nothing above it saturates). */
  readonly endsAtCritical: boolean;
  readonly minKPa: number;
  readonly maxKPa: number;
}

function curve(
  form: 'A' | 'B',
  trK: number,
  prKPa: number,
  n: [number, number, number, number],
  minK: number,
  maxK: number,
  endsAtCritical: boolean,
): Curve {
  const k: Coefficients = { form, trK, lnPr: Math.log(prKPa), n1: n[0], n2: n[1], n3: n[2], n4: n[3] };
  return {
    ...k,
    prKPa,
    minK,
    maxK,
    endsAtCritical,
    minKPa: Math.exp(lnPressure(k, minK)),
    maxKPa: Math.exp(lnPressure(k, maxK)),
  };
}

const FIT_MIN_K = 223.15; // −50 °C: the fitted range, no extrapolation
const FIT_MAX_K = 333.15; // +60 °C

// Source: Tillner-Roth & Baehr (1994) vapour-pressure equation; valid 170 K … Tc.
const R134A = curve('A', 374.18, 4056.29, [-7.686556, 2.311791, -2.039554, -3.583758], 170, 374.18, true);
// Span & Wagner (1996) ancillary equation (From memory); triple point 216.592 K to Tc.
const R744 = curve('A', 304.1282, 7377.3, [-7.0602087, 1.9391218, -1.6463597, -3.2995634], 216.592, 304.1282, true);
// Fitted to CoolProp 8.0.0 over −50 … +60 °C (DOMAIN.md §3 table).
const R404A_BUBBLE = curve('B', 350, 4117.14, [-7.40422, 1.79873, -2.09904, -3.62844], FIT_MIN_K, FIT_MAX_K, false);
const R404A_DEW = curve('B', 350, 4107.7, [-7.45981, 1.82647, -2.15281, -4.4407], FIT_MIN_K, FIT_MAX_K, false);
const R452A_BUBBLE = curve('B', 350, 4186.41, [-6.95106, 0.929668, -1.60976, -4.07428], FIT_MIN_K, FIT_MAX_K, false);
const R452A_DEW = curve('B', 350, 4071.72, [-7.92853, 2.48702, -2.93026, -3.09841], FIT_MIN_K, FIT_MAX_K, false);
const R513A_BUBBLE = curve('B', 350, 2510.96, [-7.51693, 0.960659, -2.02724, -3.87619], FIT_MIN_K, FIT_MAX_K, false);
const R513A_DEW = curve('B', 350, 2510.18, [-7.51966, 0.986356, -2.1177, -4.6258], FIT_MIN_K, FIT_MAX_K, false);
const R1234YF = curve('B', 367.85, 3384.88, [-7.40422, 1.69679, -2.16482, -3.37956], FIT_MIN_K, FIT_MAX_K, false);

const CURVES: Readonly<Record<RefrigerantCode, { readonly bubble: Curve; readonly dew: Curve }>> = {
  'R-134a': { bubble: R134A, dew: R134A },
  'R-404A': { bubble: R404A_BUBBLE, dew: R404A_DEW },
  'R-452A': { bubble: R452A_BUBBLE, dew: R452A_DEW },
  'R-513A': { bubble: R513A_BUBBLE, dew: R513A_DEW },
  'R-1234yf': { bubble: R1234YF, dew: R1234YF },
  'R-744': { bubble: R744, dew: R744 },
};

/** Σ nᵢ θ^eᵢ, with powers built from sqrt (much faster than Math.pow). */
function series(c: Coefficients, theta: number): number {
  const r = Math.sqrt(theta);
  const t2 = theta * theta;
  return c.form === 'A'
    ? c.n1 * theta + c.n2 * theta * r + c.n3 * t2 + c.n4 * t2 * t2
    : c.n1 * theta + c.n2 * theta * r + c.n3 * t2 * r + c.n4 * t2 * t2 * theta;
}

/** d/dθ of the series. */
function seriesSlope(c: Coefficients, theta: number): number {
  const r = Math.sqrt(theta);
  return c.form === 'A'
    ? c.n1 + 1.5 * c.n2 * r + 2 * c.n3 * theta + 4 * c.n4 * theta * theta * theta
    : c.n1 + 1.5 * c.n2 * r + 2.5 * c.n3 * theta * r + 5 * c.n4 * theta * theta * theta * theta;
}

function lnPressure(c: Coefficients, tK: number): number {
  const theta = Math.max(0, 1 - tK / c.trK);
  return c.lnPr + (c.trK / tK) * series(c, theta);
}

/** d ln p / dT = −(Tr/T²)·S(θ) − S′(θ)/T. */
function lnPressureSlope(c: Coefficients, tK: number): number {
  const theta = Math.max(0, 1 - tK / c.trK);
  return (-c.trK / (tK * tK)) * series(c, theta) - seriesSlope(c, theta) / tK;
}

function curveFor(
  refrigerant: string,
  side: SaturationSide | undefined,
): { code: RefrigerantCode; curve: Curve; label: string } {
  const r = getRefrigerant(refrigerant);
  const s = side ?? 'dew';
  if (s !== 'bubble' && s !== 'dew') throw new DomainError('The saturation side is "bubble" or "dew".', 'side');
  return { code: r.code, curve: CURVES[r.code][s], label: r.isBlend ? `${r.code} ${s}-point` : r.code };
}

const fmtC = (k: number): string => `${(k + ABSOLUTE_ZERO_C).toFixed(1)} °C`;
const fmtKPa = (p: number): string => `${p < 10 ? p.toFixed(2) : p.toFixed(1)} kPa (abs)`;
const EDGE_SLACK_K = 1e-9;

export interface SaturationRange {
  minC: number;
  maxC: number;
  minKPaAbs: number;
  maxKPaAbs: number;
  /** The top of the range is the critical point. */
  endsAtCritical: boolean;
}

/** The temperature and pressure range over which a refrigerant's saturation curve is defined. */
export function saturationRange(refrigerant: string, side?: SaturationSide): SaturationRange {
  const { curve: c } = curveFor(refrigerant, side);
  return {
    minC: roundTo(c.minK + ABSOLUTE_ZERO_C, 6),
    maxC: roundTo(c.maxK + ABSOLUTE_ZERO_C, 6),
    minKPaAbs: c.minKPa,
    maxKPaAbs: c.maxKPa,
    endsAtCritical: c.endsAtCritical,
  };
}

/** Saturation pressure (kPa absolute) at a temperature; side defaults to dew. Outside the curve's range is an error. */
export function saturationPressureKPa(refrigerant: string, tempC: number, side?: SaturationSide): number {
  const { code, curve: c, label } = curveFor(refrigerant, side);
  if (typeof tempC !== 'number' || !Number.isFinite(tempC))
    throw new DomainError('The temperature must be a number.', 'tempC');
  const tK = tempC - ABSOLUTE_ZERO_C;
  if (tK > c.maxK + EDGE_SLACK_K && c.endsAtCritical) {
    throw new DomainError(
      `${code} has no saturation above its critical point (${fmtC(c.maxK)}); at ${tempC} °C it is ${code === 'R-744' ? 'supercritical' : 'above the critical point'}.`,
      'tempC',
    );
  }
  if (tK < c.minK - EDGE_SLACK_K || tK > c.maxK + EDGE_SLACK_K) {
    throw new DomainError(
      `${label} saturation data covers ${fmtC(c.minK)} to ${fmtC(c.maxK)}; ${tempC} °C is outside it.`,
      'tempC',
    );
  }
  return Math.exp(lnPressure(c, Math.min(c.maxK, Math.max(c.minK, tK))));
}

/** Internal sentinels of the inverse for a pressure off either end of the curve. */
export const BELOW_RANGE = -1;
export const ABOVE_RANGE = -2;

const TABLE_STEPS = 64;

interface Table {
  readonly lnMin: number;
  readonly step: number;
  /** T at each node, evenly spaced in ln p. */
  readonly t: Float64Array;
  /** dT/d(ln p) at each node. */
  readonly slope: Float64Array;
}

/** Per curve, T and dT/d(ln p) at evenly spaced ln p over the range, found once by bisection. */
const tables = new Map<Curve, Table>();
function tableFor(c: Curve): Table {
  const cached = tables.get(c);
  if (cached) return cached;
  const lnMin = Math.log(c.minKPa);
  const step = (Math.log(c.maxKPa) - lnMin) / TABLE_STEPS;
  const t = new Float64Array(TABLE_STEPS + 1);
  const slope = new Float64Array(TABLE_STEPS + 1);
  for (let i = 0; i <= TABLE_STEPS; i++) {
    const target = lnMin + i * step;
    let lo = c.minK;
    let hi = c.maxK;
    for (let j = 0; j < 80; j++) {
      const mid = 0.5 * (lo + hi);
      if (lnPressure(c, mid) > target) hi = mid;
      else lo = mid;
    }
    t[i] = i === 0 ? c.minK : i === TABLE_STEPS ? c.maxK : 0.5 * (lo + hi);
    slope[i] = 1 / lnPressureSlope(c, t[i]);
  }
  const table = { lnMin, step, t, slope };
  tables.set(c, table);
  return table;
}

/**
 * T(p) in kelvin, or BELOW_RANGE / ABOVE_RANGE. Starts from a cubic Hermite guess between the two table nodes that
 * bracket the answer, then Newton's method on ln p(T), bisecting whenever a step would leave the bracket, so it
 * always converges on the monotonic curve (usually in one step).
 */
function solveTemperatureK(c: Curve, pKPaAbs: number): number {
  if (!(pKPaAbs >= c.minKPa * (1 - 1e-12))) return BELOW_RANGE;
  if (pKPaAbs > c.maxKPa * (1 + 1e-12)) return ABOVE_RANGE;
  const tb = tableFor(c);
  const target = Math.log(pKPaAbs);
  const pos = (target - tb.lnMin) / tb.step;
  const i = Math.min(TABLE_STEPS - 1, Math.max(0, Math.floor(pos)));
  let lo = tb.t[i];
  let hi = tb.t[i + 1];
  const u = Math.min(1, Math.max(0, pos - i));
  const u2 = u * u;
  const u3 = u2 * u;
  let t =
    (2 * u3 - 3 * u2 + 1) * lo +
    (u3 - 2 * u2 + u) * tb.step * tb.slope[i] +
    (-2 * u3 + 3 * u2) * hi +
    (u3 - u2) * tb.step * tb.slope[i + 1];
  if (!(t >= lo && t <= hi)) t = 0.5 * (lo + hi);
  for (let k = 0; k < 100; k++) {
    // ln p and its slope from one evaluation of θ, √θ and the series.
    const theta = Math.max(0, 1 - t / c.trK);
    const r = Math.sqrt(theta);
    const t2 = theta * theta;
    let series: number;
    let slope: number;
    if (c.form === 'A') {
      series = c.n1 * theta + c.n2 * theta * r + c.n3 * t2 + c.n4 * t2 * t2;
      slope = c.n1 + 1.5 * c.n2 * r + 2 * c.n3 * theta + 4 * c.n4 * t2 * theta;
    } else {
      series = c.n1 * theta + c.n2 * theta * r + c.n3 * t2 * r + c.n4 * t2 * t2 * theta;
      slope = c.n1 + 1.5 * c.n2 * r + 2.5 * c.n3 * theta * r + 5 * c.n4 * t2 * t2;
    }
    const ratio = c.trK / t;
    const g = c.lnPr + ratio * series - target;
    if (g === 0) return t;
    if (g > 0) hi = t;
    else lo = t;
    let next = t - g / ((-ratio / t) * series - slope / t);
    if (!(next >= lo && next <= hi)) next = 0.5 * (lo + hi);
    // Newton converges quadratically, so once a step is under 1e-5 K the error left is far smaller
    // (worst 1.5e-12 K over 20,001 points on every curve).
    if (Math.abs(next - t) < 1e-5) return next;
    t = next;
  }
  return t;
}

/** Internal: saturation temperature (K) for a catalogue code, or BELOW_RANGE / ABOVE_RANGE, without throwing. */
export function saturationKOrSentinel(code: RefrigerantCode, pKPaAbs: number, side: SaturationSide): number {
  return solveTemperatureK(CURVES[code][side], pKPaAbs);
}

/** Saturation temperature (°C) at an absolute pressure in kPa; side defaults to dew. Outside the range is an error. */
export function saturationTemperatureC(refrigerant: string, pressureKPaAbs: number, side?: SaturationSide): number {
  const { code, curve: c, label } = curveFor(refrigerant, side);
  if (typeof pressureKPaAbs !== 'number' || !Number.isFinite(pressureKPaAbs)) {
    throw new DomainError('The pressure must be a number.', 'pressureKPaAbs');
  }
  if (pressureKPaAbs <= 0) {
    throw new DomainError(
      `${pressureKPaAbs} kPa (abs) is at or below a perfect vacuum; an absolute pressure must be above 0. Was a gauge reading entered as absolute?`,
      'pressureKPaAbs',
    );
  }
  const tK = solveTemperatureK(c, pressureKPaAbs);
  if (tK > 0) return tK + ABSOLUTE_ZERO_C;
  if (tK === ABOVE_RANGE && c.endsAtCritical) {
    throw new DomainError(
      `${fmtKPa(pressureKPaAbs)} is above the critical pressure of ${code} (${fmtKPa(c.maxKPa)}); there is no saturation temperature${code === 'R-744' ? ' (supercritical CO2)' : ''}.`,
      'pressureKPaAbs',
    );
  }
  throw new DomainError(
    `${fmtKPa(pressureKPaAbs)} is outside the ${label} saturation data, which covers ${fmtKPa(c.minKPa)} (${fmtC(c.minK)}) to ${fmtKPa(c.maxKPa)} (${fmtC(c.maxK)}).`,
    'pressureKPaAbs',
  );
}

/** Saturation temperature (°C) from a gauge reading in kPa(g); dew by default, as for manifold gauges. */
export function saturationTemperatureFromGaugeC(refrigerant: string, kPaG: number, side?: SaturationSide): number {
  if (typeof kPaG !== 'number' || !Number.isFinite(kPaG))
    throw new DomainError('The pressure must be a number.', 'kPaG');
  return saturationTemperatureC(refrigerant, gaugeToAbsoluteKPa(kPaG), side);
}
