/**
 * Coverage factor k for coverage probability p (JCGM 100:2008, GUM G.3, G.4): the Student t
 * quantile t_p(ν) with ν the effective degrees of freedom truncated to an integer (G.4.1),
 * or the normal quantile when ν is infinite or very large (ν > 10^6, where jstat's t quantile
 * loses accuracy — ν = 10^9 gives 1.9956 instead of 2.0000, STACK-NOTES #10; the difference
 * between t_p(10^6) and the normal quantile is below 10^-5).
 */
import jstat from 'jstat';

const { jStat } = jstat;

/** Above this ν the normal quantile is used. */
export const LARGE_DOF = 1e6;

/**
 * Truncate ν to an integer (GUM G.4.1) with a round-off guard: a value within 10^-6 (relative)
 * of an integer is that integer, so a computed 20.9999999 gives 21, not 20. Never below 1.
 */
export function truncateDof(nu: number): number {
  const r = Math.round(nu);
  const t = Math.abs(nu - r) <= 1e-6 * Math.max(1, Math.abs(nu)) ? r : Math.floor(nu);
  return Math.max(1, t);
}

/** k = t_p(ν) for the two-sided coverage probability p. `nu` may be Infinity, 'infinite' or null (normal). */
export function coverageFactor(p: number, nu: number | 'infinite' | null): number {
  const q = (1 + p) / 2;
  if (nu === null || nu === 'infinite' || !Number.isFinite(nu) || nu > LARGE_DOF) return jStat.normal.inv(q, 0, 1);
  return jStat.studentt.inv(q, truncateDof(nu));
}
