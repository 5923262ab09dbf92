import type { UniformSource } from '../types';

const TWO_POW_26 = 67_108_864;
const TWO_POW_M52 = 2 ** -52;

/**
 * xoshiro128** 1.1 (Blackman & Vigna, "Scrambled linear pseudorandom number generators",
 * ACM Trans. Math. Softw. 47(4), 2021): 128-bit state, period 2^128 − 1, passes TestU01 BigCrush.
 *
 * Why this generator: JCGM 101:2008 §C.3 asks for a generator of good statistical quality and
 * names the enhanced Wichmann–Hill (2006) and Mersenne Twister generators as suitable. xoshiro128**
 * has the same quality on the standard batteries, a 16-byte state, and only 32-bit integer
 * operations (`Math.imul`, shifts, xor), which JavaScript evaluates exactly, so the same seed gives
 * bit-identical streams in every browser and Node version. Period 2^128 − 1 ≫ the 10^8 × 100
 * draws of the largest run.
 *
 * Uniform variates (open interval, as JCGM 101 §C.3 requires for (0,1) inputs to logarithms):
 *   k = (a ≫ 6)·2^26 + (b ≫ 6)  from two consecutive 32-bit outputs a, b (52 random bits),
 *   u = (k + ½)·2^−52 ∈ [2^−53, 1 − 2^−53]   — never 0 or 1, exactly representable.
 *
 * Normal variates: Marsaglia polar method (Marsaglia & Bray 1964, SIAM Review 6(3) 260–264), the
 * rejection form of the Box–Muller transform of JCGM 101 §C.4: v1, v2 ~ U(−1,1), s = v1² + v2²,
 * accept 0 < s < 1, z1,2 = v1,2·√(−2 ln s / s). No trigonometric call; acceptance π/4.
 */
export class Xoshiro128StarStar implements UniformSource {
  private s0: number;
  private s1: number;
  private s2: number;
  private s3: number;
  private spare = 0;
  private hasSpare = false;

  /** Four 32-bit words of state, not all zero (use `createStreams` to seed from a number). */
  constructor(state: readonly [number, number, number, number]) {
    this.s0 = state[0] | 0;
    this.s1 = state[1] | 0;
    this.s2 = state[2] | 0;
    this.s3 = state[3] | 0;
    if ((this.s0 | this.s1 | this.s2 | this.s3) === 0) this.s0 = 1;
  }

  /** Next 32-bit output as an unsigned integer in [0, 2^32). */
  nextUint32(): number {
    const s1 = this.s1;
    const r = Math.imul(s1, 5);
    const result = Math.imul((r << 7) | (r >>> 25), 9) >>> 0;
    const t = s1 << 9;
    this.s2 ^= this.s0;
    this.s3 ^= s1;
    this.s1 ^= this.s2;
    this.s0 ^= this.s3;
    this.s2 ^= t;
    this.s3 = (this.s3 << 11) | (this.s3 >>> 21);
    return result;
  }

  /** One U(0,1) variate, never 0 or 1. */
  next(): number {
    const a = this.nextUint32() >>> 6;
    const b = this.nextUint32() >>> 6;
    return (a * TWO_POW_26 + b + 0.5) * TWO_POW_M52;
  }

  /** Fill out[0..n) with U(0,1) variates; the same values `next()` would give, faster. */
  fill(out: Float64Array, n: number): void {
    let s0 = this.s0, s1 = this.s1, s2 = this.s2, s3 = this.s3;
    for (let i = 0; i < n; i++) {
      let r = Math.imul(s1, 5);
      const a = Math.imul((r << 7) | (r >>> 25), 9) >>> 6;
      let t = s1 << 9;
      s2 ^= s0; s3 ^= s1; s1 ^= s2; s0 ^= s3; s2 ^= t; s3 = (s3 << 11) | (s3 >>> 21);
      r = Math.imul(s1, 5);
      const b = Math.imul((r << 7) | (r >>> 25), 9) >>> 6;
      t = s1 << 9;
      s2 ^= s0; s3 ^= s1; s1 ^= s2; s0 ^= s3; s2 ^= t; s3 = (s3 << 11) | (s3 >>> 21);
      out[i] = (a * TWO_POW_26 + b + 0.5) * TWO_POW_M52;
    }
    this.s0 = s0; this.s1 = s1; this.s2 = s2; this.s3 = s3;
  }

  /** One N(0,1) variate (polar method; the second of each pair is kept for the next call). */
  nextNormal(): number {
    if (this.hasSpare) {
      this.hasSpare = false;
      return this.spare;
    }
    for (;;) {
      const v1 = 2 * this.next() - 1;
      const v2 = 2 * this.next() - 1;
      const s = v1 * v1 + v2 * v2;
      if (s < 1 && s > 0) {
        const f = Math.sqrt((-2 * Math.log(s)) / s);
        this.spare = v2 * f;
        this.hasSpare = true;
        return v1 * f;
      }
    }
  }

  /**
   * Fill out[0..n) with N(0,1) variates by the polar method, pairs written directly (a kept spare
   * from `nextNormal` is used first, and an odd tail leaves a spare for the next call).
   */
  fillNormal(out: Float64Array, n: number): void {
    let i = 0;
    if (n > 0 && this.hasSpare) {
      out[i++] = this.spare;
      this.hasSpare = false;
    }
    let s0 = this.s0, s1 = this.s1, s2 = this.s2, s3 = this.s3;
    while (i < n) {
      // Two uniforms on (−1, 1) from four 32-bit outputs, inlined as in fill().
      let r = Math.imul(s1, 5);
      let a = Math.imul((r << 7) | (r >>> 25), 9) >>> 6;
      let t = s1 << 9;
      s2 ^= s0; s3 ^= s1; s1 ^= s2; s0 ^= s3; s2 ^= t; s3 = (s3 << 11) | (s3 >>> 21);
      r = Math.imul(s1, 5);
      let b = Math.imul((r << 7) | (r >>> 25), 9) >>> 6;
      t = s1 << 9;
      s2 ^= s0; s3 ^= s1; s1 ^= s2; s0 ^= s3; s2 ^= t; s3 = (s3 << 11) | (s3 >>> 21);
      const v1 = 2 * ((a * TWO_POW_26 + b + 0.5) * TWO_POW_M52) - 1;
      r = Math.imul(s1, 5);
      a = Math.imul((r << 7) | (r >>> 25), 9) >>> 6;
      t = s1 << 9;
      s2 ^= s0; s3 ^= s1; s1 ^= s2; s0 ^= s3; s2 ^= t; s3 = (s3 << 11) | (s3 >>> 21);
      r = Math.imul(s1, 5);
      b = Math.imul((r << 7) | (r >>> 25), 9) >>> 6;
      t = s1 << 9;
      s2 ^= s0; s3 ^= s1; s1 ^= s2; s0 ^= s3; s2 ^= t; s3 = (s3 << 11) | (s3 >>> 21);
      const v2 = 2 * ((a * TWO_POW_26 + b + 0.5) * TWO_POW_M52) - 1;
      const s = v1 * v1 + v2 * v2;
      if (s >= 1 || s === 0) continue;
      const f = Math.sqrt((-2 * Math.log(s)) / s);
      out[i++] = v1 * f;
      if (i < n) out[i++] = v2 * f;
      else {
        this.spare = v2 * f;
        this.hasSpare = true;
      }
    }
    this.s0 = s0; this.s1 = s1; this.s2 = s2; this.s3 = s3;
  }

  /** The current state (for tests and reproducibility records). */
  state(): [number, number, number, number] {
    return [this.s0 >>> 0, this.s1 >>> 0, this.s2 >>> 0, this.s3 >>> 0];
  }
}
