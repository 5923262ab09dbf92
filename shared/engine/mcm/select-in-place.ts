/**
 * Partial ordering in place (Hoare's FIND, Comm. ACM 4(7) 1961, with median-of-three pivots):
 * afterwards a[k] holds the value of rank k (0-based) within a[lo..hi], every element of
 * a[lo..k) is ≤ a[k] and every element of (k..hi] is ≥ a[k]. Expected O(n); after 2·log2(n)
 * partitions without convergence the remaining range is sorted (O(n log n) worst case).
 */
export function selectInPlace(a: Float64Array, k: number, lo = 0, hi = a.length - 1): void {
  let depth = 2 * Math.ceil(Math.log2(hi - lo + 2));
  while (hi > lo) {
    if (hi - lo < 24) {
      for (let i = lo + 1; i <= hi; i++) {
        const v = a[i];
        let j = i - 1;
        while (j >= lo && a[j] > v) { a[j + 1] = a[j]; j--; }
        a[j + 1] = v;
      }
      return;
    }
    if (depth-- === 0) {
      a.subarray(lo, hi + 1).sort();
      return;
    }
    const mid = (lo + hi) >>> 1;
    let t: number;
    if (a[mid] < a[lo]) { t = a[mid]; a[mid] = a[lo]; a[lo] = t; }
    if (a[hi] < a[lo]) { t = a[hi]; a[hi] = a[lo]; a[lo] = t; }
    if (a[hi] < a[mid]) { t = a[hi]; a[hi] = a[mid]; a[mid] = t; }
    const pivot = a[mid];
    let i = lo, j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) { t = a[i]; a[i] = a[j]; a[j] = t; i++; j--; }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return;
  }
}
