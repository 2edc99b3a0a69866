// How Tightloop writes numbers and dates: one rule per quantity, used by every screen (en-GB, a space before the
// unit, trailing zeros dropped). The number rules live in shared/ so the server writes them the same way.
import { format, formatDistanceStrict, parseISO } from 'date-fns';
import { formatContainerNumber } from '../../shared/domain';

export { fmtC, fmtCount, fmtK, fmtKg, fmtMoney, fmtNumber, fmtPct, fmtTonnes } from '../../shared/format';

// A calendar day ('2026-06-01') parses to local midnight, so it shows as that day wherever the viewer is; a timestamp
// shows in the viewer's own time zone.
const toDate = (v: string | Date) => (typeof v === 'string' ? parseISO(v) : v);

/** 1 Jun 2026; a missing date is a dash. */
export const fmtDay = (v: string | Date | null | undefined) => (v ? format(toDate(v), 'd MMM yyyy') : '—');
/** 1 Jun, where the year is plain from the context. */
export const fmtDayShort = (v: string | Date) => format(toDate(v), 'd MMM');
/** 1 Jun 2026, 14:05 (24-hour clock). */
export const fmtDateTime = (v: string | Date) => format(toDate(v), 'd MMM yyyy, HH:mm');
/** 14:05:33, for figures read moments ago. */
export const fmtTime = (v: string | Date) => format(toDate(v), 'HH:mm:ss');
/** A calendar month ('2026-06') on a chart's axis: Jun 26. */
export const fmtMonth = (yearMonth: string) => format(parseISO(`${yearMonth}-01`), 'MMM yy');
/** The time between two moments in words: "3 months". */
export const fmtSpan = (from: string | Date, to: string | Date) => formatDistanceStrict(toDate(from), toDate(to));

/** Axis tick: the year at a year's start, else the month (long spans) or the day (short ones). */
export function timeTick(d: Date | { valueOf(): number }, spanDays: number): string {
  const date = d instanceof Date ? d : new Date(d.valueOf());
  if (date.getMonth() === 0 && date.getDate() === 1 && date.getHours() === 0) return String(date.getFullYear());
  if (spanDays > 120) return format(date, 'MMM');
  return format(date, 'd MMM');
}

/** HRLU 100001 6: owner code, serial and check digit apart, as painted on the unit. */
export const fmtContainer = (containerNumber: string) => formatContainerNumber(containerNumber);

/** A moment as read at a site, e.g. "12 Mar 2026, 14:05 UTC+8": the server's mails write it the same way. */
export { fmtDateTimeInZone } from '../../shared/format-dates';
