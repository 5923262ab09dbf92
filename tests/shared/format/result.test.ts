// Reporting a result: GUM (JCGM 100:2008) §7.2.2/§7.2.4 (value ± U with unit and k),
// §7.2.6 (U to at most two significant digits, the value to the same decimal place);
// EA-4/02 M:2022 §5 (round up when normal rounding lowers U by more than 5 %).
import { describe, expect, it } from 'vitest';
import { formatCondition, formatCoverageProbability, formatResult, formatValueAndU, MINUS, roundUncertainty } from '../../../shared/format';

describe('roundUncertainty', () => {
  it('keeps two significant digits', () => {
    expect(roundUncertainty(0.13567)).toEqual({ value: 0.14, lastDigitExponent: -2 });
    expect(roundUncertainty(1357)).toEqual({ value: 1400, lastDigitExponent: 2 });
  });
  it('carries into a new digit (0.0996 → 0.10)', () => {
    expect(roundUncertainty(0.0996)).toEqual({ value: 0.1, lastDigitExponent: -2 });
  });
  it('rounds up when normal rounding would lower U by more than 5 % (one digit: 0.14 → 0.2)', () => {
    // With one significant digit 0.14 would round to 0.1, i.e. 29 % lower.
    expect(roundUncertainty(0.14, 1).value).toBe(0.2);
    expect(roundUncertainty(0.104, 1).value).toBe(0.1); // 3.8 % lower: normal rounding stays
  });
});

describe('formatCoverageProbability', () => {
  it('says ≈ when the percentage is rounded', () => {
    expect(formatCoverageProbability(0.9545)).toBe('p ≈ 95 %');
    expect(formatCoverageProbability(0.95)).toBe('p = 95 %');
    expect(formatCoverageProbability(0.9973)).toBe('p ≈ 99.7 %');
  });
});

describe('formatResult', () => {
  it('reads y ± U unit (k, p) with the value at the decimal place of U', () => {
    expect(formatResult(773.2149, 0.13567, 'K', 2.05, 0.9545)).toBe('773.21 ± 0.14 K (k = 2.05, p ≈ 95 %)');
  });
  it('prints k to two decimals', () => {
    expect(formatResult(0.21, 0.14, 'K', 2, 0.9545)).toBe('0.21 ± 0.14 K (k = 2.00, p ≈ 95 %)');
  });
  it('uses people’s units and the minus sign', () => {
    expect(formatResult(-0.318, 0.052, 'degC', 2, 0.9545)).toBe(`${MINUS}0.318 ± 0.052 °C (k = 2.00, p ≈ 95 %)`);
  });
  it('rounds the value to the tens or hundreds when U is that coarse', () => {
    expect(formatResult(773215, 1357, 'nm', 2, 0.95)).toBe('773\u202F200 ± 1400 nm (k = 2.00, p = 95 %)');
  });
  it('shares one power of ten for small values', () => {
    expect(formatResult(5.3218e-3 * 1e-3, 0.1164e-3 * 1e-3, 'W m-2 sr-1 nm-1', 2.01, 0.9545)).toBe(
      '(5.32 ± 0.12) × 10⁻⁶ W m⁻² sr⁻¹ nm⁻¹ (k = 2.01, p ≈ 95 %)',
    );
  });
  it('omits the unit of a dimensionless result', () => {
    expect(formatResult(0.953, 0.012, '', 2, 0.9545)).toBe('0.953 ± 0.012 (k = 2.00, p ≈ 95 %)');
  });
});

describe('formatValueAndU (a Monte Carlo interval has no k)', () => {
  // GUM (JCGM 100:2008) 7.2.6: U to at most two significant digits, the value to the same place.
  it('rounds as formatResult does, without the coverage statement', () => {
    expect(formatValueAndU(0.43012, 0.7761, 'K')).toBe('0.43 ± 0.78 K');
    expect(formatResult(0.43012, 0.7761, 'K', 2, 0.9545)).toBe(`${formatValueAndU(0.43012, 0.7761, 'K')} (k = 2.00, p ≈ 95 %)`);
  });
});

describe('formatCondition (environmental conditions on the certificate)', () => {
  // GUM (JCGM 100:2008) 7.2.6 for value and U; SI Brochure (9th ed.) §5.4.3: a space between the
  // number and the unit, also before "%".
  it('states value ± U with the value at the place of U, or the value alone when no U was recorded', () => {
    expect(formatCondition({ value: 23.04, U: 1, unit: '°C' })).toBe('23 ± 1 °C');
    expect(formatCondition({ value: 23.04, U: 0.96, unit: '°C' })).toBe('23.04 ± 0.96 °C');
    expect(formatCondition({ value: 45.2, U: 5, unit: '%' })).toBe('45 ± 5 %');
    expect(formatCondition({ value: 23.1, U: 0, unit: '°C' })).toBe('23.1 °C');
    expect(formatCondition({ value: 23.1, U: 0.5, unit: '°C' }, '\u00A0')).toBe('23.1 ± 0.5\u00A0°C');
  });
});
