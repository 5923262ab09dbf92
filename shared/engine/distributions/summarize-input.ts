import { EngineError } from '../errors';
import type { InputSummary } from '../types';
import type { BudgetInput } from '../../schemas/budget.schema';
import { resolveDistribution, type Resolved } from './resolve';

/** Estimate and standard uncertainty of a resolved distribution (GUM view). */
export function gumMoments(r: Resolved): { estimate: number; u: number } {
  switch (r.type) {
    case 'normal': return { estimate: r.mean, u: r.sd };
    case 'rectangular': return { estimate: (r.a + r.b) / 2, u: (r.b - r.a) / Math.sqrt(12) };
    case 'triangular': {
      const { a, b, c } = r;
      return { estimate: (a + b + c) / 3, u: Math.sqrt(Math.max(0, a * a + b * b + c * c - a * b - a * c - b * c) / 18) };
    }
    case 'arcsine': return { estimate: (r.a + r.b) / 2, u: (r.b - r.a) / Math.sqrt(8) };
    case 'trapezoidal': return { estimate: (r.a + r.b) / 2, u: (r.b - r.a) * Math.sqrt((1 + r.beta * r.beta) / 24) };
    case 'curvilinear-trapezoid': return { estimate: (r.a + r.b) / 2, u: Math.sqrt((r.b - r.a) ** 2 / 12 + (r.d * r.d) / 9) };
    case 'student-t': return { estimate: r.mean, u: r.scale };
    case 'readings': return { estimate: r.mean, u: r.scale };
    case 'exponential': return { estimate: r.mean, u: r.mean };
    case 'gamma': return { estimate: r.shape * r.scale, u: Math.sqrt(r.shape) * r.scale };
    case 'constant': return { estimate: r.value, u: 0 };
  }
}

/**
 * The GUM summary of one input quantity: estimate x, standard uncertainty u(x), degrees of
 * freedom ν (Infinity for ∞).
 *
 * Estimates and standard uncertainties (JCGM 101:2008 §6.4; JCGM 100 4.3.7–4.3.9):
 * normal: μ, σ (or U/k) · rectangular [a, b]: (a+b)/2, (b−a)/√12 · triangular [a, b] mode c:
 * (a+b+c)/3, √((a²+b²+c²−ab−ac−bc)/18) · arcsine: (a+b)/2, (b−a)/√8 · trapezoidal with top/base
 * ratio β: (a+b)/2, (b−a)√((1+β²)/24) · curvilinear trapezoid (limits inexact by ±d):
 * (a+b)/2, √((b−a)²/12 + d²/9) · student-t: μ, scale (GUM 4.2 / Annex G convention, DESIGN.md) ·
 * readings: x̄, s/√n · exponential: μ, μ · gamma (k, θ): kθ, √k θ · constant: value, 0.
 *
 * Degrees of freedom (DESIGN.md): the input's own `dof` wins; otherwise readings give n − 1,
 * student-t its `dof`, every other distribution ∞.
 *
 * @throws EngineError INVALID_DISTRIBUTION (bad parameters or dof ≤ 0), TOO_FEW_READINGS
 * @example summarizeInput({ symbol: 'x', distribution: { type: 'rectangular', min: -1, max: 1 } })
 *   // { estimate: 0, u: 0.5774, dof: Infinity }
 */
export function summarizeInput(input: BudgetInput): InputSummary {
  const r = resolveDistribution(input.distribution, input.symbol);
  const { estimate, u } = gumMoments(r);
  let dof: number;
  if (input.dof !== undefined && input.dof !== null) {
    if (typeof input.dof !== 'number' || !(input.dof > 0)) {
      throw new EngineError('INVALID_DISTRIBUTION', `input "${input.symbol}": dof must be greater than zero, got ${String(input.dof)}`);
    }
    dof = input.dof;
  } else if (r.type === 'readings' || r.type === 'student-t') dof = r.dof;
  else dof = Infinity;
  return { estimate, u, dof };
}
