// How Tightloop writes numbers and dates: one rule per quantity, used by every screen (en-GB, a space before the
// unit, trailing zeros dropped).
import { format, formatDistanceStrict, parseISO } from 'date-fns';
import { formatContainerNumber } from '../../shared/domain';

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

/**
 * A moment as read at a site: its wall-clock time in the site's IANA zone with the offset, e.g.
 * "12 Mar 2026, 14:05 UTC+8" (UTC when the site has no zone).
 */
export function fmtDateTimeInZone(v: string | Date, timeZone: string | null | undefined): string {
  const parts = new Intl.DateTimeFormat('en-GB', {
    timeZone: timeZone ?? 'UTC',
    day: 'numeric',
    month: 'short',
    year: 'numeric',
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
    timeZoneName: 'shortOffset',
  }).formatToParts(toDate(v));
  const part = (type: Intl.DateTimeFormatPartTypes) => parts.find((p) => p.type === type)?.value ?? '';
  // Engines write the offset as GMT+8 or UTC+8, and a zero offset as GMT, UTC or UTC+0: one form here.
  const offset = part('timeZoneName')
    .replace(/^(GMT|UTC)/, 'UTC')
    .replace(/^UTC[+-]0?$|^$/, 'UTC');
  return `${part('day')} ${part('month')} ${part('year')}, ${part('hour')}:${part('minute')} ${offset}`;
}
