/**
 * Numerical tolerance of a standard uncertainty (JCGM 101:2008 §7.9.2): write u(y) as c × 10^l
 * with c an n_dig-digit integer (u rounded to n_dig significant digits); then δ = ½ × 10^l.
 * Example (§7.9.2): u = 0.002 8 with n_dig = 2 → c = 28, l = −4, δ = 0.000 05.
 *
 * Special cases: u = 0 → δ = 0; u < 0, NaN or ±∞ → NaN.
 *
 * @param u standard uncertainty u(y) > 0
 * @param ndig significant digits regarded as meaningful (1 or 2 typically)
 */
export function numericalTolerance(u: number, ndig: number): number {
  if (u === 0) return 0;
  if (!(u > 0) || !Number.isFinite(u) || !(ndig >= 1)) return NaN;
  let l = Math.floor(Math.log10(u)) - ndig + 1;
  // Guard the decade boundaries against round-off in log10 (and rounding up to 10^ndig).
  if (Math.round(u / 10 ** l) >= 10 ** ndig) l += 1;
  else if (u / 10 ** l < 10 ** (ndig - 1) - 0.5) l -= 1;
  return 0.5 * 10 ** l;
}
