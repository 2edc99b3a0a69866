import { z } from 'zod';
import { ENGINE_MAX_YEAR } from '../domain/dates';

// The one error shape every API failure uses.
export const apiErrorDto = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional(),
  }),
});
export type ApiErrorDto = z.infer<typeof apiErrorDto>;

export const idParamSchema = z.object({ id: z.string().min(1).max(64) });

// ---- The date rule: one place for every date the product accepts (forms, API, CSV import, query ranges) ----

/**
 * Earliest date anything in a unit's record may carry. Our definition, no published source: no reefer unit in a
 * fleet today was commissioned before 1960, so an earlier commissioning or service date is a typing error (1850 for
 * 1985); it also keeps every accepted date inside the years the engine computes (1900–2199).
 */
export const EARLIEST_RECORD_DAY = '1960-01-01';
/** Last day the engine computes (shared/domain/dates.ts). */
export const LATEST_ENGINE_DAY = `${ENGINE_MAX_YEAR}-12-31`;
/** Our definition: a time up to this far ahead of the clock that checks it is "now" (clocks drift). */
export const CLOCK_SKEW_MS = 5 * 60 * 1000;
/** Our definition: an entry dated up to a year before the unit's commissioning date (a factory fill, a pre-delivery
 * check, a commissioning date typed as the year only) is plausible; earlier, one of the two dates is wrong. */
export const BEFORE_COMMISSIONING_MARGIN_DAYS = 366;
// Clocks in use run up to UTC+14, so a person's "today" may be the next UTC day.
const EARLIEST_ZONE_AHEAD_MS = 14 * 3600 * 1000;

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
/** "1 Jan 1960" for 1960-01-01: the bounds in messages, readable in any locale's order. */
export const dayWords = (day: string) =>
  `${Number(day.slice(8, 10))} ${MONTHS[Number(day.slice(5, 7)) - 1]} ${day.slice(0, 4)}`;

/** The latest calendar day anywhere at `now` (a date-only "today" is valid wherever the person is). */
export const latestToday = (now: Date) => new Date(now.getTime() + EARLIEST_ZONE_AHEAD_MS).toISOString().slice(0, 10);

type DayRange = {
  /** Message for text that is not a calendar date. */
  format: string;
  earliest?: string;
  /** A day, or 'today' (the clock of whoever parses: the browser for a form, the server for the API and import). */
  latest?: string | 'today';
  now?: () => Date;
};

/** The human message of a range: "Enter a date between 1 Jan 1960 and today". */
export function dayRangeMessage(earliest: string, latest: string | 'today'): string {
  return `Enter a date between ${dayWords(earliest)} and ${latest === 'today' ? 'today' : dayWords(latest)}`;
}

/**
 * A calendar date (`YYYY-MM-DD`) inside the rule's range. The bounds are compared as text, which orders ISO dates;
 * the defaults keep it inside what the engine computes.
 */
export function daySchema({
  format,
  earliest = EARLIEST_RECORD_DAY,
  latest = LATEST_ENGINE_DAY,
  now = () => new Date(),
}: DayRange) {
  const message = dayRangeMessage(earliest, latest);
  return z
    .string({ error: format })
    .trim()
    .pipe(z.iso.date({ message: format }))
    .refine((d) => d >= earliest && d <= (latest === 'today' ? latestToday(now()) : latest), { message });
}

/**
 * A moment (ISO 8601 with a zone) from the earliest record day up to the last day the engine computes. Whether it is
 * in the future is checked with the server's clock by the rule that knows the unit (visitPlausibilityIssues).
 */
export function momentSchema({ format, earliest = EARLIEST_RECORD_DAY }: { format: string; earliest?: string }) {
  const from = Date.parse(`${earliest}T00:00:00Z`);
  const until = Date.parse(`${LATEST_ENGINE_DAY}T23:59:59.999Z`);
  return z.iso.datetime({ offset: true, message: format }).refine(
    (v) => {
      const ms = Date.parse(v);
      return ms >= from && ms <= until;
    },
    { message: `Enter a time between ${dayWords(earliest)} and now` },
  );
}
