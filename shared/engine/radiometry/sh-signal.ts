import { c2 as C2_SI } from './constants';

const c2 = C2_SI; // module-local copy (fast in hot loops under every loader)

/**
 * Sakuma–Hattori equation, Planck form (CCT-WG5 recommendation for interpolating radiation
 * thermometer calibrations; Saunders & White, Metrologia 40 (2003) 195–203 give the family):
 *   S(T) = C / (exp(c2/(A T + B)) − 1),
 * exact 2019 SI c2; A / m, B / (m K), C in the unit of the signal S.
 *
 * Numerics: `expm1`; for x = c2/(AT + B) > 700 the result underflows to 0 rather than C/∞.
 * Special cases: A·T + B ≤ 0 or a NaN argument → NaN.
 *
 * @example sh_signal(1000, 9e-7, 6e-9, 1e9)
 */
export function sh_signal(T: number, A: number, B: number, C: number): number {
  const d = A * T + B;
  if (!(d > 0) || Number.isNaN(C)) return NaN;
  const x = c2 / d;
  if (x > 700) return C * Math.exp(-x);
  return C / Math.expm1(x);
}
