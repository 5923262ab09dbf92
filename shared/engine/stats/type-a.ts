/**
 * Type A evaluation from repeated readings (JCGM 100:2008, GUM 4.2): the arithmetic mean q̄
 * (4.2.1), the experimental standard deviation s(q) = sqrt(Σ(q_k − q̄)²/(n − 1)) (4.2.2), the
 * standard uncertainty of the mean u = s(q)/√n (4.2.3) with ν = n − 1 degrees of freedom
 * (G.3.3). The sum of squares is taken about the mean in a second pass (numerically stable).
 *
 * @example typeA([773.4, 773.5, 773.3]) // { n: 3, mean: 773.4, s: 0.1, u: 0.0577…, dof: 2 }
 */
import { EngineError } from '../errors';

export interface TypeAResult {
  n: number;
  mean: number;
  /** Experimental standard deviation of the readings. */
  s: number;
  /** Standard uncertainty of the mean, s/√n. */
  u: number;
  /** Degrees of freedom, n − 1. */
  dof: number;
}

export function typeA(values: readonly number[]): TypeAResult {
  const n = values.length;
  if (n < 2) {
    throw new EngineError('TOO_FEW_READINGS', `a Type A evaluation needs at least two readings; got ${n}`);
  }
  const bad = values.findIndex((v) => typeof v !== 'number' || !Number.isFinite(v));
  if (bad >= 0) throw new EngineError('INVALID_DISTRIBUTION', `reading ${bad + 1} is not a finite number`);
  let sum = 0;
  for (const v of values) sum += v;
  const mean = sum / n;
  let ss = 0;
  let comp = 0;
  for (const v of values) {
    ss += (v - mean) ** 2;
    comp += v - mean;
  }
  // Corrected two-pass algorithm (Chan, Golub & LeVeque, Am. Stat. 37 (1983) 242–247).
  const variance = (ss - (comp * comp) / n) / (n - 1);
  const s = Math.sqrt(Math.max(0, variance));
  return { n, mean, s, u: s / Math.sqrt(n), dof: n - 1 };
}
