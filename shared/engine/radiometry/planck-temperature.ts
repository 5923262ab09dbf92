import { c1L as C1L_SI, c2 as C2_SI } from './constants';

// Module-local copies: some loaders (tsx) turn imported bindings into getter calls in hot loops.
const c1L = C1L_SI, c2 = C2_SI;

/**
 * Radiance temperature: the inverse of Planck's law in T,
 *   T = c2 / (λ ln(1 + c1L/(λ⁵ L)))   in K,
 * exact 2019 SI c1L and c2 (inverting CIE S 017:2020 17-21-035).
 *
 * Numerics: `log1p` keeps precision when c1L/(λ⁵L) is small (Rayleigh–Jeans region); when the
 * ratio would overflow (tiny L) the logarithm is taken term by term, ln c1L − 5 ln λ − ln L.
 * Special cases: λ ≤ 0, L ≤ 0 or NaN → NaN; L = +∞ → +∞.
 *
 * @param lambda wavelength in vacuum / m
 * @param L spectral radiance / (W m⁻² sr⁻¹ m⁻¹)
 * @example planck_temperature(1e-6, 6.720461e7) // ≈ 1000 K
 */
export function planck_temperature(lambda: number, L: number): number {
  if (!(lambda > 0) || !(L > 0)) return NaN;
  const l2 = lambda * lambda;
  const ratio = c1L / (l2 * l2 * lambda * L);
  const logTerm = Number.isFinite(ratio) && ratio < 1e300 ? Math.log1p(ratio) : Math.log(c1L) - 5 * Math.log(lambda) - Math.log(L);
  return c2 / (lambda * logTerm);
}
