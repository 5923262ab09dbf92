import { EngineError } from '../errors';
import type { BudgetDocument } from '../types';
import { cholesky } from './cholesky';

/** Inputs sampled jointly: their indices in doc.inputs, correlation matrix and its Cholesky factor. */
export interface CorrelationGroup {
  indices: number[];
  symbols: string[];
  matrix: number[][];
  factor: number[][];
}

/**
 * The groups of inputs linked by non-zero correlations (connected components), each with its
 * correlation matrix and Cholesky factor, for joint normal sampling (JCGM 101:2008 §6.4.8).
 * Checks, each refused with a message naming the inputs:
 * - an unknown symbol, or the same pair given twice with different r → INVALID_DOCUMENT;
 * - a non-zero correlation with a non-normal input → INVALID_DISTRIBUTION (DESIGN.md);
 * - |r| > 1, or a matrix that is not positive definite → NOT_POSITIVE_DEFINITE.
 * Correlations with r = 0 are ignored.
 */
export function correlationGroups(doc: Pick<BudgetDocument, 'inputs' | 'correlations'>): CorrelationGroup[] {
  const index = new Map(doc.inputs.map((input, i) => [input.symbol, i]));
  const pairs = new Map<string, number>();
  const parent = doc.inputs.map((_, i) => i);
  const find = (i: number): number => (parent[i] === i ? i : (parent[i] = find(parent[i])));
  for (const c of doc.correlations ?? []) {
    const [s1, s2] = c.between;
    const i = index.get(s1), j = index.get(s2);
    if (i === undefined || j === undefined) throw new EngineError('INVALID_DOCUMENT', `correlation names "${i === undefined ? s1 : s2}", which is not an input`);
    if (i === j) throw new EngineError('INVALID_DOCUMENT', `a correlation needs two different inputs ("${s1}")`);
    if (typeof c.r !== 'number' || !Number.isFinite(c.r) || c.r < -1 || c.r > 1) {
      throw new EngineError('NOT_POSITIVE_DEFINITE', `correlation between "${s1}" and "${s2}" is ${String(c.r)}; it must lie between −1 and 1`);
    }
    const key = i < j ? `${i},${j}` : `${j},${i}`;
    const prev = pairs.get(key);
    if (prev !== undefined && prev !== c.r) throw new EngineError('INVALID_DOCUMENT', `correlation between "${s1}" and "${s2}" is given twice (${prev} and ${c.r})`);
    pairs.set(key, c.r);
    if (c.r === 0) continue;
    for (const [k, s] of [[i, s1], [j, s2]] as const) {
      if (doc.inputs[k].distribution.type !== 'normal') {
        throw new EngineError('INVALID_DISTRIBUTION', `correlation with "${s}" is refused: correlations are allowed between normal inputs only (JCGM 101 §6.4.8)`);
      }
    }
    parent[find(i)] = find(j);
  }
  const members = new Map<number, number[]>();
  for (const key of pairs.keys()) {
    if (pairs.get(key) === 0) continue;
    for (const k of key.split(',').map(Number)) {
      const root = find(k);
      const list = members.get(root) ?? [];
      if (!list.includes(k)) list.push(k);
      members.set(root, list);
    }
  }
  const groups: CorrelationGroup[] = [];
  for (const list of members.values()) {
    const indices = list.sort((a, b) => a - b);
    const matrix = indices.map((i) => indices.map((j) => (i === j ? 1 : pairs.get(i < j ? `${i},${j}` : `${j},${i}`) ?? 0)));
    const factor = cholesky(matrix);
    const symbols = indices.map((i) => doc.inputs[i].symbol);
    if (!factor) {
      throw new EngineError(
        'NOT_POSITIVE_DEFINITE',
        `the correlation matrix of ${symbols.map((s) => `"${s}"`).join(', ')} is not positive definite (a correlation of ±1 or an inconsistent set of correlations); revise the correlations or combine fully correlated inputs into one`,
      );
    }
    groups.push({ indices, symbols, matrix, factor });
  }
  return groups.sort((a, b) => a.indices[0] - b.indices[0]);
}
