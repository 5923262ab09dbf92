/**
 * Reporting (GUM 7.2.6; EA-4/02 M:2013 §5, value recalled from memory; ILAC-P14): U to two
 * significant digits, rounded up when normal rounding would lower it by more than 5 %, the
 * value to the same decimal place, k to two decimals.
 */
import { describe, expect, it } from 'vitest';
import { reportResult, roundUncertainty, formatAtPlace } from '../../../../shared/engine/rounding/report';

describe('roundUncertainty', () => {
  it('EA-4/02 S2: U = 58.52 mg is reported as 59 mg (value recalled from EA-4/02 S2, recomputed independently)', () => {
    expect(roundUncertainty(0.058524).text).toBe('0.059');
  });

  it('rounds normally to two significant digits (common practice, no source)', () => {
    expect(roundUncertainty(0.1234).text).toBe('0.12');
    expect(roundUncertainty(1.25).text).toBe('1.3');
    expect(roundUncertainty(92.48).text).toBe('92');
    expect(roundUncertainty(1234).text).toBe('1200');
    expect(roundUncertainty(0.00999).text).toBe('0.010');
    expect(roundUncertainty(9.96).text).toBe('10');
    expect(roundUncertainty(1).text).toBe('1.0');
  });

  it('EA-4/02 5 % rule: with one significant digit, rounding that lowers U by more than 5 % rounds up', () => {
    // 1.4 → 1 lowers by 29 % → 2; 1.04 → 1 lowers by 3.8 % → 1; 0.26 → 0.3 raises → 0.3; 0.34 → 0.3 (−12 %) → 0.4.
    expect(roundUncertainty(1.4, 1)).toMatchObject({ text: '2', roundedUp: true });
    expect(roundUncertainty(1.04, 1)).toMatchObject({ text: '1', roundedUp: false });
    expect(roundUncertainty(0.26, 1)).toMatchObject({ text: '0.3', roundedUp: false });
    expect(roundUncertainty(0.34, 1)).toMatchObject({ text: '0.4', roundedUp: true });
  });

  it('with two digits normal rounding never lowers U by more than 5 % (worst case 10.5 → 10, −4.8 %)', () => {
    expect(roundUncertainty(10.49)).toMatchObject({ text: '10', roundedUp: false });
  });
});

describe('reportResult', () => {
  it('EA-4/02 S2: m = 10 000.025 g ± 0.059 g, k = 2.00 (recalled from EA-4/02 S2, recomputed independently)', () => {
    expect(reportResult(10000.025, 0.058524, 2.0000024, 'g')).toEqual({ value: '10000.025', U: '0.059', unit: 'g', k: '2.00' });
  });
  it('rounds the value to the decimal place of U (GUM 7.2.6)', () => {
    expect(reportResult(50000838.3, 92.6, 2.92, 'nm')).toEqual({ value: '50000838', U: '93', unit: 'nm', k: '2.92' });
    expect(reportResult(1234.5678, 1234, 2, 'K').value).toBe('1200');
    expect(reportResult(-0.0004, 0.021, 2, 'K').value).toBe('0.000');
  });
  it('gives U = "0" and a six-digit value when U is zero', () => {
    expect(reportResult(1.23456789, 0, 2, '')).toEqual({ value: '1.23457', U: '0', unit: '', k: '2.00' });
  });
  it('formatAtPlace', () => {
    expect(formatAtPlace(0.21049, -2)).toBe('0.21');
  });
});
