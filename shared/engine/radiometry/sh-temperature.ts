import { c2 as C2_SI } from './constants';

const c2 = C2_SI; // module-local copy (fast in hot loops under every loader)

/**
 * Inverse of the Sakuma–Hattori equation (Planck form, CCT-WG5):
 *   T = c2 / (A ln(C/S + 1)) − B/A,
 * exact 2019 SI c2. `log1p` keeps precision when C/S is small.
 * Its derivative, for the GUM: dS/dT = S² A c2 exp(c2/(AT+B)) / (C (AT+B)²).
 * Special cases: S ≤ 0, C/S ≤ 0, A = 0 or NaN → NaN.
 *
 * @example sh_temperature(sh_signal(1000, 9e-7, 6e-9, 1e9), 9e-7, 6e-9, 1e9) // ≈ 1000
 */
export function sh_temperature(S: number, A: number, B: number, C: number): number {
  const r = C / S;
  if (!(S > 0) || !(r > 0) || A === 0 || Number.isNaN(A) || Number.isNaN(B)) return NaN;
  return c2 / (A * Math.log1p(r)) - B / A;
}
