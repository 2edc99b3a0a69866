// How Tightloop writes days and times, for the server's mails and exports as for the screens (src/lib/format.ts
// re-exports these): "4 Mar 2026", and a time as read at the site, "4 Mar 2026, 14:05 UTC+8".

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** A calendar day ('2026-03-04', or the day part of a timestamp) as "4 Mar 2026"; a missing day is a dash. */
export function fmtIsoDay(day: string | null | undefined): string {
  const m = day ? /^(\d{4})-(\d{2})-(\d{2})/.exec(day) : null;
  if (!m) return '—';
  return `${Number(m[3])} ${MONTHS[Number(m[2]) - 1]} ${m[1]}`;
}

const zoneFormats = new Map<string, Intl.DateTimeFormat>();
function zoneFormat(timeZone: string | null | undefined): Intl.DateTimeFormat {
  const zone = timeZone ?? 'UTC';
  let f = zoneFormats.get(zone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-GB', {
      timeZone: zone,
      day: 'numeric',
      month: 'short',
      year: 'numeric',
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
      timeZoneName: 'shortOffset',
    });
    zoneFormats.set(zone, f);
  }
  return f;
}

function zoneParts(v: string | Date, timeZone: string | null | undefined) {
  const parts = zoneFormat(timeZone).formatToParts(typeof v === 'string' ? new Date(v) : v);
  const part = (type: Intl.DateTimeFormatPartTypes) => parts.find((p) => p.type === type)?.value ?? '';
  // Engines write the offset as GMT+8 or UTC+8, and a zero offset as GMT, UTC or UTC+0: one form here.
  const offset = part('timeZoneName')
    .replace(/^(GMT|UTC)/, 'UTC')
    .replace(/^UTC[+-]0?$|^$/, 'UTC');
  return { day: `${part('day')} ${part('month')} ${part('year')}`, time: `${part('hour')}:${part('minute')}`, offset };
}

/**
 * A moment as read at a site: its wall-clock time in the site's IANA zone with the offset, e.g.
 * "12 Mar 2026, 14:05 UTC+8" (UTC when the site has no zone).
 */
export function fmtDateTimeInZone(v: string | Date, timeZone: string | null | undefined): string {
  const p = zoneParts(v, timeZone);
  return `${p.day}, ${p.time} ${p.offset}`;
}

/** The calendar day a moment fell on at a site (UTC when the site has no zone): "12 Mar 2026". */
export function fmtDayInZone(v: string | Date, timeZone: string | null | undefined): string {
  return zoneParts(v, timeZone).day;
}
