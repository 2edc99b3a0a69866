// How Tightloop writes numbers: one rule per quantity (en-GB, a space before the unit, trailing zeros dropped), the
// same on every screen (src/lib/format.ts re-exports these) and in what the server writes (the handover PDF).

const numberFormats = new Map<number, Intl.NumberFormat>();

/** At most `maxDecimals`, trailing zeros dropped, thousands grouped: 1234.50 → "1,234.5". */
export function fmtNumber(value: number, maxDecimals: number): string {
  let nf = numberFormats.get(maxDecimals);
  if (!nf) {
    nf = new Intl.NumberFormat('en-GB', { maximumFractionDigits: maxDecimals });
    numberFormats.set(maxDecimals, nf);
  }
  return nf.format(value);
}

/** Whole things counted: units, cases, visits. */
export const fmtCount = (n: number) => fmtNumber(n, 0);

/** Percentages (leak rates, how often a range held): one decimal at most, so 25.3 % reads the same everywhere. */
export const fmtPct = (pct: number) => `${fmtNumber(pct, 1)} %`;

/** Refrigerant mass: two decimals at most, the 10 g a service scale reads to. */
export const fmtKg = (kg: number) => `${fmtNumber(kg, 2)} kg`;

/**
 * Tonnes of CO2 equivalent: two decimals at most; an amount that would round to nothing says "< 0.01 t" rather than
 * a misleading 0. The caller names it CO2e where the label does not.
 */
export const fmtTonnes = (t: number) => (t > 0 && t < 0.005 ? '< 0.01 t' : `${fmtNumber(t, 2)} t`);

/** Temperatures and differences: one decimal, a true minus sign. */
export const fmtC = (c: number) => `${c < 0 ? '−' : ''}${fmtNumber(Math.abs(c), 1)} °C`;
export const fmtK = (k: number) => `${k > 0 ? '+' : k < 0 ? '−' : ''}${fmtNumber(Math.abs(k), 1)} K`;

/**
 * Money in whole units: with the fleet's currency where it is known (an unknown code is written after the amount),
 * else the bare amount.
 */
export function fmtMoney(v: number, currency?: string): string {
  if (!currency) return fmtCount(Math.round(v));
  try {
    return new Intl.NumberFormat('en-GB', { style: 'currency', currency, maximumFractionDigits: 0 }).format(v);
  } catch {
    return `${fmtCount(Math.round(v))} ${currency}`;
  }
}
