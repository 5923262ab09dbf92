import { selectInPlace } from './select-in-place';

/** q = pM when pM is a whole number, else ⌊pM + ½⌋ (JCGM 101:2008 §7.7.1); both are ⌊pM + ½⌋. */
export function coverageCount(p: number, M: number): number {
  return Math.min(M, Math.floor(p * M + 0.5));
}

/**
 * Coverage interval for probability p from M model values (JCGM 101:2008 §7.7), exact order
 * statistics y_(1) ≤ … ≤ y_(M) with 1-based ranks:
 * - probabilistically symmetric (§7.7.1): [y_(r), y_(r+q)], r = (M − q)/2 if M − q is even,
 *   else (M − q + 1)/2;
 * - shortest (§7.7.2): [y_(r*), y_(r*+q)] with r* minimising y_(r+q) − y_(r), r = 1 … M − q.
 *
 * Only the ranks the rule can use are ordered: two selections place the M − q smallest values in
 * a[0, M−q) and the M − q largest in a[q, M), and those two stretches (each a fraction ≈ 1 − p of
 * the array) are sorted; the middle stays unordered. `a` is reordered in place (its multiset of
 * values is unchanged). When q = M the interval is [min, max].
 */
export function coverageInterval(a: Float64Array, M: number, p: number, kind: 'shortest' | 'symmetric'): [number, number] {
  const q = coverageCount(p, M);
  const K = M - q; // number of admissible r
  if (K < 1) {
    let lo = Infinity, hi = -Infinity;
    for (let i = 0; i < M; i++) { const v = a[i]; if (v < lo) lo = v; if (v > hi) hi = v; }
    return [lo, hi];
  }
  if (K >= q) a.subarray(0, M).sort();
  else {
    selectInPlace(a, K - 1, 0, M - 1);
    selectInPlace(a, q, K, M - 1);
    a.subarray(0, K).sort();
    a.subarray(q, M).sort();
  }
  if (kind === 'symmetric') {
    const r = (K % 2 === 0 ? K / 2 : (K + 1) / 2);
    return [a[r - 1], a[r + q - 1]];
  }
  let best = 0, width = Infinity;
  for (let i = 0; i < K; i++) {
    const w = a[i + q] - a[i];
    if (w < width) { width = w; best = i; }
  }
  return [a[best], a[best + q]];
}
