// Calendar days as the server reads and writes them: ISO date text (YYYY-MM-DD), UTC.

/** Today's date, UTC, of a clock reading. */
export const todayOf = (now: Date) => now.toISOString().slice(0, 10);

/** The date `days` after (or before) an ISO date. */
export const dayPlus = (day: string, days: number) =>
  new Date(Date.parse(day) + days * 86_400_000).toISOString().slice(0, 10);

/** Date-only text of a DATE column read raw (a Date at UTC midnight) or already text; '' for none. */
export const dayText = (v: unknown): string =>
  v == null ? '' : v instanceof Date ? v.toISOString().slice(0, 10) : String(v).slice(0, 10);
