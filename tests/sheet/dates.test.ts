import { describe, expect, it } from 'vitest';
import { formatDay, formatMinute } from '@/lib/format/dates';

// The one date helper (lib/format/dates.ts): ISO-like text in UTC, as the pages showed it before
// (common practice: ISO 8601 calendar dates and 24-hour times).
describe('dates', () => {
  it('should give the UTC day and minute whatever the offset written', () => {
    expect(formatDay('2026-12-02T03:15:42.123Z')).toBe('2026-12-02');
    expect(formatMinute('2026-12-02T03:15:42.123Z')).toBe('2026-12-02 03:15');
    // 23:30 at UTC−05:00 is 04:30 the next day in UTC.
    expect(formatMinute('2026-12-01T23:30:00-05:00')).toBe('2026-12-02 04:30');
    expect(formatMinute('2026-01-05T00:07:00Z')).toBe('2026-01-05 00:07');
    expect(formatDay(new Date(Date.UTC(2024, 1, 29, 23, 59)))).toBe('2024-02-29');
  });

  it('should give nothing for a missing date and keep an unreadable one as written', () => {
    expect(formatDay(null)).toBe('');
    expect(formatMinute(undefined)).toBe('');
    expect(formatMinute('not a date')).toBe('not a date');
  });
});
