/** Dates on screen: ISO 8601-1:2019 §5.2.2 (calendar date YYYY-MM-DD) and §5.3.3 (UTC time of day). */
import { describe, expect, it } from 'vitest';
import { formatDate, formatDateTimeUtc } from '../../../shared/format';

describe('formatDate and formatDateTimeUtc', () => {
  it('writes the calendar date and the UTC time whatever the browser locale', () => {
    expect(formatDate('2026-12-02T23:59:59.000Z')).toBe('2026-12-02');
    expect(formatDateTimeUtc('2026-12-02T15:14:34.512Z')).toBe('2026-12-02 15:14 UTC');
    expect(formatDateTimeUtc('2026-12-02T15:14:34.512Z', { seconds: true })).toBe('2026-12-02 15:14:34 UTC');
    expect(formatDateTimeUtc('2026-12-02T16:14:34+01:00')).toBe('2026-12-02 15:14 UTC');
  });

  it('shows a dash when there is no date, and an unreadable one as given', () => {
    expect(formatDate(null)).toBe('—');
    expect(formatDateTimeUtc(undefined)).toBe('—');
    expect(formatDateTimeUtc('soon')).toBe('soon');
  });
});
