/**
 * Evaluate a budget document end to end (DESIGN.md, "The budget document"): validate with the
 * schema, compile the model, GUM law of propagation, Monte Carlo (JCGM 101), validation of the
 * GUM result against Monte Carlo (JCGM 101 §8), warnings and the reported strings.
 *
 * The engine has no hidden randomness: the Monte Carlo seed is `opts.seed`, else the document's
 * `monteCarlo.seed`, else `opts.seedSource()` supplied by the caller (the CLI and the server
 * pass a random one); the seed used is reported in `mcm.seed`.
 */
import { budgetSchema, BUDGET_DEFAULTS, type BudgetDocument } from '../schemas/budget.schema';
import { summarizeInput } from './distributions';
import { EngineError } from './errors';
import { propagate } from './gum/propagate';
import { runMonteCarlo, runMonteCarloInBlocks, type BlockRunner } from './mcm';
import { compileModel, type CompiledModelDetails } from './model';
import { reportResult } from './rounding/report';
import type { EvaluationResult, McmOptions, McmResult } from './types';
import { validateGumAgainstMcm } from './validation';

/** Engine name and version, recorded with every stored result. */
export const ENGINE_VERSION = 'emberline-engine 1.0.0';

export interface EvaluateOptions {
  /** Run Monte Carlo (default true). `false` is the CLI's --no-mcm: `mcm` and `validation` null. */
  mcm?: boolean;
  /** Overrides doc.monteCarlo.trials. */
  trials?: number;
  /** Overrides doc.monteCarlo.seed. */
  seed?: number;
  /** Called for a seed when neither opts.seed nor doc.monteCarlo.seed is given. */
  seedSource?: () => number;
  onProgress?: McmOptions['onProgress'];
  isCancelled?: McmOptions['isCancelled'];
  workspace?: McmOptions['workspace'];
  chunkSize?: number;
  /** Second-order terms of GUM 5.1.2 (default: true up to 50 uncorrelated inputs). */
  secondOrder?: boolean;
  /**
   * Generate JavaScript for the model (default true). Browsers under the app's
   * Content-Security-Policy (no 'unsafe-eval') pass false: the model is then evaluated through
   * closures with the same arithmetic (model/closures.ts).
   */
  codegen?: boolean;
}

/** Validate `doc` with the budget schema; EngineError('INVALID_DOCUMENT') lists every issue with its path. */
export function parseBudget(doc: unknown): BudgetDocument {
  const r = budgetSchema.safeParse(doc);
  if (r.success) return r.data;
  const issues = r.error.issues.map((i) => ({ path: i.path.map((p) => (typeof p === 'symbol' ? String(p) : p)) as Array<string | number>, message: i.message }));
  const text = issues.map((i) => `${i.path.length ? i.path.join('.') : '(document)'}: ${i.message}`).join('; ');
  throw new EngineError('INVALID_DOCUMENT', `the budget document is invalid: ${text}`, { path: issues[0]?.path, issues });
}

interface GumStage {
  doc: BudgetDocument;
  model: CompiledModelDetails;
  result: EvaluationResult;
  zeroUncertainty: boolean;
}

function gumStage(input: unknown, opts: EvaluateOptions): GumStage {
  const doc = parseBudget(input);
  const model = compileModel(doc, { codegen: opts.codegen });
  const summaries = doc.inputs.map((i) => summarizeInput(i));
  const coverage = doc.coverage ?? BUDGET_DEFAULTS.coverage;
  const { gum, warnings, zeroUncertainty } = propagate(doc, model, summaries, { coverage, secondOrder: opts.secondOrder });
  const unit = doc.measurand?.unit ?? '';
  const reported = reportResult(gum.y, gum.U, gum.k, unit, doc.reportDigits ?? BUDGET_DEFAULTS.reportDigits);
  return {
    doc,
    model,
    zeroUncertainty,
    result: { engineVersion: ENGINE_VERSION, measurand: model.measurand, unit, gum, mcm: null, validation: null, reported, warnings },
  };
}

/** GUM only, synchronous and without Monte Carlo (the browser's live budget table). */
export function evaluateGum(doc: unknown, opts: Pick<EvaluateOptions, 'secondOrder' | 'codegen'> = {}): EvaluationResult {
  return gumStage(doc, opts).result;
}

/** The whole evaluation. Throws EngineError on any invalid input. */
export function evaluate(input: unknown, opts: EvaluateOptions = {}): EvaluationResult {
  const stage = gumStage(input, opts);
  if (opts.mcm === false) return stage.result;
  const mcmOptions = monteCarloOptions(stage, opts);
  return withMonteCarlo(stage, runMonteCarlo(stage.doc, stage.model, mcmOptions), mcmOptions.digits);
}

/**
 * evaluate, with the Monte Carlo blocks computed by `runBlock` (worker threads; see
 * runMonteCarloInBlocks): the same result for the same seed, in less time on several cores.
 */
export async function evaluateInBlocks(input: unknown, opts: EvaluateOptions, runBlock: BlockRunner, inFlight: number): Promise<EvaluationResult> {
  const stage = gumStage(input, opts);
  if (opts.mcm === false) return stage.result;
  const mcmOptions = monteCarloOptions(stage, opts);
  return withMonteCarlo(stage, await runMonteCarloInBlocks(stage.doc, stage.model, mcmOptions, runBlock, inFlight), mcmOptions.digits);
}

function monteCarloOptions({ doc, result }: GumStage, opts: EvaluateOptions): McmOptions {
  const seed = opts.seed ?? doc.monteCarlo?.seed ?? opts.seedSource?.();
  if (seed === undefined || !Number.isInteger(seed) || seed < 0 || seed > 2 ** 32 - 1) {
    throw new EngineError('INVALID_DOCUMENT', seed === undefined ? 'a Monte Carlo seed is needed: give monteCarlo.seed in the document or a seed to the caller' : `the seed ${seed} must be a whole number between 0 and 2^32 − 1`, { path: ['monteCarlo', 'seed'] });
  }
  const trials = opts.trials ?? doc.monteCarlo?.trials ?? BUDGET_DEFAULTS.trials;
  if (!Number.isInteger(trials) || trials < 1000 || trials > 100_000_000) {
    throw new EngineError('INVALID_DOCUMENT', `trials must be a whole number between 1000 and 10^8, not ${trials}`, { path: ['monteCarlo', 'trials'] });
  }
  const digits = doc.monteCarlo?.digits ?? BUDGET_DEFAULTS.digits;
  const mcmOptions: McmOptions = {
    trials,
    seed,
    adaptive: doc.monteCarlo?.adaptive ?? BUDGET_DEFAULTS.adaptive,
    interval: doc.monteCarlo?.interval ?? BUDGET_DEFAULTS.interval,
    coverage: result.gum.coverage,
    digits,
    chunkSize: opts.chunkSize,
    onProgress: opts.onProgress,
    isCancelled: opts.isCancelled,
    workspace: opts.workspace,
  };
  return mcmOptions;
}

function withMonteCarlo({ result, zeroUncertainty }: GumStage, mcm: McmResult, digits: number): EvaluationResult {
  const warnings = [...result.warnings];
  let validation = null;
  if (zeroUncertainty) {
    warnings.push('GUM-against-Monte-Carlo validation is not given because the GUM standard uncertainty is zero.');
  } else {
    validation = validateGumAgainstMcm({ y: result.gum.y, u: result.gum.u, interval: result.gum.interval }, { interval: mcm.interval }, digits);
    if (!validation.passed) {
      warnings.push(`The GUM coverage interval does not agree with the Monte Carlo one to ${digits} significant digit${digits === 1 ? '' : 's'} of u(y) (JCGM 101 §8: d_low = ${validation.dLow.toPrecision(2)}, d_high = ${validation.dHigh.toPrecision(2)}, δ = ${validation.delta.toPrecision(2)}): report the Monte Carlo result.`);
    }
  }
  return { ...result, mcm, validation, warnings };
}
