import { splitMix64 } from './splitmix64';
import { Xoshiro128StarStar } from './xoshiro128';

/**
 * `count` independent random streams from one seed: the seed starts a SplitMix64 sequence and each
 * stream's 128-bit xoshiro128** state is taken from two consecutive SplitMix64 outputs (the
 * seeding Blackman & Vigna 2021 recommend). Stream i depends only on (seed, i), so the Monte Carlo
 * engine gives each input its own stream and the samples of one input do not change when another
 * input is added after it, or when the chunk size changes.
 *
 * @param seed a whole number in [0, 2^53) (the budget schema allows [0, 2^32 − 1])
 * @example
 * const [rx, ry] = createStreams(1, 2); rx.next(); // U(0,1)
 */
export function createStreams(seed: number, count: number): Xoshiro128StarStar[] {
  if (!Number.isSafeInteger(seed) || seed < 0) throw new RangeError(`seed must be a whole number ≥ 0, got ${seed}`);
  const next = splitMix64(BigInt(seed));
  const streams: Xoshiro128StarStar[] = [];
  for (let i = 0; i < count; i++) {
    const w0 = next();
    const w1 = next();
    streams.push(
      new Xoshiro128StarStar([
        Number(w0 & 0xffffffffn),
        Number(w0 >> 32n),
        Number(w1 & 0xffffffffn),
        Number(w1 >> 32n),
      ]),
    );
  }
  return streams;
}

/** One stream from a seed (stream 0 of `createStreams`). */
export function createRandom(seed: number): Xoshiro128StarStar {
  return createStreams(seed, 1)[0];
}
