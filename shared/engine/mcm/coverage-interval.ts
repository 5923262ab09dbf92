import { selectInPlace } from './select-in-place';
import { float64From, type McmWorkspace } from './workspace';

/** q = pM when pM is a whole number, else ⌊pM + ½⌋ (JCGM 101:2008 §7.7.1); both are ⌊pM + ½⌋. */
export function coverageCount(p: number, M: number): number {
  return Math.min(M, Math.floor(p * M + 0.5));
}

/** Below this many values the tails are found by selection alone (sampling would not pay). */
const SAMPLED_TAILS_MIN = 1 << 14;
/** Values in the strided sample that places the tail thresholds. */
const SAMPLE_SIZE = 1 << 13;

/**
 * The K smallest and the K largest of a[0, M), each sorted ascending, or null when the sampled
 * thresholds missed (then the caller selects instead). Floyd & Rivest's idea (Comm. ACM 18(3)
 * 1975, "Expected time bounds for selection"): order a sample of SAMPLE_SIZE values taken at a
 * fixed stride, take as thresholds its quantiles at K/M widened by six binomial standard
 * deviations plus 16 ranks, copy in one pass the values at or beyond each threshold, check that
 * each copy holds at least K values, and sort only the copies. The result is the exact order
 * statistics whatever the sample: a miss is detected by the count and never returns wrong ranks.
 */
function sampledTails(a: Float64Array, M: number, K: number, workspace?: McmWorkspace): { low: Float64Array; high: Float64Array } | null {
  const s = SAMPLE_SIZE, stride = M / s;
  const sample = new Float64Array(s);
  for (let j = 0; j < s; j++) sample[j] = a[Math.floor(j * stride)];
  sample.sort();
  const f = K / M;
  const margin = Math.ceil(6 * Math.sqrt(f * (1 - f) * s)) + 16;
  const jLo = Math.min(s - 1, Math.ceil(f * s) + margin);
  const jHi = Math.max(0, s - 1 - jLo);
  const tLo = sample[jLo], tHi = sample[jHi];
  if (!(tLo < tHi)) return null;
  // Each copy is expected to hold ≈ (jLo + 1)/s·M values; room for twice that before giving up.
  const cap = Math.min(M, Math.ceil((2 * (jLo + 1) * M) / s) + 64);
  const low = float64From(workspace, 'low tail', cap), high = float64From(workspace, 'high tail', cap);
  let nl = 0, nh = 0;
  for (let i = 0; i < M; i++) {
    const v = a[i];
    if (v <= tLo) {
      if (nl === cap) return null;
      low[nl++] = v;
    } else if (v >= tHi) {
      if (nh === cap) return null;
      high[nh++] = v;
    }
  }
  if (nl < K || nh < K) return null;
  const l = low.subarray(0, nl).sort(), h = high.subarray(0, nh).sort();
  return { low: l.subarray(0, K), high: h.subarray(nh - K) };
}

/**
 * Coverage interval for probability p from M model values (JCGM 101:2008 §7.7), exact order
 * statistics y_(1) ≤ … ≤ y_(M) with 1-based ranks:
 * - probabilistically symmetric (§7.7.1): [y_(r), y_(r+q)], r = (M − q)/2 if M − q is even,
 *   else (M − q + 1)/2;
 * - shortest (§7.7.2): [y_(r*), y_(r*+q)] with r* minimising y_(r+q) − y_(r), r = 1 … M − q.
 *
 * Only the ranks the rule can use are ordered: the K = M − q smallest values (ranks 1 … K) and
 * the K largest (ranks q + 1 … M), each a fraction ≈ 1 − p of the values; the middle is never
 * ordered. For large M they are found by sampled thresholds and one copying pass (sampledTails),
 * leaving `a` as it was; otherwise, or when the thresholds miss, two selections reorder `a` in
 * place (its multiset of values is unchanged). When q = M the interval is [min, max]. The tail
 * copies come from `workspace` when one is given (./workspace.ts).
 */
export function coverageInterval(a: Float64Array, M: number, p: number, kind: 'shortest' | 'symmetric', workspace?: McmWorkspace): [number, number] {
  const q = coverageCount(p, M);
  const K = M - q; // number of admissible r
  if (K < 1) {
    let lo = Infinity, hi = -Infinity;
    for (let i = 0; i < M; i++) { const v = a[i]; if (v < lo) lo = v; if (v > hi) hi = v; }
    return [lo, hi];
  }
  // low[i] = y_(i+1) and high[i] = y_(q+i+1), i = 0 … K − 1.
  let low: Float64Array, high: Float64Array;
  const tails = M >= SAMPLED_TAILS_MIN && 4 * K < M ? sampledTails(a, M, K, workspace) : null;
  if (tails) ({ low, high } = tails);
  else if (K >= q) {
    a.subarray(0, M).sort();
    low = a.subarray(0, K);
    high = a.subarray(q, M);
  } else {
    selectInPlace(a, K - 1, 0, M - 1);
    selectInPlace(a, q, K, M - 1);
    low = a.subarray(0, K).sort();
    high = a.subarray(q, M).sort();
  }
  if (kind === 'symmetric') {
    const r = (K % 2 === 0 ? K / 2 : (K + 1) / 2);
    return [low[r - 1], high[r - 1]];
  }
  let best = 0, width = Infinity;
  for (let i = 0; i < K; i++) {
    const w = high[i] - low[i];
    if (w < width) { width = w; best = i; }
  }
  return [low[best], high[best]];
}
