import type { CorrelationGroup } from './correlation-groups';
import { fillStandardNormal, type RandomSource } from './standard-normal';

/** Fills the columns of a group of jointly normal inputs. */
export interface GroupSampler {
  fill(rng: RandomSource, columns: Float64Array[], n: number): void;
}

/**
 * Jointly normal sampling of correlated inputs (JCGM 101:2008 §6.4.8): with R = L Lᵀ the Cholesky
 * factor of the correlation matrix and z ~ N(0, I), x_i = μ_i + σ_i Σ_{j≤i} L_ij z_j has means μ,
 * standard deviations σ and correlation matrix R. `columns[k]` belongs to the k-th member of the
 * group (means[k], sds[k]). The transform runs in place, last row first, so the z_j (j < i)
 * a row needs are still untouched.
 */
export function createCorrelatedNormalSampler(group: CorrelationGroup, means: number[], sds: number[]): GroupSampler {
  const L = group.factor.map((row) => Float64Array.from(row));
  const m = L.length;
  return {
    fill(rng, columns, n) {
      for (let k = 0; k < m; k++) fillStandardNormal(rng, columns[k], n);
      for (let i = m - 1; i >= 0; i--) {
        const row = L[i], out = columns[i], mu = means[i], sd = sds[i], lii = row[i];
        for (let t = 0; t < n; t++) {
          let s = lii * out[t];
          for (let j = 0; j < i; j++) s += row[j] * columns[j][t];
          out[t] = mu + sd * s;
        }
      }
    },
  };
}
