// Expected strings follow ISO 80000-1:2022 §7.3 (digit groups, powers of ten) and the
// SI Brochure, 9th ed. (2019) §5.4.4 (thin-space groups; a single digit is not isolated).
import { describe, expect, it } from 'vitest';
import { formatNumber, GROUP_SEPARATOR as S, groupDigits, MINUS, powerOfTen, superscript } from '../../../shared/format';

describe('groupDigits (SI Brochure §5.4.4)', () => {
  it('groups the integer part in threes with U+202F when it has five or more digits', () => {
    expect(groupDigits('50000838')).toBe(`50${S}000${S}838`);
    expect(groupDigits('12345.678')).toBe(`12${S}345.678`);
  });
  it('leaves four-digit integers alone', () => {
    expect(groupDigits('1234')).toBe('1234');
    expect(groupDigits('1234.5678')).toBe('1234.5678');
  });
  it('uses the narrow no-break space, never a comma', () => {
    expect(S).toBe('\u202F');
    expect(groupDigits('1000000')).not.toContain(',');
  });
});

describe('powers of ten (ISO 80000-1 §7.3.2)', () => {
  it('writes exponents as superscripts with U+207B for minus', () => {
    expect(superscript(-3)).toBe('⁻³');
    expect(powerOfTen(-12)).toBe('10⁻¹²');
    expect(powerOfTen(6)).toBe('10⁶');
  });
});

describe('formatNumber', () => {
  it('prints plain decimals without binary noise', () => {
    expect(formatNumber(773.15)).toBe('773.15');
    expect(formatNumber(0.1 + 0.2)).toBe('0.3');
  });
  it('uses U+2212 for negative values', () => {
    expect(formatNumber(-273.15)).toBe(`${MINUS}273.15`);
  });
  it('does not print a negative zero', () => {
    expect(formatNumber(-0.0001, { decimals: 2, notation: 'fixed' })).toBe('0.00');
  });
  it('rounds to significant digits', () => {
    expect(formatNumber(0.012345, { digits: 2 })).toBe('0.012');
    expect(formatNumber(12345.6, { digits: 3 })).toBe(`12${S}300`);
  });
  it('rounds to fixed decimals', () => {
    expect(formatNumber(773.2149, { decimals: 2 })).toBe('773.21');
  });
  it('switches to × 10ⁿ for very small and very large values, never e notation', () => {
    expect(formatNumber(0.000123, { digits: 2 })).toBe('1.2 × 10⁻⁴');
    expect(formatNumber(6.02214076e23, { digits: 4 })).toBe('6.022 × 10²³');
    expect(formatNumber(1.4388e-2)).toBe('0.014388');
    expect(formatNumber(5e-7)).toBe('5 × 10⁻⁷');
    expect(formatNumber(5e-7)).not.toMatch(/e/);
  });
  it('carries a rounded mantissa of 10 into the exponent', () => {
    expect(formatNumber(9.99e-5, { digits: 2 })).toBe('1.0 × 10⁻⁴');
  });
  it('keeps fixed notation when asked', () => {
    expect(formatNumber(50000838, { notation: 'fixed' })).toBe(`50${S}000${S}838`);
  });
  it('shows special values plainly', () => {
    expect(formatNumber(Number.NaN)).toBe('—');
    expect(formatNumber(Infinity)).toBe('∞');
    expect(formatNumber(-Infinity)).toBe(`${MINUS}∞`);
    expect(formatNumber(0)).toBe('0');
  });
});
