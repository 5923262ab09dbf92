import { c2_its90 as C2_ITS90 } from './constants';

const c2_its90 = C2_ITS90; // module-local copy (fast in hot loops under every loader)

/**
 * ITS-90 spectral radiance ratio above the silver point (Preston-Thomas, Metrologia 27 (1990)
 * 3–10, §3.3 eq. 13):
 *   L_λ(T90)/L_λ(T90,X) = [exp(c2/(λ T90,X)) − 1] / [exp(c2/(λ T90)) − 1],  c2 = 0.014 388 m K
 * (the ITS-90 value, not hc/k).
 *
 * Numerics: with x = c2/(λT), x_X = c2/(λT_X) the ratio is evaluated as
 * exp(x_X − x)·(1 − e^{−x_X})/(1 − e^{−x}) with `expm1` for the brackets: exact algebraically,
 * accurate for small x (long wavelengths) and free of ∞/∞ for large x.
 * Special cases: λ ≤ 0, T ≤ 0, T_X ≤ 0 or NaN → NaN.
 *
 * @param lambda wavelength in vacuum / m
 * @param T temperature T90 / K
 * @param TX reference fixed-point temperature T90,X / K (silver, gold or copper point)
 * @example its90_ratio(650e-9, 1500, 1337.33)
 */
export function its90_ratio(lambda: number, T: number, TX: number): number {
  if (!(lambda > 0) || !(T > 0) || !(TX > 0)) return NaN;
  const x = c2_its90 / (lambda * T);
  const xX = c2_its90 / (lambda * TX);
  return (Math.exp(xX - x) * -Math.expm1(-xX)) / -Math.expm1(-x);
}
