import { nextStandardNormal as nextNormalImported, type RandomSource } from './standard-normal';

const nextStandardNormal = nextNormalImported; // module-local: fast per-trial calls under every loader

/**
 * A Gamma(shape k, scale 1) variate generator by Marsaglia & Tsang (ACM Trans. Math. Softw. 26(3)
 * (2000) 363–372): for k ≥ 1, d = k − 1/3, c = 1/√(9d); repeat z ~ N(0,1), v = (1 + cz)³ until
 * v > 0 and (u < 1 − 0.0331 z⁴ or ln u < z²/2 + d(1 − v + ln v)), u ~ U(0,1); return d·v.
 * For k < 1: Gamma(k) = Gamma(k + 1)·u^{1/k} (same paper, §6). JCGM 101 §6.4.11 (gamma).
 *
 * d and c are computed once per shape, not once per variate: the Monte Carlo samplers call the
 * returned function once per trial.
 */
export function createGammaSampler(shape: number): (rng: RandomSource) => number {
  if (shape < 1) {
    const boosted = createGammaSampler(shape + 1), inv = 1 / shape;
    return (rng) => boosted(rng) * Math.pow(rng.next(), inv);
  }
  const d = shape - 1 / 3;
  const c = 1 / Math.sqrt(9 * d);
  return (rng) => {
    for (;;) {
      const z = nextStandardNormal(rng);
      let v = 1 + c * z;
      if (v <= 0) continue;
      v = v * v * v;
      const u = rng.next();
      const z2 = z * z;
      if (u < 1 - 0.0331 * z2 * z2) return d * v;
      if (Math.log(u) < 0.5 * z2 + d * (1 - v + Math.log(v))) return d * v;
    }
  };
}
