import { nextStandardNormal as nextNormalImported, type RandomSource } from './standard-normal';

const nextStandardNormal = nextNormalImported; // module-local: fast per-trial calls under every loader

/**
 * One Gamma(shape k, scale 1) variate by Marsaglia & Tsang (ACM Trans. Math. Softw. 26(3) (2000)
 * 363–372): for k ≥ 1, d = k − 1/3, c = 1/√(9d); repeat z ~ N(0,1), v = (1 + cz)³ until v > 0 and
 * (u < 1 − 0.0331 z⁴ or ln u < z²/2 + d(1 − v + ln v)), u ~ U(0,1); return d·v.
 * For k < 1: Gamma(k) = Gamma(k + 1)·u^{1/k} (same paper, §6). JCGM 101 §6.4.11 (gamma).
 */
export function sampleGamma(rng: RandomSource, shape: number): number {
  if (shape < 1) return sampleGamma(rng, shape + 1) * Math.pow(rng.next(), 1 / shape);
  const d = shape - 1 / 3;
  const c = 1 / Math.sqrt(9 * d);
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
}
