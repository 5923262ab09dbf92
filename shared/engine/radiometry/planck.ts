import { c1L as C1L_SI, c2 as C2_SI } from './constants';

// Module-local copies: some loaders (tsx) turn imported bindings into getter calls in hot loops.
const c1L = C1L_SI, c2 = C2_SI;

/**
 * Planck's law, spectral radiance per unit wavelength in vacuum:
 *   L_λ(λ, T) = c1L λ⁻⁵ / (exp(c2/(λT)) − 1)   in W m⁻² sr⁻¹ m⁻¹,
 * with c1L = 2hc² and c2 = hc/k from the exact 2019 SI constants (Planck 1901; CIE S 017:2020
 * 17-21-035; IEC 60050-845).
 *
 * Numerics: x = c2/(λT); the denominator uses `expm1` so that small x (long wavelength, Rayleigh–
 * Jeans region) keeps full precision; for x > 50 the form exp(ln c1L − 5 ln λ − x) is used, which
 * neither overflows nor produces ∞/∞, and underflows to 0 for very large x.
 *
 * Special cases: λ ≤ 0, T ≤ 0 or a NaN argument → NaN (outside the law's domain; the Monte Carlo
 * and GUM code then report NON_FINITE). T = +∞ → +∞.
 *
 * @param lambda wavelength in vacuum / m
 * @param T thermodynamic temperature / K
 * @example planck(1e-6, 1000) // ≈ 6.720461e7 W m⁻² sr⁻¹ m⁻¹
 */
export function planck(lambda: number, T: number): number {
  if (!(lambda > 0) || !(T > 0)) return NaN;
  const x = c2 / (lambda * T);
  if (x > 50) return Math.exp(Math.log(c1L) - 5 * Math.log(lambda) - x) / -Math.expm1(-x);
  const l2 = lambda * lambda;
  return c1L / (l2 * l2 * lambda) / Math.expm1(x);
}
