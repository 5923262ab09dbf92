import { describe, expect, it } from 'vitest';
import { EngineError } from '../../../../shared/engine/errors';
import {
  correlationGroups, createCorrelatedNormalSampler, createSampler, summarizeInput,
} from '../../../../shared/engine/distributions';
import { createRandom, createStreams } from '../../../../shared/engine/random';
import type { Distribution } from '../../../../shared/engine/types';
import type { BudgetInput } from '../../../../shared/schemas/budget.schema';

const N = 1_000_000;

function moments(x: Float64Array) {
  let s = 0;
  for (const v of x) s += v;
  const mean = s / x.length;
  let m2 = 0, m4 = 0;
  for (const v of x) { const d = (v - mean) ** 2; m2 += d; m4 += d * d; }
  return { mean, variance: m2 / (x.length - 1), m4: m4 / x.length };
}

function draw(dist: Distribution, seed = 1, n = N): Float64Array {
  const out = new Float64Array(n);
  createSampler(dist, 'X').fill(createRandom(seed), out, n);
  return out;
}

// Expected mean and variance of each JCGM 101:2008 §6.4 distribution (formulas of §6.4.2–6.4.11,
// as the Monte Carlo samples them; student-t/readings: scale²·ν/(ν − 2), §6.4.9.4).
const readings = [10.1, 10.3, 9.9, 10.0, 10.2, 10.4, 9.8, 10.1, 10.0, 10.2, 10.3, 9.9];
const rMean = readings.reduce((a, b) => a + b) / readings.length;
const rS = Math.sqrt(readings.reduce((a, v) => a + (v - rMean) ** 2, 0) / (readings.length - 1));
const cases: Array<{ name: string; dist: Distribution; mean: number; variance: number; u: number }> = [
  { name: 'normal {mean, sd}', dist: { type: 'normal', mean: 5, sd: 2 }, mean: 5, variance: 4, u: 2 },
  { name: 'normal {mean, expanded, k}', dist: { type: 'normal', mean: -1, expanded: 0.3, k: 2 }, mean: -1, variance: 0.0225, u: 0.15 },
  { name: 'rectangular {min, max}', dist: { type: 'rectangular', min: 1, max: 4 }, mean: 2.5, variance: 9 / 12, u: 3 / Math.sqrt(12) },
  { name: 'rectangular {mean, halfWidth}', dist: { type: 'rectangular', mean: 0, halfWidth: 0.1 }, mean: 0, variance: 0.01 / 3, u: 0.1 / Math.sqrt(3) },
  { name: 'triangular symmetric', dist: { type: 'triangular', min: -1, max: 1 }, mean: 0, variance: 4 / 24, u: 2 / Math.sqrt(24) },
  // Asymmetric triangle: mean (a+b+c)/3, variance (a²+b²+c²−ab−ac−bc)/18 (common practice, no source).
  { name: 'triangular with mode', dist: { type: 'triangular', min: 0, max: 3, mode: 1 }, mean: 4 / 3, variance: (0 + 9 + 1 - 0 - 0 - 3) / 18, u: Math.sqrt(7 / 18) },
  { name: 'arcsine', dist: { type: 'arcsine', min: -2, max: 2 }, mean: 0, variance: 16 / 8, u: 4 / Math.sqrt(8) },
  { name: 'trapezoidal', dist: { type: 'trapezoidal', min: 0, max: 2, beta: 0.4 }, mean: 1, variance: (4 * 1.16) / 24, u: 2 * Math.sqrt(1.16 / 24) },
  { name: 'curvilinear-trapezoid', dist: { type: 'curvilinear-trapezoid', min: -1, max: 1, d: 0.3 }, mean: 0, variance: 4 / 12 + 0.09 / 9, u: Math.sqrt(4 / 12 + 0.09 / 9) },
  { name: 'student-t', dist: { type: 'student-t', mean: 3, scale: 0.5, dof: 10 }, mean: 3, variance: (0.25 * 10) / 8, u: 0.5 },
  { name: 'readings', dist: { type: 'readings', values: readings }, mean: rMean, variance: ((rS * rS) / 12) * (11 / 9), u: rS / Math.sqrt(12) },
  { name: 'exponential', dist: { type: 'exponential', mean: 2 }, mean: 2, variance: 4, u: 2 },
  { name: 'gamma shape ≥ 1', dist: { type: 'gamma', shape: 3, scale: 0.5 }, mean: 1.5, variance: 0.75, u: Math.sqrt(0.75) },
  { name: 'gamma shape < 1', dist: { type: 'gamma', shape: 0.5, scale: 2 }, mean: 1, variance: 2, u: Math.sqrt(2) },
];

describe('samplers: sample mean and variance against the JCGM 101 §6.4 values', () => {
  it.each(cases)('$name', ({ dist, mean, variance }) => {
    const x = draw(dist);
    const m = moments(x);
    // 5 standard errors: se(mean) = σ/√N, se(s²) = √((μ4 − σ⁴)/N) (common practice, no source).
    expect(Math.abs(m.mean - mean)).toBeLessThan(5 * Math.sqrt(variance / N));
    expect(Math.abs(m.variance - variance)).toBeLessThan(5 * Math.sqrt(Math.max(m.m4 - variance * variance, 1e-300) / N) + 1e-15);
  });

  it('keeps draws inside the support of bounded distributions', () => {
    const bounded: Array<[Distribution, number, number]> = [
      [{ type: 'rectangular', min: 1, max: 4 }, 1, 4],
      [{ type: 'triangular', min: 0, max: 3, mode: 3 }, 0, 3],
      [{ type: 'arcsine', min: -2, max: 2 }, -2, 2],
      [{ type: 'trapezoidal', min: 0, max: 2, beta: 0 }, 0, 2],
      [{ type: 'curvilinear-trapezoid', min: -1, max: 1, d: 0.3 }, -1.3, 1.3],
      [{ type: 'exponential', mean: 1 }, 0, Infinity],
    ];
    for (const [dist, lo, hi] of bounded) {
      const x = draw(dist, 2, 100_000);
      expect(Math.min(...x)).toBeGreaterThanOrEqual(lo);
      expect(Math.max(...x)).toBeLessThanOrEqual(hi);
    }
  });

  it('a constant and zero-scale readings fill the value', () => {
    expect(Array.from(draw({ type: 'constant', value: 7 }, 1, 5))).toEqual([7, 7, 7, 7, 7]);
    expect(Array.from(draw({ type: 'readings', values: [2, 2, 2] }, 1, 3))).toEqual([2, 2, 2]);
  });

  it('same seed → same samples; different seeds → different samples', () => {
    for (const { dist } of cases) {
      expect(Array.from(draw(dist, 9, 64))).toEqual(Array.from(draw(dist, 9, 64)));
      expect(Array.from(draw(dist, 9, 64))).not.toEqual(Array.from(draw(dist, 10, 64)));
    }
  });

  it('filling in chunks gives the same stream as one fill (chunk size does not change results)', () => {
    for (const { dist } of cases) {
      const whole = draw(dist, 4, 1000);
      const rng = createRandom(4);
      const s = createSampler(dist, 'X');
      const part = new Float64Array(1000), tmp = new Float64Array(300);
      for (let done = 0; done < 1000; done += 300) {
        const n = Math.min(300, 1000 - done);
        s.fill(rng, tmp, n);
        part.set(tmp.subarray(0, n), done);
      }
      // Exact for one-uniform samplers; rejection samplers (normal spare, gamma) also consume the
      // same sequence, so every sampler must agree.
      expect(Array.from(part)).toEqual(Array.from(whole));
    }
  });
});

describe('summarizeInput (GUM view)', () => {
  const input = (distribution: Distribution, dof?: number | null): BudgetInput => ({ symbol: 'X', distribution, dof });

  it.each(cases)('$name: estimate and standard uncertainty (JCGM 101 §6.4; GUM 4.2, 4.3.7–4.3.9)', ({ dist, mean, u }) => {
    const s = summarizeInput(input(dist));
    expect(s.estimate).toBeCloseTo(mean, 12);
    expect(Math.abs(s.u - u)).toBeLessThan(1e-12 * Math.max(1, u));
  });

  it('degrees of freedom: own dof wins, else readings n − 1, student-t its dof, others ∞ (DESIGN.md)', () => {
    expect(summarizeInput(input({ type: 'normal', mean: 0, sd: 1 })).dof).toBe(Infinity);
    expect(summarizeInput(input({ type: 'normal', mean: 0, sd: 1 }, null)).dof).toBe(Infinity);
    expect(summarizeInput(input({ type: 'normal', mean: 0, sd: 1 }, 50)).dof).toBe(50);
    expect(summarizeInput(input({ type: 'readings', values: readings })).dof).toBe(11);
    expect(summarizeInput(input({ type: 'readings', values: readings }, 30)).dof).toBe(30);
    expect(summarizeInput(input({ type: 'student-t', mean: 0, scale: 1, dof: 7 })).dof).toBe(7);
  });

  it('readings: mean, s/√n (GUM 4.2.1–4.2.3)', () => {
    const s = summarizeInput(input({ type: 'readings', values: [773.4, 773.5, 773.3] }));
    expect(s.estimate).toBeCloseTo(773.4, 10);
    expect(s.u).toBeCloseTo(0.1 / Math.sqrt(3), 10); // s = 0.1 K
    expect(s.dof).toBe(2);
  });

  const refusals: Array<[string, Distribution, string]> = [
    ['negative sd', { type: 'normal', mean: 0, sd: -1 }, 'sd must not be negative'],
    ['min > max', { type: 'rectangular', min: 2, max: 1 }, 'min (2) must be less than max (1)'],
    ['dof ≤ 0', { type: 'student-t', mean: 0, scale: 1, dof: 0 }, 'dof must be greater than zero'],
    ['mode outside', { type: 'triangular', min: 0, max: 1, mode: 2 }, 'mode (2) must lie between'],
    ['beta > 1', { type: 'trapezoidal', min: 0, max: 1, beta: 1.5 }, 'beta must lie between 0 and 1'],
    ['d too large', { type: 'curvilinear-trapezoid', min: 0, max: 1, d: 0.6 }, 'd must lie between 0'],
    ['non-finite mean', { type: 'normal', mean: NaN, sd: 1 }, 'mean must be a finite number'],
    ['gamma shape 0', { type: 'gamma', shape: 0, scale: 1 }, 'shape must be greater than zero'],
    ['exponential mean ≤ 0', { type: 'exponential', mean: -1 }, 'mean must be greater than zero'],
    ['k = 0', { type: 'normal', mean: 0, expanded: 1, k: 0 }, 'k must be greater than zero'],
    ['unknown type', { type: 'lognormal' } as unknown as Distribution, 'unknown distribution type'],
  ];
  it.each(refusals)('refuses %s with INVALID_DISTRIBUTION and a message', (_n, dist, message) => {
    for (const f of [() => summarizeInput(input(dist)), () => createSampler(dist, 'X')]) {
      expect(f).toThrow(EngineError);
      try { f(); } catch (e) {
        expect((e as EngineError).code).toBe('INVALID_DISTRIBUTION');
        expect((e as EngineError).message).toContain('"X"');
        expect((e as EngineError).message).toContain(message);
      }
    }
  });

  it('refuses an own dof ≤ 0 and fewer than two readings', () => {
    expect(() => summarizeInput(input({ type: 'normal', mean: 0, sd: 1 }, 0))).toThrow(/dof must be greater than zero/);
    try { summarizeInput(input({ type: 'readings', values: [1] })); } catch (e) { expect((e as EngineError).code).toBe('TOO_FEW_READINGS'); }
    expect(() => summarizeInput(input({ type: 'readings', values: [1] }))).toThrow(EngineError);
  });
});

describe('correlated normal inputs (JCGM 101 §6.4.8)', () => {
  const normal = (symbol: string, mean: number, sd: number): BudgetInput => ({ symbol, distribution: { type: 'normal', mean, sd } });
  const doc = {
    inputs: [normal('A', 1, 2), { symbol: 'R', distribution: { type: 'rectangular', min: 0, max: 1 } } as BudgetInput, normal('B', -3, 0.5), normal('C', 0, 1), normal('D', 5, 1)],
    correlations: [
      { between: ['A', 'B'] as [string, string], r: 0.5 },
      { between: ['B', 'C'] as [string, string], r: -0.3 },
      { between: ['A', 'C'] as [string, string], r: 0.2 },
      { between: ['D', 'R'] as [string, string], r: 0 },
    ],
  };

  it('groups the linked inputs and reproduces the target correlations, means and sds', () => {
    const groups = correlationGroups(doc);
    expect(groups).toHaveLength(1);
    expect(groups[0].symbols).toEqual(['A', 'B', 'C']);
    const cols = [new Float64Array(N), new Float64Array(N), new Float64Array(N)];
    createCorrelatedNormalSampler(groups[0], [1, -3, 0], [2, 0.5, 1]).fill(createStreams(3, 1)[0], cols, N);
    const m = cols.map(moments);
    expect(Math.abs(m[0].mean - 1)).toBeLessThan(5 * 2 / Math.sqrt(N));
    expect(Math.abs(Math.sqrt(m[1].variance) - 0.5)).toBeLessThan(0.005 * 0.5);
    const corr = (i: number, j: number) => {
      let s = 0;
      for (let t = 0; t < N; t++) s += (cols[i][t] - m[i].mean) * (cols[j][t] - m[j].mean);
      return s / (N - 1) / Math.sqrt(m[i].variance * m[j].variance);
    };
    // Standard error of a sample correlation ≈ (1 − r²)/√N ≈ 0.001 (common practice, no source).
    expect(Math.abs(corr(0, 1) - 0.5)).toBeLessThan(0.005);
    expect(Math.abs(corr(1, 2) + 0.3)).toBeLessThan(0.005);
    expect(Math.abs(corr(0, 2) - 0.2)).toBeLessThan(0.005);
  });

  it('refuses a matrix that is not positive definite, naming the inputs', () => {
    const bad = { ...doc, correlations: [
      { between: ['A', 'B'] as [string, string], r: 0.9 },
      { between: ['A', 'C'] as [string, string], r: 0.9 },
      { between: ['B', 'C'] as [string, string], r: -0.9 },
    ] };
    expect(() => correlationGroups(bad)).toThrow(/"A", "B", "C" is not positive definite/);
    try { correlationGroups(bad); } catch (e) { expect((e as EngineError).code).toBe('NOT_POSITIVE_DEFINITE'); }
    const one = { ...doc, correlations: [{ between: ['A', 'B'] as [string, string], r: 1 }] };
    expect(() => correlationGroups(one)).toThrow(/not positive definite/);
    const big = { ...doc, correlations: [{ between: ['A', 'B'] as [string, string], r: 1.2 }] };
    try { correlationGroups(big); } catch (e) { expect((e as EngineError).code).toBe('NOT_POSITIVE_DEFINITE'); expect((e as EngineError).message).toMatch(/"A" and "B"/); }
    expect(() => correlationGroups(big)).toThrow(EngineError);
  });

  it('refuses a correlation with a non-normal input, an unknown symbol, or a pair given twice', () => {
    expect(() => correlationGroups({ ...doc, correlations: [{ between: ['A', 'R'], r: 0.3 }] })).toThrow(/normal inputs only/);
    expect(() => correlationGroups({ ...doc, correlations: [{ between: ['A', 'Z'], r: 0.3 }] })).toThrow(/"Z", which is not an input/);
    expect(() => correlationGroups({ ...doc, correlations: [{ between: ['A', 'B'], r: 0.3 }, { between: ['B', 'A'], r: 0.4 }] })).toThrow(/given twice/);
  });
});
