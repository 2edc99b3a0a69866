/** Small numeric helpers shared by the topic files (not part of the public face). */

const POWERS_OF_TEN = [1, 10, 100, 1000, 10_000, 100_000, 1_000_000];

export function roundTo(value: number, decimals: number): number {
  const f = POWERS_OF_TEN[decimals] ?? 10 ** decimals;
  const r = Math.round(value * f) / f;
  return r === 0 ? 0 : r; // no negative zero in outputs
}

/** Median of a non-empty list; the list is not modified. */
export function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

export function isFiniteNumber(value: unknown): value is number {
  return typeof value === 'number' && Number.isFinite(value);
}
