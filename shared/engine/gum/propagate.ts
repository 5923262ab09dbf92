/**
 * The GUM law of propagation of uncertainty (JCGM 100:2008, 5.1.2 and 5.2.2) with the full
 * covariance of the inputs, the budget table, Welch–Satterthwaite effective degrees of freedom
 * (G.4.1, eq. G.2b), the coverage factor and interval, and the second-order terms of the
 * note to 5.1.2 for uncorrelated inputs.
 */
import type { BudgetDocument } from '../../schemas/budget.schema';
import { correlationGroups } from '../distributions';
import { EngineError } from '../errors';
import type { CompiledModelDetails } from '../model/compile';
import type { BudgetRow, GumResult, InputSummary } from '../types';
import { coverageFactor } from './coverage-factor';

export interface GumOptions {
  coverage: number;
  /** Compute the second-order terms (uncorrelated inputs only). Default: true up to 50 inputs. */
  secondOrder?: boolean;
}

export interface GumOutcome {
  gum: GumResult;
  warnings: string[];
  /** True when u_c(y) = 0 (all contributions vanish at the estimates). */
  zeroUncertainty: boolean;
}

/** Correlation matrix of the inputs in doc order (identity plus doc.correlations). */
export function correlationMatrix(doc: BudgetDocument): number[][] {
  const index = new Map(doc.inputs.map((input, i) => [input.symbol, i]));
  const n = doc.inputs.length;
  const r: number[][] = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 1 : 0)));
  for (const c of doc.correlations ?? []) {
    const i = index.get(c.between[0]);
    const j = index.get(c.between[1]);
    if (i === undefined || j === undefined) continue;
    r[i][j] = c.r;
    r[j][i] = c.r;
  }
  return r;
}

/**
 * Welch–Satterthwaite (GUM G.4.1, eq. G.2b): ν_eff = u_c⁴ / Σ (c_i u_i)⁴ / ν_i, terms with
 * ν_i = ∞ contributing nothing. Returns 'infinite' when every non-zero contribution has ν = ∞
 * (or u_c = 0).
 */
export function welchSatterthwaite(contributions: readonly number[], dofs: readonly number[], uc: number): number | 'infinite' {
  let denom = 0;
  contributions.forEach((ci, i) => {
    if (ci !== 0 && Number.isFinite(dofs[i])) denom += ci ** 4 / dofs[i];
  });
  if (denom === 0 || uc === 0) return 'infinite';
  return uc ** 4 / denom;
}

/**
 * Propagate. `summaries` are the inputs' estimates, standard uncertainties and degrees of freedom
 * (DESIGN.md conventions, ../distributions summarizeInput).
 */
export function propagate(doc: BudgetDocument, model: CompiledModelDetails, summaries: readonly InputSummary[], opts: GumOptions): GumOutcome {
  const warnings: string[] = [];
  const n = summaries.length;
  const x = summaries.map((s) => s.estimate);
  const u = summaries.map((s) => s.u);
  const y = model.scalar(x);
  const { c, method } = model.sensitivities(x, u);
  const r = correlationMatrix(doc);
  const correlated = (doc.correlations ?? []).some((k) => k.r !== 0);
  // The same checks as Monte Carlo sampling (unknown symbols, non-normal inputs, a correlation
  // matrix that is not positive definite), so the live GUM budget refuses what MCM would.
  if (correlated) correlationGroups(doc);

  // u_c² = Σ_i Σ_j c_i c_j r_ij u_i u_j (GUM eq. 13 / eq. 16).
  let uc2 = 0;
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) uc2 += c[i] * c[j] * r[i][j] * u[i] * u[j];
  if (uc2 < -1e-12 * Math.max(...c.map((ci, i) => (ci * u[i]) ** 2), 0)) {
    throw new EngineError('NOT_POSITIVE_DEFINITE', 'the correlations given make the combined variance negative: the correlation matrix is not positive semi-definite', { path: ['correlations'] });
  }
  const uc = Math.sqrt(Math.max(0, uc2));
  if (!Number.isFinite(uc)) throw new EngineError('NON_FINITE', 'the combined standard uncertainty is not finite (a sensitivity coefficient or a standard uncertainty is too large)');

  const contribution = c.map((ci, i) => Math.abs(ci * u[i]));
  const sumSq = contribution.reduce((s, v) => s + v * v, 0);
  const budget: BudgetRow[] = doc.inputs.map((input, i) => ({
    symbol: input.symbol,
    estimate: x[i],
    u: u[i],
    distribution: input.distribution.type,
    c: c[i],
    contribution: contribution[i],
    dof: Number.isFinite(summaries[i].dof) ? summaries[i].dof : 'infinite',
    share: sumSq > 0 ? contribution[i] ** 2 / sumSq : 0,
    cMethod: method[i],
  }));

  let nuEff: number | 'infinite' | null;
  if (uc === 0) nuEff = 'infinite';
  else if (correlated) {
    nuEff = null;
    warnings.push('Inputs are correlated: the Welch–Satterthwaite formula does not apply, so the effective degrees of freedom are not given and k is the normal quantile for the coverage probability.');
  } else nuEff = welchSatterthwaite(contribution, summaries.map((s) => s.dof), uc);
  const k = coverageFactor(opts.coverage, nuEff);
  const U = k * uc;
  const zeroUncertainty = uc === 0;
  if (zeroUncertainty) {
    warnings.push('The combined standard uncertainty is zero: every sensitivity coefficient vanishes at the estimates, so the first-order law of propagation is not applicable here (JCGM 101 §9.4); use the Monte Carlo result.');
  }

  const gum: GumResult = { y, u: uc, nuEff, k, U, coverage: opts.coverage, interval: [y - U, y + U], budget };

  const wantSecond = opts.secondOrder ?? n <= 50;
  if (wantSecond && !correlated) {
    try {
      gum.uSecondOrder = secondOrderUncertainty(model, x, u, c, uc2);
      if (Math.abs(gum.uSecondOrder - uc) > 0.05 * Math.max(uc, Number.MIN_VALUE) && gum.uSecondOrder > 0) {
        warnings.push(`Second-order terms change the standard uncertainty from ${uc.toPrecision(3)} to ${gum.uSecondOrder.toPrecision(3)} (GUM 5.1.2 note): the model is markedly non-linear at the estimates; rely on the Monte Carlo result.`);
      }
    } catch (e) {
      if (!(e instanceof EngineError)) throw e;
    }
  }
  return { gum, warnings, zeroUncertainty };
}

/**
 * GUM 5.1.2 note (uncorrelated inputs, symmetric distributions):
 *   u² = Σ c_i² u_i² + Σ_i Σ_j [½ (∂²f/∂x_i∂x_j)² + ∂f/∂x_i · ∂³f/∂x_i∂x_j²] u_i² u_j²,
 * with the second and third derivatives from central differences of the gradient
 * (model.secondOrder; steps ε^(1/4)·max(|x_j|, u_j)).
 */
export function secondOrderUncertainty(model: CompiledModelDetails, x: readonly number[], u: readonly number[], c: readonly number[], uc2: number): number {
  const { hessian, third } = model.secondOrder(x, u);
  let extra = 0;
  for (let i = 0; i < x.length; i++)
    for (let j = 0; j < x.length; j++) {
      if (u[i] === 0 || u[j] === 0) continue;
      extra += (0.5 * hessian[i][j] ** 2 + c[i] * third[i][j]) * u[i] ** 2 * u[j] ** 2;
    }
  const v = uc2 + extra;
  if (!Number.isFinite(v)) throw new EngineError('NON_FINITE', 'second-order terms are not finite');
  return Math.sqrt(Math.max(0, v));
}
