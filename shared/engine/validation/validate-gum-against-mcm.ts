import type { ValidationResult } from '../types';
import { numericalTolerance } from './numerical-tolerance';

/**
 * Validation of the GUM uncertainty framework against the Monte Carlo method (JCGM 101:2008 §8):
 * with δ the numerical tolerance of u(y) for n_dig significant digits (§7.9.2) and the GUM
 * interval y ± U_p,
 *   d_low = |y − U_p − y_low|,  d_high = |y + U_p − y_high|,
 * where [y_low, y_high] is the Monte Carlo coverage interval; the GUM result is validated when
 * both are ≤ δ (§8.2). The GUM interval ends are taken as given (gum.interval = [y − U_p, y + U_p]).
 *
 * Special cases: a non-finite input gives passed = false (never throws).
 *
 * @example validateGumAgainstMcm({ y: 0, u: 2, interval: [-3.92, 3.92] }, { interval: [-3.88, 3.88] }, 2)
 *   // δ = 0.05, d_low = d_high = 0.04, passed
 */
export function validateGumAgainstMcm(
  gum: { y: number; u: number; interval: [number, number] },
  mcm: { interval: [number, number] },
  digits: number,
): ValidationResult {
  const delta = numericalTolerance(gum.u, digits);
  const dLow = Math.abs(gum.interval[0] - mcm.interval[0]);
  const dHigh = Math.abs(gum.interval[1] - mcm.interval[1]);
  const passed = Number.isFinite(delta) && Number.isFinite(dLow) && Number.isFinite(dHigh) && dLow <= delta && dHigh <= delta;
  return { delta, dLow, dHigh, passed };
}
