/**
 * Axis ticks shared by the charts on screen and in the certificate (shared/format/ticks.ts).
 * Positions: d3-array's `ticks` (reference library from npm; steps of 1, 2 or 5 × 10ⁿ).
 * Labels: one number of decimals per axis, decimal point, U+2212 for negatives and "× 10ⁿ" for
 * powers of ten (SI Brochure, 9th ed. (2019) §5.4.4; ISO 80000-1:2022 §7.3).
 */
import { ticks as d3Ticks } from 'd3-array';
import { describe, expect, it } from 'vitest';
import { axisTicks } from '../../../shared/format/ticks';

describe('axisTicks', () => {
  it('places ticks where d3-array does and labels them all with the decimals of the step', () => {
    const t = axisTicks(-0.7122, 1.563, 5);
    expect(t.values).toEqual(d3Ticks(-0.7122, 1.563, 5));
    expect(t.values.map(t.label)).toEqual(['−0.5', '0.0', '0.5', '1.0', '1.5']);
  });

  it('uses no decimals for whole-number steps and groups five-digit integers', () => {
    expect(axisTicks(0, 32.8, 6).values.map(axisTicks(0, 32.8, 6).label)).toEqual(['0', '5', '10', '15', '20', '25', '30']);
    const big = axisTicks(10_000, 50_000, 4);
    expect(big.values.map(big.label)).toEqual(['10\u202F000', '20\u202F000', '30\u202F000', '40\u202F000', '50\u202F000']);
  });

  it('writes very small steps as powers of ten with the digits the step needs', () => {
    const t = axisTicks(0, 4e-5, 4);
    expect(t.values).toEqual(d3Ticks(0, 4e-5, 4));
    expect(t.values.map(t.label)).toEqual(['0', '1 × 10⁻⁵', '2 × 10⁻⁵', '3 × 10⁻⁵', '4 × 10⁻⁵']);
  });

  it('never shows a negative zero and copes with an empty range', () => {
    const t = axisTicks(-1, 1, 2);
    expect(t.values.map(t.label)).toEqual(['−1', '0', '1']);
    expect(axisTicks(3, 3).values).toEqual([3]);
    expect(axisTicks(Number.NaN, 1).values).toEqual([]);
  });
});
