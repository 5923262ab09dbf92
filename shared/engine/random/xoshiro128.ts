import type { UniformSource } from '../types';

const TWO_POW_26 = 67_108_864;
const TWO_POW_28 = 268_435_456;
const TWO_POW_M52 = 2 ** -52;
/** Jump polynomial for 2^64 steps (Blackman & Vigna, xoshiro128starstar.c). */
const JUMP = [0x8764000b, 0xf542d2d3, 0x6fa035c3, 0x77f2db5b] as const;

/**
 * Ziggurat tables for N(0,1), 128 layers (Marsaglia & Tsang, J. Stat. Softw. 5(8) 2000): with
 * f(x) = exp(−x²/2), r = 3.442 619 855 899 and layer area v = 9.912 563 035 262 17e-3,
 * X[1] = r, X[i+1] = f⁻¹(f(X[i]) + v/X[i]), X[128] = 0, and X[0] = v/f(r) the width of the base
 * strip whose part beyond r is the tail. F[i] = f(X[i]).
 */
const ZIG_R = 3.442619855899;
const ZIG_V = 9.91256303526217e-3;
const ZX = new Float64Array(129);
const ZF = new Float64Array(129);
ZX[0] = ZIG_V / Math.exp(-0.5 * ZIG_R * ZIG_R);
ZX[1] = ZIG_R;
for (let i = 1; i < 127; i++) ZX[i + 1] = Math.sqrt(-2 * Math.log(ZIG_V / ZX[i] + Math.exp(-0.5 * ZX[i] * ZX[i])));
ZX[128] = 0;
for (let i = 0; i <= 128; i++) ZF[i] = Math.exp(-0.5 * ZX[i] * ZX[i]);

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
 * Normal variates: the ziggurat method of Marsaglia & Tsang (J. Stat. Softw. 5(8) 2000), 128
 * layers, with the layer index and sign taken from bits of the first 32-bit output that are not
 * reused for the abscissa (the correction of Doornik 2005, "An improved ziggurat method to
 * generate normal random samples"): word a gives layer i = a & 127 and the sign (bit 7); a ≫ 8
 * and b ≫ 4 give a 52-bit u ∈ (0,1); x = u·X[i] is accepted at once when x < X[i+1] (≈ 98.8 %),
 * else by the wedge test F[i] + u′(F[i+1] − F[i]) < f(x), or, in the base layer, from the tail
 * beyond r by Marsaglia's (1964) exponential method. JCGM 101:2008 §C.4 gives Box–Muller; the
 * ziggurat samples the same N(0,1) exactly, with no trigonometric or logarithm call on the fast
 * path. Each variate consumes the stream in order (no cached spare), so any chunking gives the
 * same values. */
export class Xoshiro128StarStar implements UniformSource {
  private s0: number;
  private s1: number;
  private s2: number;
  private s3: number;

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

  /** One N(0,1) variate (ziggurat; see the class comment). */
  nextNormal(): number {
    for (;;) {
      const a = this.nextUint32();
      const b = this.nextUint32();
      const i = a & 127;
      const x = ((a >>> 8) * TWO_POW_28 + (b >>> 4) + 0.5) * TWO_POW_M52 * ZX[i];
      if (x < ZX[i + 1]) return x * (1 - ((a >>> 6) & 2));
      const z = this.slowNormal(i, x);
      if (z === z) return a & 128 ? -z : z;
    }
  }

  /** Ziggurat outside the fast path: tail (layer 0) or wedge; NaN means "start again". */
  private slowNormal(i: number, x: number): number {
    if (i === 0) {
      let t: number, y: number;
      do {
        t = -Math.log(this.next()) / ZIG_R;
        y = -Math.log(this.next());
      } while (y + y < t * t);
      return ZIG_R + t;
    }
    return ZF[i] + this.next() * (ZF[i + 1] - ZF[i]) < Math.exp(-0.5 * x * x) ? x : NaN;
  }

  /** Fill out[0..n) with N(0,1) variates: the same values as n calls of nextNormal(), faster. */
  fillNormal(out: Float64Array, n: number): void {
    let s0 = this.s0, s1 = this.s1, s2 = this.s2, s3 = this.s3;
    for (let k = 0; k < n; ) {
      let r = Math.imul(s1, 5);
      const a = Math.imul((r << 7) | (r >>> 25), 9) >>> 0;
      let t = s1 << 9;
      s2 ^= s0; s3 ^= s1; s1 ^= s2; s0 ^= s3; s2 ^= t; s3 = (s3 << 11) | (s3 >>> 21);
      r = Math.imul(s1, 5);
      const b = Math.imul((r << 7) | (r >>> 25), 9) >>> 4;
      t = s1 << 9;
      s2 ^= s0; s3 ^= s1; s1 ^= s2; s0 ^= s3; s2 ^= t; s3 = (s3 << 11) | (s3 >>> 21);
      const i = a & 127;
      const x = ((a >>> 8) * TWO_POW_28 + b + 0.5) * TWO_POW_M52 * ZX[i];
      if (x < ZX[i + 1]) {
        out[k++] = x * (1 - ((a >>> 6) & 2));
        continue;
      }
      this.s0 = s0; this.s1 = s1; this.s2 = s2; this.s3 = s3;
      const z = this.slowNormal(i, x);
      s0 = this.s0; s1 = this.s1; s2 = this.s2; s3 = this.s3;
      if (z === z) out[k++] = a & 128 ? -z : z;
    }
    this.s0 = s0; this.s1 = s1; this.s2 = s2; this.s3 = s3;
  }

  /**
   * Advance the stream by 2^64 outputs: the jump function of Blackman & Vigna's reference code
   * (xoshiro128starstar.c, "equivalent to 2^64 calls to next(); it can be used to generate 2^64
   * non-overlapping subsequences for parallel computations"), with its polynomial
   * 0x8764000b, 0xf542d2d3, 0x6fa035c3, 0x77f2db5b. The Monte Carlo engine gives each block of
   * trials its own subsequence this way (../mcm/run-monte-carlo.ts).
   */
  jump(): void {
    let j0 = 0, j1 = 0, j2 = 0, j3 = 0;
    for (let w = 0; w < 4; w++) {
      const word = JUMP[w];
      for (let b = 0; b < 32; b++) {
        if (word & (1 << b)) { j0 ^= this.s0; j1 ^= this.s1; j2 ^= this.s2; j3 ^= this.s3; }
        this.nextUint32();
      }
    }
    this.s0 = j0; this.s1 = j1; this.s2 = j2; this.s3 = j3;
  }

  /** Write the state into `into` at `at` (four 32-bit words), e.g. to hand a stream to a worker thread. */
  saveState(into: Uint32Array, at = 0): void {
    into[at] = this.s0; into[at + 1] = this.s1; into[at + 2] = this.s2; into[at + 3] = this.s3;
  }

  /** Take the state written by saveState. */
  loadState(from: Uint32Array, at = 0): void {
    this.s0 = from[at] | 0; this.s1 = from[at + 1] | 0; this.s2 = from[at + 2] | 0; this.s3 = from[at + 3] | 0;
  }

  /** The current state (for tests and reproducibility records). */
  state(): [number, number, number, number] {
    return [this.s0 >>> 0, this.s1 >>> 0, this.s2 >>> 0, this.s3 >>> 0];
  }
}
