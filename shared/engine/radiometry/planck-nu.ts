import { c0 as C0_SI, h as H_SI, kB as KB_SI } from './constants';

// Module-local copies: some loaders (tsx) turn imported bindings into getter calls in hot loops.
const c0 = C0_SI, h = H_SI, kB = KB_SI;

/**
 * Planck's law, spectral radiance per unit frequency:
 *   L_ν(ν, T) = (2hν³/c²) / (exp(hν/(kT)) − 1)   in W m⁻² sr⁻¹ Hz⁻¹,
 * exact 2019 SI h, c, k. L_ν = L_λ λ²/c at ν = c/λ.
 *
 * Numerics as `planck`: `expm1` for small x = hν/(kT), an exp(ln(2h/c²) + 3 ln ν − x) form for
 * x > 50. Special cases: ν ≤ 0, T ≤ 0 or NaN → NaN.
 *
 * @param nu frequency / Hz
 * @param T thermodynamic temperature / K
 * @example planck_nu(299792458 / 1e-6, 1000) // ≈ 2.241705e-13 W m⁻² sr⁻¹ Hz⁻¹
 */
export function planck_nu(nu: number, T: number): number {
  if (!(nu > 0) || !(T > 0)) return NaN;
  const x = (h * nu) / (kB * T);
  if (x > 50) return Math.exp(Math.log((2 * h) / (c0 * c0)) + 3 * Math.log(nu) - x) / -Math.expm1(-x);
  return ((2 * h * nu * nu * nu) / (c0 * c0)) / Math.expm1(x);
}
