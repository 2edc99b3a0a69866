/** Period presets of the log, as UTC calendar days. */
export const PERIODS = [
  'this_month',
  'last_month',
  'this_quarter',
  'last_quarter',
  'this_year',
  'last_year',
  'custom',
] as const;
export type Period = (typeof PERIODS)[number];
export const PERIOD_LABELS: Record<Period, string> = {
  this_month: 'This month',
  last_month: 'Last month',
  this_quarter: 'This quarter',
  last_quarter: 'Last quarter',
  this_year: 'This year',
  last_year: 'Last year',
  custom: 'Choose days',
};

const day = (y: number, m: number, d: number) => new Date(Date.UTC(y, m, d)).toISOString().slice(0, 10);

export function periodRange(p: Exclude<Period, 'custom'>, today = new Date()): { from: string; to: string } {
  const y = today.getUTCFullYear();
  const m = today.getUTCMonth();
  const q = Math.floor(m / 3) * 3;
  switch (p) {
    case 'this_month':
      return { from: day(y, m, 1), to: day(y, m + 1, 0) };
    case 'last_month':
      return { from: day(y, m - 1, 1), to: day(y, m, 0) };
    case 'this_quarter':
      return { from: day(y, q, 1), to: day(y, q + 3, 0) };
    case 'last_quarter':
      return { from: day(y, q - 3, 1), to: day(y, q, 0) };
    case 'this_year':
      return { from: day(y, 0, 1), to: day(y, 11, 31) };
    case 'last_year':
      return { from: day(y - 1, 0, 1), to: day(y - 1, 11, 31) };
  }
}
