import type { UniformSource } from '../types';

/** A uniform source that may also offer fast normal variates (as Xoshiro128StarStar does). */
export type RandomSource = UniformSource & {
  nextNormal?: () => number;
  fillNormal?: (out: Float64Array, n: number) => void;
};

/**
 * One N(0,1) variate: the source's own normal generator when it has one, else the Marsaglia
 * polar method (Marsaglia & Bray 1964; the rejection form of JCGM 101 §C.4's Box–Muller) on its
 * uniforms, using one variate of each pair.
 */
export function nextStandardNormal(rng: RandomSource): number {
  if (rng.nextNormal) return rng.nextNormal();
  for (;;) {
    const v1 = 2 * rng.next() - 1, v2 = 2 * rng.next() - 1;
    const s = v1 * v1 + v2 * v2;
    if (s < 1 && s > 0) return v1 * Math.sqrt((-2 * Math.log(s)) / s);
  }
}

/** Fill out[0..n) with N(0,1) variates (see nextStandardNormal). */
export function fillStandardNormal(rng: RandomSource, out: Float64Array, n: number): void {
  if (rng.fillNormal) {
    rng.fillNormal(out, n);
    return;
  }
  for (let i = 0; i < n; i++) out[i] = nextStandardNormal(rng);
}
