/**
 * Internal contracts between the parts of the engine (model compiler, GUM, distributions,
 * Monte Carlo). The public entry is ./index.ts.
 */
import type { BudgetDocument, Distribution } from '../schemas/budget.schema';
import type { McmWorkspace } from './mcm/workspace';

export type { BudgetDocument, Distribution };

/** A model compiled from the allow-listed tree of its equations. */
export interface CompiledModel {
  /** Input symbols in the order of `doc.inputs`; every vector below uses this order. */
  inputSymbols: string[];
  /** The measurand symbol (defined by the last equation unless `doc.measurand` names it). */
  measurand: string;
  /** Evaluate the measurand at one point. Throws EngineError('NON_FINITE') on overflow/NaN. */
  scalar(x: ArrayLike<number>): number;
  /**
   * Vectorised kernel: for t in [0, n): out[t] = f(columns[0][t], …, columns[m-1][t]).
   * Generated once from the checked tree; one loop, no per-trial interpretation.
   */
  kernel(columns: Float64Array[], out: Float64Array, n: number): void;
  /** Sensitivity coefficients ∂f/∂x_i at x, and for each whether it was symbolic or numeric. */
  sensitivities(x: ArrayLike<number>): { c: number[]; method: Array<'symbolic' | 'numeric'> };
  /** Second partial derivatives ∂²f/∂x_i∂x_j at x (for the GUM 5.1.2 note), numeric where needed. */
  hessian(x: ArrayLike<number>): number[][];
}

/** GUM view of one input: estimate, standard uncertainty and degrees of freedom (Infinity for ∞). */
export interface InputSummary {
  estimate: number;
  u: number;
  dof: number;
}

/** A seeded source of uniform numbers in (0, 1); see ./random. */
export interface UniformSource {
  /** Fill `out[0..n)` with independent U(0,1) variates, never exactly 0 or 1. */
  fill(out: Float64Array, n: number): void;
  next(): number;
}

export interface McmOptions {
  trials: number;
  seed: number;
  adaptive: boolean;
  interval: 'shortest' | 'symmetric';
  coverage: number;
  /** Significant digits for the adaptive numerical tolerance (JCGM 101 §7.9.2). */
  digits: number;
  /** Trials per chunk (bounded memory). */
  chunkSize?: number;
  /** Called after each chunk with trials done so far and the target (the target may grow when adaptive). */
  onProgress?: (done: number, target: number) => void;
  /** Polled between chunks; when true the run stops with EngineError('CANCELLED'). */
  isCancelled?: () => boolean;
  /** Buffers kept between runs by a thread that computes one run after another (mcm/workspace.ts). */
  workspace?: McmWorkspace;
}

export interface Histogram {
  edges: number[];
  counts: number[];
}

export interface McmResult {
  trials: number;
  seed: number;
  y: number;
  u: number;
  interval: [number, number];
  intervalKind: 'shortest' | 'symmetric';
  histogram: Histogram;
  adaptive?: { converged: boolean; tolerance: number; batches: number };
}

export interface BudgetRow {
  symbol: string;
  estimate: number;
  u: number;
  distribution: string;
  c: number;
  contribution: number;
  dof: number | 'infinite';
  share: number;
  cMethod: 'symbolic' | 'numeric';
}

export interface GumResult {
  y: number;
  u: number;
  nuEff: number | 'infinite' | null;
  k: number;
  U: number;
  coverage: number;
  interval: [number, number];
  budget: BudgetRow[];
  /** u including second-order terms (GUM 5.1.2 note), uncorrelated inputs only. */
  uSecondOrder?: number;
}

export interface ValidationResult {
  delta: number;
  dLow: number;
  dHigh: number;
  passed: boolean;
}

export interface Reported {
  value: string;
  U: string;
  unit: string;
  k: string;
}

/** The result document of DESIGN.md (also what the CLI prints). */
export interface EvaluationResult {
  engineVersion: string;
  measurand: string;
  unit: string;
  gum: GumResult;
  mcm: McmResult | null;
  validation: ValidationResult | null;
  reported: Reported;
  warnings: string[];
}
