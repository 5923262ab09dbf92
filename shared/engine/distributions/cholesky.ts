/**
 * Cholesky factor of a symmetric matrix: R = L Lᵀ with L lower triangular (Golub & Van Loan,
 * Matrix Computations, 4th ed., Algorithm 4.2.1). Returns null when R is not (numerically)
 * positive definite: a pivot ≤ 1e-12 (R is a correlation matrix, unit diagonal, so the threshold is
 * relative). Rows are returned as arrays; R is not modified.
 */
export function cholesky(R: readonly (readonly number[])[]): number[][] | null {
  const m = R.length;
  const L = Array.from({ length: m }, () => new Array<number>(m).fill(0));
  for (let j = 0; j < m; j++) {
    let s = R[j][j];
    for (let k = 0; k < j; k++) s -= L[j][k] * L[j][k];
    if (!(s > 1e-12)) return null;
    const ljj = Math.sqrt(s);
    L[j][j] = ljj;
    for (let i = j + 1; i < m; i++) {
      let t = R[i][j];
      for (let k = 0; k < j; k++) t -= L[i][k] * L[j][k];
      L[i][j] = t / ljj;
    }
  }
  return L;
}
