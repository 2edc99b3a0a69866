import { DomainError } from './errors';

/** Dates are handled as UTC milliseconds and UTC day numbers (days since 1970-01-01). */
export const MS_PER_DAY = 86_400_000;

/** The years the engine computes; every date the product accepts stays inside (shared/schemas/common.ts). */
export const ENGINE_MIN_YEAR = 1900;
export const ENGINE_MAX_YEAR = 2199;

function isLeapYear(year: number): boolean {
  return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
}

export function daysInMonth(year: number, month: number): number {
  if (month === 2) return isLeapYear(year) ? 29 : 28;
  return month === 4 || month === 6 || month === 9 || month === 11 ? 30 : 31;
}

/** Day number of a civil date (H. Hinnant's days-from-civil algorithm; years here are ≥ 1900). */
export function dayFromCivil(year: number, month: number, day: number): number {
  const y = month <= 2 ? year - 1 : year;
  const era = Math.floor(y / 400);
  const yoe = y - era * 400;
  const doy = Math.floor((153 * (month > 2 ? month - 3 : month + 9) + 2) / 5) + day - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  return era * 146_097 + doe - 719_468;
}

let cachedYear = 0;
let cachedMonth = 0;
let cachedDay = 0;
let cachedDayMs = 0;

/** Two decimal digits at `i` as a number, or -1. The caller has checked that both characters exist. */
function twoDigits(s: string, i: number): number {
  const a = s.charCodeAt(i) - 48;
  const b = s.charCodeAt(i + 1) - 48;
  return a >= 0 && a <= 9 && b >= 0 && b <= 9 ? a * 10 + b : -1;
}

/**
 * Strict ISO 8601 reader: `YYYY-MM-DD`, optionally `THH:MM[:SS[.fff]]` and `Z` or `±HH[:]MM`.
 * A time without a zone is read as UTC. Returns NaN for anything else (including 2024-02-30).
 * Hand-written because Date.parse accepts impossible days and free text, and is slower.
 */
export function isoToMs(s: string): number {
  if (typeof s !== 'string') return NaN;
  const n = s.length;
  if (n < 10 || s.charCodeAt(4) !== 45 || s.charCodeAt(7) !== 45) return NaN;
  const hi = twoDigits(s, 0);
  const lo = twoDigits(s, 2);
  const month = twoDigits(s, 5);
  const day = twoDigits(s, 8);
  if (hi < 0 || lo < 0) return NaN;
  const year = hi * 100 + lo;
  if (year < ENGINE_MIN_YEAR || year > ENGINE_MAX_YEAR || month < 1 || month > 12) return NaN;
  if (day < 1 || day > daysInMonth(year, month)) return NaN;
  // Consecutive events mostly share a date: reuse the last day computed.
  if (year !== cachedYear || month !== cachedMonth || day !== cachedDay) {
    cachedYear = year;
    cachedMonth = month;
    cachedDay = day;
    cachedDayMs = dayFromCivil(year, month, day) * MS_PER_DAY;
  }
  const dayMs = cachedDayMs;
  if (n === 10) return dayMs;

  const sep = s.charCodeAt(10);
  if ((sep !== 84 && sep !== 116 && sep !== 32) || n < 16 || s.charCodeAt(13) !== 58) return NaN;
  const hour = twoDigits(s, 11);
  const minute = twoDigits(s, 14);
  if (hour < 0 || hour > 23 || minute < 0 || minute > 59) return NaN;
  let i = 16;
  let second = 0;
  let millis = 0;
  if (i + 3 <= n && s.charCodeAt(i) === 58) {
    second = twoDigits(s, i + 1);
    if (second < 0 || second > 59) return NaN;
    i += 3;
    if (i < n && (s.charCodeAt(i) === 46 || s.charCodeAt(i) === 44)) {
      i++;
      const start = i;
      let scale = 100;
      while (i < n) {
        const d = s.charCodeAt(i) - 48;
        if (!(d >= 0 && d <= 9)) break;
        millis += d * scale;
        scale /= 10;
        i++;
      }
      if (i === start) return NaN;
    }
  }
  let offsetMinutes = 0;
  if (i < n) {
    const c = s.charCodeAt(i);
    if (c === 90 || c === 122) {
      i++;
    } else if ((c === 43 || c === 45) && i + 5 <= n) {
      const oh = twoDigits(s, i + 1);
      let om: number;
      if (s.charCodeAt(i + 3) === 58 && i + 6 <= n) {
        om = twoDigits(s, i + 4);
        i += 6;
      } else {
        om = twoDigits(s, i + 3);
        i += 5;
      }
      if (oh < 0 || oh > 23 || om < 0 || om > 59) return NaN;
      offsetMinutes = (c === 43 ? 1 : -1) * (oh * 60 + om);
    } else {
      return NaN;
    }
  }
  if (i !== n) return NaN;
  return dayMs + ((hour * 60 + minute - offsetMinutes) * 60 + second) * 1000 + Math.floor(millis);
}

export function isDateOnly(s: string): boolean {
  return s.length === 10;
}

/** Parses an ISO date or timestamp, or throws a DomainError naming the field. */
export function parseIso(value: unknown, field: string, what: string): number {
  const ms = typeof value === 'string' ? isoToMs(value) : NaN;
  if (Number.isNaN(ms)) {
    const shown = typeof value === 'string' ? `"${value}"` : String(value);
    throw new DomainError(
      `${what} is not a valid date: ${shown}. Use a calendar date such as 2024-05-01 or a timestamp such as 2024-05-01T14:30:00Z.`,
      field,
    );
  }
  return ms;
}

/** "As of" a calendar date means the end of that day, so the day's own events count. */
export function parseAsOf(value: unknown, field = 'asOf'): number {
  const ms = parseIso(value, field, 'The "as of" date');
  return typeof value === 'string' && isDateOnly(value) ? ms + MS_PER_DAY - 1 : ms;
}

export function dayOf(ms: number): number {
  return Math.floor(ms / MS_PER_DAY);
}

/** Civil date of a day number (proleptic Gregorian, after H. Hinnant's days-to-civil algorithm). */
export function civilFromDay(dayNumber: number): { year: number; month: number; day: number } {
  const z = dayNumber + 719_468;
  const era = Math.floor(z / 146_097);
  const doe = z - era * 146_097;
  const yoe = Math.floor((doe - Math.floor(doe / 1460) + Math.floor(doe / 36_524) - Math.floor(doe / 146_096)) / 365);
  const doy = doe - (365 * yoe + Math.floor(yoe / 4) - Math.floor(yoe / 100));
  const mp = Math.floor((5 * doy + 2) / 153);
  const day = doy - Math.floor((153 * mp + 2) / 5) + 1;
  const month = mp < 10 ? mp + 3 : mp - 9;
  return { year: yoe + era * 400 + (month <= 2 ? 1 : 0), month, day };
}

function pad2(n: number): string {
  return n < 10 ? `0${n}` : String(n);
}

/** `YYYY-MM-DD` of the UTC day of an ISO string already known to be valid, without recomputing it when the
 * string is a date or a UTC timestamp. */
export function isoDateOf(at: string, dayNumber: number): string {
  const n = at.length;
  if (n === 10) return at;
  const last = at.charCodeAt(n - 1);
  return last === 90 || last === 122 ? at.slice(0, 10) : isoDate(dayNumber);
}

/** `YYYY-MM-DD` of a day number. */
export function isoDate(dayNumber: number): string {
  const c = civilFromDay(dayNumber);
  return `${c.year}-${pad2(c.month)}-${pad2(c.day)}`;
}

/** `YYYY-MM` of a day number. */
export function isoMonth(dayNumber: number): string {
  const { year, month } = civilFromDay(dayNumber);
  return `${year}-${pad2(month)}`;
}

export function yearOfDay(dayNumber: number): number {
  return civilFromDay(dayNumber).year;
}

/** Adds calendar months; the day is clamped to the month's end (31 Jan + 1 month = 28/29 Feb). */
export function addMonthsToDay(dayNumber: number, months: number): number {
  const { year, month, day } = civilFromDay(dayNumber);
  const total = year * 12 + (month - 1) + months;
  const y = Math.floor(total / 12);
  const m = total - y * 12 + 1;
  return dayFromCivil(y, m, Math.min(day, daysInMonth(y, m)));
}
