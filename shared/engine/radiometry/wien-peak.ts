import { c2 } from './constants';

/**
 * x_W: the root of 5(1 − e^{−x}) = x (the maximum of x⁵/(eˣ − 1)), by Newton's method from x = 5;
 * x_W ≈ 4.965 114 231 744 276.
 */
function wienRoot(): number {
  let x = 5;
  for (let i = 0; i < 50; i++) {
    const e = Math.exp(-x);
    const f = 5 * (1 - e) - x;
    const df = 5 * e - 1;
    const step = f / df;
    x -= step;
    if (Math.abs(step) < 1e-16 * x) break;
  }
  return x;
}

/** Wien displacement constant (wavelength form) b = c2/x_W / (m K) ≈ 2.897 771 955e-3 (exact SI c2). */
export const WIEN_B = c2 / wienRoot();

/**
 * Wien's displacement law: wavelength of the maximum of L_λ at temperature T, λ_max = b/T in m,
 * b = c2/x_W with 5(1 − e^{−x_W}) = x_W (exact 2019 SI c2).
 * Special cases: T ≤ 0 or NaN → NaN.
 *
 * @param T thermodynamic temperature / K
 * @example wien_peak(5772) // ≈ 5.0204e-7 m
 */
export function wien_peak(T: number): number {
  if (!(T > 0)) return NaN;
  return WIEN_B / T;
}
