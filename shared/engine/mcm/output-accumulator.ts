import type { Histogram } from '../types';
import { coverageCount, coverageInterval } from './coverage-interval';
import { selectInPlace } from './select-in-place';
import { float64From, type McmWorkspace } from './workspace';

/** Model values kept exactly: 2^20 = 1 048 576 doubles (8 MiB), so 10^6 trials are exact. */
export const EXACT_CAPACITY = 1 << 20;
/** Bins of the fine histogram used beyond EXACT_CAPACITY trials (Uint32 counts, 4 MiB). */
export const FINE_BINS = 1 << 20;
/** Bins of the plot histogram in the result. */
export const PLOT_BINS = 120;

export interface Summary {
  count: number;
  y: number;
  u: number;
  interval: [number, number];
  histogram: Histogram;
  /** 'exact' when every value was kept; else the fine-histogram bin width (interval resolution). */
  resolution: 'exact' | number;
}

/**
 * Collects the Monte Carlo model values with bounded memory.
 *
 * Mean and standard deviation are exact for any M: each chunk's mean and sum of squared
 * deviations are taken in two passes and merged with the pairwise update of Chan, Golub &
 * LeVeque (Am. Stat. 37 (1983) 242–247); u = √(M2/(M − 1)) (JCGM 101:2008 §7.6).
 *
 * Coverage interval: the first EXACT_CAPACITY values are kept and, while M ≤ EXACT_CAPACITY, the
 * interval uses exact order statistics (JCGM 101 §7.7, see coverageInterval). Beyond that the
 * kept values seed a fine histogram of FINE_BINS equal bins over [Q(τ) − W/4, Q(1 − τ) + W/4],
 * where Q are quantiles of the kept values, τ = min(10⁻⁴, (1 − p)/20) and W = Q(1 − τ) − Q(τ);
 * the kept values are then released and every later value is counted into its bin (values outside
 * the range are counted below/above it). Order statistics are then read from the cumulative counts
 * with linear interpolation inside a bin, so each interval end is within one bin width
 * (≈ 1.5·W/2^20, for a normal output ≈ 1e-5·u) of the exact order statistic — far below the Monte
 * Carlo scatter of an interval end (≈ 0.01·u at 10^6 trials). A rank falling outside the range
 * (only for coverage probabilities beyond 1 − 2τ) is given the smallest or largest value seen.
 * Memory: at most 8 MiB of kept values + 4 MiB of bins (+ 8 MiB of cumulative counts at the end),
 * whatever M.
 */
export class OutputAccumulator {
  count = 0;
  private mean = 0;
  private m2 = 0;
  private min = Infinity;
  private max = -Infinity;
  private kept: Float64Array | null;
  private bins: Uint32Array | null = null;
  private lo = 0;
  private width = 0;
  private below = 0;
  private above = 0;

  /**
   * @param expected the expected number of values (sizes the first buffer; it grows to the cap).
   * @param workspace buffers kept between runs (./workspace.ts); without one, new ones.
   */
  constructor(expected: number, private readonly p: number, private readonly workspace?: McmWorkspace) {
    this.kept = float64From(workspace, 'kept', Math.max(1, Math.min(EXACT_CAPACITY, expected)));
  }

  add(x: Float64Array, n: number): void {
    if (n <= 0) return;
    let s = 0, mn = this.min, mx = this.max;
    for (let i = 0; i < n; i++) {
      const v = x[i];
      s += v;
      if (v < mn) mn = v;
      if (v > mx) mx = v;
    }
    this.min = mn;
    this.max = mx;
    const mc = s / n;
    let m2c = 0;
    for (let i = 0; i < n; i++) { const d = x[i] - mc; m2c += d * d; }
    const total = this.count + n;
    const delta = mc - this.mean;
    this.mean += (delta * n) / total;
    this.m2 += m2c + (delta * delta * this.count * n) / total;

    if (this.kept) {
      // Keep values up to the capacity; the chunk that crosses it is split.
      const take = Math.min(n, EXACT_CAPACITY - this.count);
      if (this.kept.length < this.count + take) {
        // From a workspace this may be the same memory as `kept`: set() then copies onto itself.
        const grown = float64From(this.workspace, 'kept', Math.min(EXACT_CAPACITY, Math.max(2 * this.kept.length, this.count + take)));
        grown.set(this.kept.subarray(0, this.count));
        this.kept = grown;
      }
      this.kept.set(x.subarray(0, take), this.count);
      this.count += take;
      if (take === n) return;
      this.startHistogram();
      this.bin(x.subarray(take), n - take);
    } else this.bin(x, n);
    this.count = total;
  }

  private startHistogram(): void {
    const kept = this.kept as Float64Array, M = this.count;
    const tau = Math.min(1e-4, (1 - this.p) / 20);
    const kLo = Math.max(0, Math.floor(tau * M)), kHi = Math.min(M - 1, Math.ceil((1 - tau) * M) - 1);
    selectInPlace(kept, kLo, 0, M - 1);
    selectInPlace(kept, kHi, kLo, M - 1);
    const qLo = kept[kLo], qHi = kept[kHi];
    let W = qHi - qLo;
    if (!(W > 0)) W = Math.max(Math.abs(qLo) * 1e-6, 1e-300);
    this.lo = qLo - W / 4;
    this.width = (1.5 * W) / FINE_BINS;
    this.bins = this.workspace ? this.workspace.uint32Zeroed('bins', FINE_BINS) : new Uint32Array(FINE_BINS);
    this.bin(kept, M);
    this.kept = null;
  }

  private bin(x: Float64Array, n: number): void {
    const bins = this.bins as Uint32Array, lo = this.lo, inv = 1 / this.width, nb = FINE_BINS;
    let below = 0, above = 0;
    for (let i = 0; i < n; i++) {
      const b = Math.floor((x[i] - lo) * inv);
      if (b < 0) below++;
      else if (b >= nb) above++;
      else bins[b]++;
    }
    this.below += below;
    this.above += above;
  }

  /** Mean and standard deviation of all values so far (cheap; no ordering). */
  summaryMoments(): { y: number; u: number } {
    return { y: this.mean, u: this.count > 1 ? Math.sqrt(this.m2 / (this.count - 1)) : 0 };
  }

  /** y, u, coverage interval (JCGM 101 §7.6–7.7) and plot histogram of all values so far. */
  summary(kind: 'shortest' | 'symmetric'): Summary {
    const M = this.count;
    const y = this.mean;
    const u = M > 1 ? Math.sqrt(this.m2 / (M - 1)) : 0;
    if (this.kept) {
      const a = this.kept.subarray(0, M);
      const interval = coverageInterval(a, M, this.p, kind, this.workspace);
      return { count: M, y, u, interval, histogram: plotHistogram(interval, M, (edges, counts) => countValues(a, M, edges, counts)), resolution: 'exact' };
    }
    const interval = this.histogramInterval(kind);
    return { count: M, y, u, interval, histogram: plotHistogram(interval, M, (edges, counts) => this.countBins(edges, counts)), resolution: this.width };
  }

  private histogramInterval(kind: 'shortest' | 'symmetric'): [number, number] {
    const M = this.count, bins = this.bins as Uint32Array, nb = FINE_BINS;
    const q = coverageCount(this.p, M), K = M - q;
    if (K < 1) return [this.min, this.max];
    // cum[b] = number of values below bin b (including those below the range).
    const cum = float64From(this.workspace, 'cumulative counts', nb + 1);
    cum[0] = this.below;
    for (let b = 0; b < nb; b++) cum[b + 1] = cum[b] + bins[b];
    const lo = this.lo, w = this.width, below = this.below, inRange = cum[nb];
    /** Value of rank k (1-based), linear within its bin. */
    const rank = (k: number): number => {
      if (k <= below) return this.min;
      if (k > inRange) return this.max;
      let a = 0, b = nb; // find the bin with cum[bin] < k ≤ cum[bin + 1]
      while (b - a > 1) { const m = (a + b) >>> 1; if (cum[m] < k) a = m; else b = m; }
      return lo + w * (a + (k - cum[a] - 0.5) / bins[a]);
    };
    if (kind === 'symmetric') {
      const r = K % 2 === 0 ? K / 2 : (K + 1) / 2;
      return [rank(r), rank(r + q)];
    }
    // The interpolated rank function is piecewise linear between bin boundaries, so the shortest
    // width is attained where r or r + q starts a bin: try every such r.
    let best: [number, number] = [rank(1), rank(1 + q)];
    const tryR = (r: number) => {
      if (r < 1 || r > K) return;
      const l = rank(r), h = rank(r + q);
      if (h - l < best[1] - best[0]) best = [l, h];
    };
    for (let b = 0; b < nb; b++) {
      if (bins[b] === 0) continue;
      tryR(cum[b] + 1);
      tryR(cum[b] + 1 - q);
    }
    return best;
  }

  private countBins(edges: number[], counts: number[]): void {
    const bins = this.bins as Uint32Array, n = counts.length, lo = edges[0], bw = (edges[n] - lo) / n;
    for (let b = 0; b < FINE_BINS; b++) {
      if (bins[b] === 0) continue;
      const centre = this.lo + (b + 0.5) * this.width;
      const k = Math.floor((centre - lo) / bw);
      if (k >= 0 && k < n) counts[k] += bins[b];
    }
  }
}

function countValues(a: Float64Array, M: number, edges: number[], counts: number[]): void {
  const n = counts.length, lo = edges[0], inv = n / (edges[n] - lo);
  for (let i = 0; i < M; i++) {
    const k = Math.floor((a[i] - lo) * inv);
    if (k >= 0 && k < n) counts[k]++;
  }
}

/**
 * Plot histogram: PLOT_BINS equal bins over the coverage interval widened by a quarter of its
 * width on each side (≈ ±3u for a normal output at p = 95.45 %); values outside are not counted.
 * A zero-width interval (constant output) gives one bin [y, y] holding every value.
 */
function plotHistogram(interval: [number, number], M: number, fill: (edges: number[], counts: number[]) => void): Histogram {
  const [l, h] = interval;
  const W = h - l;
  if (!(W > 0)) return { edges: [l, h], counts: [M] };
  const lo = l - W / 4, hi = h + W / 4, n = PLOT_BINS;
  const edges = Array.from({ length: n + 1 }, (_, i) => (i === n ? hi : lo + ((hi - lo) * i) / n));
  const counts = new Array<number>(n).fill(0);
  fill(edges, counts);
  return { edges, counts };
}
