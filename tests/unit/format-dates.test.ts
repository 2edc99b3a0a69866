import { describe, expect, it } from 'vitest';
import { fmtDateTimeInZone, fmtDayInZone, fmtIsoDay } from '../../shared/format-dates';

describe('the shared day and time formatters (mails, exports, screens)', () => {
  it('writes a calendar day the way the screens do', () => {
    expect(fmtIsoDay('2026-03-04')).toBe('4 Mar 2026');
    expect(fmtIsoDay('2026-12-31T23:59:00Z')).toBe('31 Dec 2026');
    expect(fmtIsoDay(null)).toBe('—');
  });

  it('shows the wall-clock time in the site’s zone with its offset, UTC without a zone', () => {
    // Source: IANA time zone database — Asia/Singapore UTC+8 all year; America/New_York UTC−4 under summer time.
    expect(fmtDateTimeInZone('2026-03-12T06:05:00Z', 'Asia/Singapore')).toBe('12 Mar 2026, 14:05 UTC+8');
    expect(fmtDateTimeInZone(new Date('2026-07-01T12:00:00Z'), 'America/New_York')).toBe('1 Jul 2026, 08:00 UTC-4');
    expect(fmtDateTimeInZone('2026-03-12T06:05:00Z', null)).toBe('12 Mar 2026, 06:05 UTC');
  });

  it('names the day a moment fell on at the site', () => {
    expect(fmtDayInZone('2026-03-12T20:00:00Z', 'Asia/Singapore')).toBe('13 Mar 2026');
    expect(fmtDayInZone('2026-03-12T20:00:00Z', null)).toBe('12 Mar 2026');
  });
});
