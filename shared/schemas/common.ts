import { z } from 'zod';
import { ENGINE_MAX_YEAR, isoToMs } from '../domain/dates';
import { fmtIsoDay } from '../format-dates';

// The one error shape every API failure uses.
export const apiErrorDto = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional(),
  }),
});
export type ApiErrorDto = z.infer<typeof apiErrorDto>;

/** A request that was accepted and has nothing else to say (202: a mail is on its way, or none is due). */
export const okDto = z.object({ ok: z.literal(true) });
export type OkDto = z.infer<typeof okDto>;

/** A numeric id in a query string or a route parameter. */
export const positiveId = (what: string) =>
  z.coerce
    .number({ message: `Not a valid ${what}` })
    .int()
    .positive()
    .max(2_147_483_647);

export const idParamSchema = z.object({ id: z.string().min(1).max(64) });

// ---- Text from forms and CSV cells: every field arrives as text ----

/** A cleared form field or an empty CSV cell means "not given". */
export const blankToNull = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? null : v);
/** A number typed or exported as text; a decimal comma is accepted ("4,5" kg). */
export const textToNumber = (v: unknown) => {
  const b = blankToNull(v);
  return typeof b === 'string' ? Number(b.trim().replace(/^(-?\d+),(\d+)$/, '$1.$2')) : b;
};
/** A spreadsheet's words for an enum value ("In service", "out-of-service") as its id (in_service). */
export const textToId = (v: unknown) =>
  typeof v === 'string'
    ? v
        .trim()
        .toLowerCase()
        .replace(/[\s-]+/g, '_')
    : v;
/** Free text a form or a CSV cell may leave blank: trimmed, blank is null, at most `max` characters. */
export const optionalText = (max: number) =>
  z.preprocess(
    (v) => (typeof v === 'string' ? (v.trim() === '' ? null : v.trim()) : v),
    z.string().max(max, `Use at most ${max} characters`).nullable(),
  );

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

let todayMinute = NaN;
let todayText = '';
/** The latest calendar day anywhere at `now` (a date-only "today" is valid wherever the person is). */
export function latestToday(now: Date): string {
  // Kept for the minute: the import asks once per row.
  const minute = Math.floor(now.getTime() / 60_000);
  if (minute !== todayMinute) {
    todayMinute = minute;
    todayText = new Date(minute * 60_000 + EARLIEST_ZONE_AHEAD_MS).toISOString().slice(0, 10);
  }
  return todayText;
}

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
  return `Enter a date between ${fmtIsoDay(earliest)} and ${latest === 'today' ? 'today' : fmtIsoDay(latest)}`;
}

const ISO_DAY = /^\d{4}-\d{2}-\d{2}$/;

/**
 * A calendar date (`YYYY-MM-DD`) inside the rule's range; the defaults keep it inside what the engine computes.
 * One transform rather than a chain of zod checks: the CSV import runs it on every row of a 200,000-row file.
 */
export function daySchema({
  format,
  earliest = EARLIEST_RECORD_DAY,
  latest = LATEST_ENGINE_DAY,
  now = () => new Date(),
}: DayRange) {
  const message = dayRangeMessage(earliest, latest);
  return z.string({ error: format }).transform((value, ctx) => {
    const day = value.trim();
    if (!ISO_DAY.test(day)) {
      ctx.addIssue({ code: 'custom', message: format });
      return z.NEVER;
    }
    // ISO dates order as text; inside the range the engine's reader tells an impossible day (2024-02-30).
    if (day < earliest || day > (latest === 'today' ? latestToday(now()) : latest)) {
      ctx.addIssue({ code: 'custom', message });
      return z.NEVER;
    }
    if (Number.isNaN(isoToMs(day))) {
      ctx.addIssue({ code: 'custom', message: format });
      return z.NEVER;
    }
    return day;
  });
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
    { message: `Enter a time between ${fmtIsoDay(earliest)} and now` },
  );
}
