/**
 * Coverage factors: GUM Table G.2 at p = 95.45 % (values recalled from JCGM 100:2008 Table G.2,
 * recomputed independently with scipy t.ppf — ../shared/reference/README.md §4), cross-checked
 * against jstat (npm reference library) for every ν = 1…100; ν = 10^9 and ∞ give 2.000.
 */
import { describe, expect, it } from 'vitest';
import jstat from 'jstat';

const { jStat } = jstat;
import { coverageFactor, truncateDof } from '../../../../shared/engine/gum/coverage-factor';

const TABLE_G2: Array<[number, number, number]> = [
  // ν, k, decimals printed
  [1, 13.97, 2], [2, 4.53, 2], [3, 3.31, 2], [4, 2.87, 2], [5, 2.65, 2], [6, 2.52, 2], [7, 2.43, 2], [8, 2.37, 2], [9, 2.32, 2], [10, 2.28, 2],
  [20, 2.13, 2], [30, 2.09, 2], [50, 2.05, 2], [100, 2.025, 3],
];

describe('coverageFactor', () => {
  for (const [nu, k, dp] of TABLE_G2) {
    it(`t_95.45(${nu}) = ${k} (GUM Table G.2, recalled from memory, recomputed independently)`, () => {
      expect(Math.abs(coverageFactor(0.9545, nu) - k)).toBeLessThanOrEqual(0.5 * 10 ** -dp + 1e-12);
    });
  }

  it('agrees with jstat studentt.inv for ν = 1…100 at 95.45 %', () => {
    for (let nu = 1; nu <= 100; nu++) expect(coverageFactor(0.9545, nu)).toBeCloseTo(jStat.studentt.inv(0.97725, nu), 10);
  });

  it('ν = 10^9 and ∞ give k = 2.000 at 95.45 % (normal quantile; README §4, STACK-NOTES #10)', () => {
    expect(coverageFactor(0.9545, 1e9).toFixed(3)).toBe('2.000');
    expect(coverageFactor(0.9545, Infinity).toFixed(3)).toBe('2.000');
    expect(coverageFactor(0.9545, 'infinite').toFixed(3)).toBe('2.000');
    expect(coverageFactor(0.9545, null).toFixed(3)).toBe('2.000');
  });

  it('99.73 % with ν = 1 is 235.80 with the exact 3σ probability (README §4, recomputed independently)', () => {
    const p3 = jStat.normal.cdf(3, 0, 1) - jStat.normal.cdf(-3, 0, 1);
    expect(coverageFactor(p3, 1)).toBeCloseTo(235.8, 1);
  });

  it('95 % with ν = ∞ is 1.96 (GUM Table G.2, recalled from memory)', () => {
    expect(coverageFactor(0.95, Infinity)).toBeCloseTo(1.959964, 6);
  });
});

describe('truncateDof (GUM G.4.1)', () => {
  it('truncates, with a round-off guard: 20.9999999 is 21', () => {
    expect(truncateDof(16.75)).toBe(16);
    expect(truncateDof(20.9999999)).toBe(21);
    expect(truncateDof(21.0000001)).toBe(21);
    expect(truncateDof(20.99)).toBe(20);
    expect(truncateDof(0.4)).toBe(1);
  });
});
