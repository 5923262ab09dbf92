import type { CorrelationGroup } from './correlation-groups';
import { nextStandardNormal, type RandomSource } from './standard-normal';

/** Fills the columns of a group of jointly normal inputs. */
export interface GroupSampler {
  fill(rng: RandomSource, columns: Float64Array[], n: number): void;
}

/**
 * Jointly normal sampling of correlated inputs (JCGM 101:2008 §6.4.8): with R = L Lᵀ the Cholesky
 * factor of the correlation matrix and z ~ N(0, I), x_i = μ_i + σ_i Σ_{j≤i} L_ij z_j has means μ,
 * standard deviations σ and correlation matrix R. `columns[k]` belongs to the k-th member of the
 * group (means[k], sds[k]). The z of one trial are drawn together, trial after trial, so the
 * stream is consumed in trial order and any split of the trials into chunks gives the same values.
 */
export function createCorrelatedNormalSampler(group: CorrelationGroup, means: number[], sds: number[]): GroupSampler {
  const L = group.factor.map((row) => Float64Array.from(row));
  const m = L.length;
  const z = new Float64Array(m);
  return {
    fill(rng, columns, n) {
      for (let t = 0; t < n; t++) {
        for (let k = 0; k < m; k++) z[k] = nextStandardNormal(rng);
        for (let i = 0; i < m; i++) {
          const row = L[i];
          let s = 0;
          for (let j = 0; j <= i; j++) s += row[j] * z[j];
          columns[i][t] = means[i] + sds[i] * s;
        }
      }
    },
  };
}
