/** Certificate wording helpers (server/pdf/format.ts). */
import { describe, expect, it } from 'vitest';
import { dateRange, dof, longDate, plusMinus, printReported } from '../../../server/pdf/format';

describe('certificate formatting', () => {
  it('prints reported strings with U+2212 and digit groups from five digits (SI Brochure §5.4.4)', () => {
    expect(printReported('-0.28')).toBe('\u22120.28');
    expect(printReported('12345.6')).toBe('12\u202F345.6');
    expect(printReported('1234.5')).toBe('1234.5');
  });

  it('writes y ± U with the unit once, after a space (GUM 7.2.4, SI Brochure §5.4.3)', () => {
    expect(plusMinus('0.28', '0.22', 'K')).toBe('0.28 ± 0.22\u00A0K');
    expect(plusMinus('5.32', '0.11', 'W m-2 sr-1 nm-1')).toBe('5.32 ± 0.11\u00A0W m⁻² sr⁻¹ nm⁻¹');
  });

  it('writes dates unambiguously and calibration ranges compactly', () => {
    expect(longDate('2026-11-24')).toBe('24 November 2026');
    expect(dateRange('2026-11-19', '2026-11-20')).toBe('19 to 20 November 2026');
    expect(dateRange('2026-11-30', '2026-12-02')).toBe('30 November to 2 December 2026');
    expect(dateRange('2026-12-31', '2027-01-02')).toBe('31 December 2026 to 2 January 2027');
    expect(dateRange('2026-11-19')).toBe('19 November 2026');
  });

  it('degrees of freedom: integers (GUM G.4.1 truncation) or ∞', () => {
    expect(dof(450.4)).toBe('450');
    expect(dof(20.9999999999)).toBe('21');
    expect(dof('infinite')).toBe('∞');
    expect(dof(null)).toBe('n/a');
  });
});
