import { describe, expect, it } from 'vitest';
import { fmtDateTimeInZone } from '../../src/lib/format';

describe('fmtDateTimeInZone', () => {
  it('shows the wall-clock time in the site’s zone with its offset', () => {
    expect(fmtDateTimeInZone('2026-03-12T06:05:00Z', 'Asia/Singapore')).toBe('12 Mar 2026, 14:05 UTC+8');
    expect(fmtDateTimeInZone('2026-07-01T12:00:00Z', 'America/New_York')).toBe('1 Jul 2026, 08:00 UTC-4');
  });

  it('reads UTC for a site without a zone', () => {
    expect(fmtDateTimeInZone('2026-03-12T06:05:00Z', null)).toBe('12 Mar 2026, 06:05 UTC');
  });
});
