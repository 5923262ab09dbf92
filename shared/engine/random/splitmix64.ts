/**
 * SplitMix64 (Steele, Lea & Flood 2014, "Fast splittable pseudorandom number generators",
 * OOPSLA 2014; the seeding generator recommended by Blackman & Vigna for the xoshiro family).
 *
 * Used only to expand a 32-bit seed into generator states, so BigInt (exact 64-bit arithmetic on
 * every platform) costs nothing in the hot path.
 *
 *   z ← z + 0x9E3779B97F4A7C15;  z ← (z ⊕ (z ≫ 30))·0xBF58476D1CE4E5B9;
 *   z ← (z ⊕ (z ≫ 27))·0x94D049BB133111EB;  return z ⊕ (z ≫ 31)     (all mod 2^64)
 *
 * @example
 * const next = splitMix64(1n); next(); // 64-bit BigInt
 */
const MASK64 = (1n << 64n) - 1n;

export function splitMix64(seed: bigint): () => bigint {
  let state = seed & MASK64;
  return () => {
    state = (state + 0x9e3779b97f4a7c15n) & MASK64;
    let z = state;
    z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & MASK64;
    z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & MASK64;
    return z ^ (z >> 31n);
  };
}
