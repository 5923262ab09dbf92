import { describe, expect, it } from 'vitest';
import { Xoshiro128StarStar, createRandom, createStreams, splitMix64 } from '../../../../shared/engine/random';
import reference from './fixtures/xoshiro-reference.json';
import jstat from 'jstat';

const jStat = jstat as unknown as { normal: { inv(p: number, m: number, s: number): number; cdf(x: number, m: number, s: number): number }; chisquare: { inv(p: number, k: number): number } };

// Reference values: an independent Python implementation of the published algorithms
// (Blackman & Vigna, ACM TOMS 47(4) 2021; Steele, Lea & Flood, OOPSLA 2014), committed as
// fixtures/generate-xoshiro.py → fixtures/xoshiro-reference.json.
describe('xoshiro128**', () => {
  it('reproduces the reference 32-bit outputs for state (1, 2, 3, 4)', () => {
    const g = new Xoshiro128StarStar([1, 2, 3, 4]);
    expect(Array.from({ length: 8 }, () => g.nextUint32())).toEqual(reference.xoshiro128ss_state_1_2_3_4);
  });

  it('maps pairs of outputs to (k + ½)·2^−52 uniforms, next() and fill() alike', () => {
    const a = new Xoshiro128StarStar([1, 2, 3, 4]);
    expect(Array.from({ length: 4 }, () => a.next())).toEqual(reference.uniform_state_1_2_3_4);
    const b = new Xoshiro128StarStar([1, 2, 3, 4]);
    const out = new Float64Array(4);
    b.fill(out, 4);
    expect(Array.from(out)).toEqual(reference.uniform_state_1_2_3_4);
  });

  it('jump() advances the state by 2^64 steps: the state computed independently by squaring the update matrix over GF(2) 64 times', () => {
    const g = new Xoshiro128StarStar([1, 2, 3, 4]);
    g.jump();
    expect(g.state()).toEqual(reference.state_1_2_3_4_after_2_pow_64_steps);
  });

  it('saveState and loadState carry a stream to another generator, which then gives the same numbers', () => {
    const a = createRandom(7);
    a.next();
    const words = new Uint32Array(8);
    a.saveState(words, 4);
    const b = new Xoshiro128StarStar([9, 9, 9, 9]);
    b.loadState(words, 4);
    expect(Array.from({ length: 5 }, () => b.nextNormal())).toEqual(Array.from({ length: 5 }, () => a.nextNormal()));
  });

  it('seeds through SplitMix64 as the reference does', () => {
    const sm = splitMix64(1n);
    expect(Array.from({ length: 4 }, () => sm().toString())).toEqual(reference.splitmix64_seed_1);
    const g = createRandom(1);
    expect(g.state()).toEqual(reference.seed1_stream0_state);
    expect(Array.from({ length: 4 }, () => g.nextUint32())).toEqual(reference.seed1_stream0_outputs);
  });

  it('stays in the open interval (0, 1) and has the moments of U(0,1) (JCGM 101 §6.4.2: mean ½, variance 1/12)', () => {
    const n = 1_000_000;
    const out = new Float64Array(n);
    createRandom(7).fill(out, n);
    let sum = 0, sum2 = 0, min = 1, max = 0;
    for (let i = 0; i < n; i++) {
      const u = out[i];
      sum += u; sum2 += u * u;
      if (u < min) min = u;
      if (u > max) max = u;
    }
    const mean = sum / n;
    const variance = sum2 / n - mean * mean;
    expect(min).toBeGreaterThan(0);
    expect(max).toBeLessThan(1);
    // Standard error of the mean of U(0,1): √(1/12/n) ≈ 2.9e-4; allow 5 standard errors.
    expect(Math.abs(mean - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / n));
    // Standard error of the sample variance: √((1/80 − 1/144)/n) ≈ 7.5e-5.
    expect(Math.abs(variance - 1 / 12)).toBeLessThan(5 * Math.sqrt((1 / 80 - 1 / 144) / n));
  });

  it('passes a chi-square test of uniformity on 100 cells (common practice, no source)', () => {
    const n = 1_000_000, cells = 100;
    const counts = new Float64Array(cells);
    const out = new Float64Array(n);
    createRandom(11).fill(out, n);
    for (let i = 0; i < n; i++) counts[Math.floor(out[i] * cells)]++;
    let chi2 = 0;
    for (const c of counts) chi2 += (c - n / cells) ** 2 / (n / cells);
    // χ²(99) upper 0.1 % point ≈ 148.2 (computed with jStat.chisquare.inv(0.999, 99)).
    expect(chi2).toBeLessThan(148.2);
  });

  it('gives N(0,1) variates (ziggurat) with mean 0, variance 1, kurtosis 3, and nextNormal = fillNormal', () => {
    const n = 1_000_001;
    const out = new Float64Array(n);
    const g = createRandom(3);
    g.fillNormal(out, n);
    let sum = 0, sum2 = 0, sum4 = 0;
    for (let i = 0; i < n; i++) { sum += out[i]; sum2 += out[i] ** 2; sum4 += out[i] ** 4; }
    expect(Math.abs(sum / n)).toBeLessThan(5 / Math.sqrt(n));
    expect(Math.abs(sum2 / n - 1)).toBeLessThan(5 * Math.sqrt(2 / n));
    expect(Math.abs(sum4 / n - 3)).toBeLessThan(5 * Math.sqrt(96 / n)); // E z⁴ = 3, var z⁴ = 96
    // nextNormal and fillNormal draw the same sequence.
    const a = createRandom(5), b = createRandom(5);
    const col = new Float64Array(5);
    a.fillNormal(col, 5);
    expect(Array.from({ length: 5 }, () => b.nextNormal())).toEqual(Array.from(col));
  });

  it('normal variates follow Φ: chi-square over 60 cells of equal probability, and the tails beyond ±3, ±4', () => {
    // Reference distribution function: jStat.normal.inv (jstat, npm); tail probabilities
    // 2Φ(−3) = 0.002 699 8 and Φ(−4) = 3.167e-5 computed with jStat.normal.cdf.
    const n = 2_000_000, cells = 60;
    const out = new Float64Array(n);
    createRandom(17).fillNormal(out, n);
    const cuts = Array.from({ length: cells - 1 }, (_, i) => jStat.normal.inv((i + 1) / cells, 0, 1));
    const counts = new Float64Array(cells);
    let beyond3 = 0, above4 = 0;
    for (let i = 0; i < n; i++) {
      const z = out[i];
      let lo = 0, hi = cells - 1;
      while (lo < hi) { const m = (lo + hi) >> 1; if (z < cuts[m]) hi = m; else lo = m + 1; }
      counts[lo]++;
      if (Math.abs(z) > 3) beyond3++;
      if (z > 4) above4++;
    }
    let chi2 = 0;
    for (const c of counts) chi2 += (c - n / cells) ** 2 / (n / cells);
    expect(chi2).toBeLessThan(jStat.chisquare.inv(0.999, cells - 1));
    const p3 = 2 * jStat.normal.cdf(-3, 0, 1), p4 = jStat.normal.cdf(-4, 0, 1);
    expect(Math.abs(beyond3 / n - p3)).toBeLessThan(5 * Math.sqrt(p3 / n));
    expect(Math.abs(above4 / n - p4)).toBeLessThan(5 * Math.sqrt(p4 / n));
  });

  it('same seed → same stream; different seeds and different streams → different numbers', () => {
    const x = new Float64Array(16), y = new Float64Array(16), z = new Float64Array(16);
    createRandom(42).fill(x, 16);
    createRandom(42).fill(y, 16);
    createRandom(43).fill(z, 16);
    expect(Array.from(x)).toEqual(Array.from(y));
    expect(Array.from(x)).not.toEqual(Array.from(z));
    const [s0, s1] = createStreams(42, 2);
    expect(s0.state()).toEqual(createRandom(42).state());
    expect(s1.state()).not.toEqual(s0.state());
  });

  it('refuses a negative or fractional seed', () => {
    expect(() => createRandom(-1)).toThrow(RangeError);
    expect(() => createRandom(1.5)).toThrow(RangeError);
  });
});
