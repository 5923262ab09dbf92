/**
 * The Emberline uncertainty engine: the only public entry (DEVELOPERS.md). Pure TypeScript with
 * no I/O, no clock and no hidden randomness; the same code runs in the browser (live GUM budget)
 * and on the server (the authoritative stored result).
 */
export { evaluate, evaluateGum, evaluateInBlocks, parseBudget, ENGINE_VERSION, type EvaluateOptions } from './evaluate';
export { EngineError, type EngineErrorCode } from './errors';
export type * from './types';

// Model language
export {
  checkEquations,
  compileModel,
  compileModelWith,
  differenceStep,
  MAX_EXPRESSION_LENGTH,
  MAX_NESTING,
  ELEMENTARY_FUNCTIONS,
  RADIOMETRIC_SIGNATURES,
  LIBRARY_CONSTANT_NAMES,
  type EquationIssue,
  type CheckEquationsResult,
  type CompiledModelDetails,
} from './model';
export { checkUnits, parseUnitDimension, formatDimension, type UnitCheckResult, type UnitIssue } from './model/units';

// GUM, Type A, reporting
export { propagate, correlationMatrix, welchSatterthwaite, secondOrderUncertainty, type GumOutcome } from './gum/propagate';
export { coverageFactor, truncateDof } from './gum/coverage-factor';
export { typeA, type TypeAResult } from './stats/type-a';
export { reportResult, roundUncertainty, formatAtPlace, type ReportedStrings, type RoundedUncertainty } from './rounding/report';

// Distributions, Monte Carlo, validation, radiometry (shared/engine/{distributions,mcm,validation,radiometry})
export { summarizeInput, createSampler } from './distributions';
export { runMonteCarlo, runMonteCarloInBlocks, computeBlock, McmWorkspace, type BlockTask, type BlockRunner } from './mcm';
export { validateGumAgainstMcm } from './validation';
export {
  RADIOMETRIC_FUNCTIONS,
  RADIATION_CONSTANTS,
  planck,
  planck_nu,
  planck_temperature,
  band_radiance,
  stefan_boltzmann,
  wien_peak,
  sh_signal,
  sh_temperature,
  its90_ratio,
} from './radiometry';
