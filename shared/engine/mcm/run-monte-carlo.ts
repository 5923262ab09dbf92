import { correlationGroups, createCorrelatedNormalSampler, createSampler, resolveDistribution, type RandomSource } from '../distributions';
import { EngineError } from '../errors';
import { createStreams, Xoshiro128StarStar } from '../random';
import type { BudgetDocument, CompiledModel, McmOptions, McmResult } from '../types';
import { numericalTolerance } from '../validation';
import { coverageInterval } from './coverage-interval';
import { OutputAccumulator } from './output-accumulator';
import { float64From, type McmWorkspace } from './workspace';

/** Default number of trials per chunk (2^16: 512 KiB per input column). */
export const DEFAULT_CHUNK = 1 << 16;

/**
 * Trials per block. Block b holds trials b·2^16 … (b + 1)·2^16 − 1, and each input draws them
 * from its own stream advanced by b jumps of 2^64 outputs (xoshiro128** jump(), the
 * "non-overlapping subsequences for parallel computations" of Blackman & Vigna). A block uses far
 * fewer than 2^64 outputs, so blocks never share numbers, and any block can be computed on its
 * own: the trials, and so the result, depend only on the seed, never on the chunk size or on how
 * many threads share the blocks (./run-in-blocks.ts).
 */
export const BLOCK_TRIALS = 1 << 16;

interface Step {
  /** Fill trials [at, at + n) of the columns. */
  fill(n: number, at: number): void;
}

const part = (col: Float64Array, at: number, n: number) => (at === 0 && n === col.length ? col : col.subarray(at, at + n));

/**
 * The samplers of one budget document and their column buffers (one per model input, in the
 * model's order), reused chunk after chunk. Stream i belongs to `doc.inputs[i]` and starts from
 * the states given to loadStates (BlockStarts); correlated normal inputs are drawn jointly from
 * the stream of the first of their group. The columns come from `workspace` when one is given.
 */
export class TrialSampler {
  readonly columns: Float64Array[];
  private readonly streams: Xoshiro128StarStar[];
  private readonly steps: Step[];

  constructor(doc: BudgetDocument, model: CompiledModel, capacity: number, workspace?: McmWorkspace) {
    // Placeholder states: every block loads its own before drawing.
    const streams = doc.inputs.map(() => new Xoshiro128StarStar([1, 0, 0, 0]));
    this.streams = streams;
    const docIndex = new Map(doc.inputs.map((input, i) => [input.symbol, i]));
    const columnOf = new Map<number, Float64Array>();
    this.columns = model.inputSymbols.map((symbol, j) => {
      const i = docIndex.get(symbol);
      if (i === undefined) throw new EngineError('INVALID_DOCUMENT', `the model uses "${symbol}", which is not an input of the document`);
      const col = float64From(workspace, `column ${j}`, capacity);
      columnOf.set(i, col);
      return col;
    });
    const groups = correlationGroups(doc);
    const grouped = new Set(groups.flatMap((g) => g.indices));
    const steps: Step[] = [];
    for (const g of groups) {
      const resolved = g.indices.map((i) => resolveDistribution(doc.inputs[i].distribution, doc.inputs[i].symbol));
      const means = resolved.map((r) => (r.type === 'normal' ? r.mean : NaN));
      const sds = resolved.map((r) => (r.type === 'normal' ? r.sd : NaN));
      const sampler = createCorrelatedNormalSampler(g, means, sds);
      const cols = g.indices.map((i) => columnOf.get(i) ?? new Float64Array(capacity));
      const rng = streams[g.indices[0]];
      steps.push({ fill: (n, at) => sampler.fill(rng, cols.map((c) => part(c, at, n)), n) });
    }
    doc.inputs.forEach((input, i) => {
      const sampler = createSampler(input.distribution, input.symbol); // validates even unused inputs
      const col = columnOf.get(i);
      if (grouped.has(i) || !col) return;
      const rng: RandomSource = streams[i];
      steps.push({ fill: (n, at) => sampler.fill(rng, part(col, at, n), n) });
    });
    this.steps = steps;
  }

  /** Draw trials [at, at + n) of every column from the streams' current states. */
  fill(n: number, at = 0): void {
    for (let s = 0; s < this.steps.length; s++) this.steps[s].fill(n, at);
  }

  /** Put every stream at the state saved in `states` (4 words per stream, as saveStates writes). */
  loadStates(states: Uint32Array): void {
    this.streams.forEach((g, i) => g.loadState(states, 4 * i));
  }
}

/** The start states of every input's stream for blocks 0, 1, 2, … in turn (one jump per block). */
export class BlockStarts {
  private readonly streams: Xoshiro128StarStar[];
  private block = 0;

  constructor(seed: number, count: number) {
    this.streams = createStreams(seed, count);
  }

  /** The states for the next block (4 words per stream), then advance to the one after. */
  next(): { block: number; states: Uint32Array } {
    const states = new Uint32Array(4 * this.streams.length);
    this.streams.forEach((g, i) => {
      g.saveState(states, 4 * i);
      g.jump();
    });
    return { block: this.block++, states };
  }
}

/**
 * Throw EngineError('NON_FINITE') when a model value in out[0..n) is NaN or ±∞, naming the count,
 * the trial numbers (1-based; the chunk starts at trial `first` + 1) and the inputs of the first.
 */
export function checkFinite(out: Float64Array, n: number, first: number, model: CompiledModel, columns: Float64Array[]): void {
  let bad = 0, at = -1;
  for (let t = 0; t < n; t++) {
    const v = out[t];
    if (v - v !== 0) { bad++; if (at < 0) at = t; }
  }
  if (bad === 0) return;
  const where = model.inputSymbols.map((s, j) => `${s} = ${columns[j][at]}`).join(', ');
  throw new EngineError(
    'NON_FINITE',
    `the model value is not finite (NaN or ±∞) in ${bad} of ${n} trials (trials ${first + 1}–${first + n}); first at trial ${first + at + 1} with ${where}`,
  );
}

/** Refuse bad run options (EngineError INVALID_DOCUMENT naming the option). */
export function checkOptions(opts: McmOptions): void {
  const bad = (m: string): never => { throw new EngineError('INVALID_DOCUMENT', m); };
  if (!Number.isSafeInteger(opts.trials) || opts.trials < 1) bad(`trials must be a whole number ≥ 1, got ${opts.trials}`);
  if (!Number.isSafeInteger(opts.seed) || opts.seed < 0) bad(`seed must be a whole number ≥ 0, got ${opts.seed}`);
  if (!(opts.coverage > 0 && opts.coverage < 1)) bad(`coverage must lie strictly between 0 and 1, got ${opts.coverage}`);
  if (opts.adaptive && !(Number.isInteger(opts.digits) && opts.digits >= 1)) bad(`digits must be a whole number ≥ 1, got ${opts.digits}`);
  if (opts.chunkSize !== undefined && !(Number.isSafeInteger(opts.chunkSize) && opts.chunkSize >= 1)) bad(`chunkSize must be a whole number ≥ 1, got ${opts.chunkSize}`);
}

function sampleMeanSd(values: number[]): { mean: number; sdOfMean: number } {
  const h = values.length;
  let s = 0;
  for (const v of values) s += v;
  const mean = s / h;
  let ss = 0;
  for (const v of values) ss += (v - mean) ** 2;
  return { mean, sdOfMean: Math.sqrt(ss / (h * (h - 1))) };
}

/**
 * Monte Carlo propagation of distributions (JCGM 101:2008 §7).
 *
 * Each input is drawn from its own seeded stream (xoshiro128**, see ../random) by its §6.4
 * sampler, correlated normal inputs jointly through a Cholesky factor (§6.4.8); trials run in
 * chunks of `chunkSize` (default 2^16) through the compiled model's vectorised kernel, so memory
 * is a few chunk buffers plus the bounded output store of OutputAccumulator, whatever M. Every
 * block of 2^16 trials draws from its own subsequence of each stream (BLOCK_TRIALS) and every
 * sampler consumes its stream trial by trial, so the result for a seed depends neither on the
 * chunk size nor on whether the blocks are computed here or shared among threads
 * (runMonteCarloInBlocks).
 *
 * Results (§7.6–7.7): y = mean of the model values, u = their standard deviation, the
 * probabilistically symmetric or shortest coverage interval for `coverage`, and a plot histogram.
 * Exact order statistics up to 2^20 trials; beyond, a fine histogram whose resolution is
 * documented in OutputAccumulator.
 *
 * Adaptive procedure (§7.9.4) when `adaptive`: batches of M_b = max(⌈100/(1 − p)⌉, 10^4) trials
 * (§7.9.4 b); after each batch h ≥ 2 the standard deviations s of the h batch values of y, u,
 * y_low and y_high (each the standard deviation of their average, §7.9.4 f) are compared with the
 * numerical tolerance δ of u(y) from all hM_b values for `digits` significant digits (§7.9.2);
 * the run stops when 2s ≤ δ for all four, and the results come from all hM_b values (§7.9.4 j).
 * `trials` is then the ceiling: if it is reached first, `adaptive.converged` is false. Progress
 * reports an estimated target h·M_b from the current batch scatter (s ∝ 1/√h).
 *
 * `onProgress(done, target)` is called after each chunk; `isCancelled()` is polled before each
 * chunk and stops the run with EngineError('CANCELLED'). `workspace` lends the run its buffers
 * (./workspace.ts): the result is the same with or without it.
 *
 * @throws EngineError NON_FINITE (a model value is NaN or ±∞: the count of such trials in the
 * chunk and the inputs of the first are given), CANCELLED, INVALID_DISTRIBUTION,
 * NOT_POSITIVE_DEFINITE, TOO_FEW_READINGS, INVALID_DOCUMENT (bad options)
 */
export function runMonteCarlo(doc: BudgetDocument, model: CompiledModel, opts: McmOptions): McmResult {
  checkOptions(opts);
  const p = opts.coverage;
  const ceiling = opts.trials;
  const batchSize = Math.max(Math.ceil(100 / (1 - p) - 1e-9), 10_000);
  const chunk = Math.max(1, Math.min(opts.chunkSize ?? DEFAULT_CHUNK, opts.adaptive ? batchSize : ceiling));
  const starts = new BlockStarts(opts.seed, doc.inputs.length);
  const ws = opts.workspace;
  const sampler = new TrialSampler(doc, model, chunk, ws);
  const { columns } = sampler;
  const out = float64From(ws, 'model values', chunk);
  const acc = new OutputAccumulator(opts.adaptive ? Math.min(ceiling, 8 * batchSize) : ceiling, p, ws);
  let done = 0;

  const runChunk = (n: number): void => {
    if (opts.isCancelled?.()) throw new EngineError('CANCELLED', `Monte Carlo run cancelled after ${done} trials`);
    // Split the chunk where a block begins: the streams then start from that block's states.
    for (let at = 0; at < n; ) {
      const t = done + at;
      if (t % BLOCK_TRIALS === 0) sampler.loadStates(starts.next().states);
      const len = Math.min(n - at, BLOCK_TRIALS - (t % BLOCK_TRIALS));
      sampler.fill(len, at);
      at += len;
    }
    model.kernel(columns, out, n);
    checkFinite(out, n, done, model, columns);
    acc.add(out, n);
    done += n;
  };

  if (!opts.adaptive) {
    while (done < ceiling) {
      runChunk(Math.min(chunk, ceiling - done));
      opts.onProgress?.(done, ceiling);
    }
    const s = acc.summary(opts.interval);
    return { trials: done, seed: opts.seed, y: s.y, u: s.u, interval: s.interval, intervalKind: opts.interval, histogram: s.histogram };
  }

  const batch = float64From(ws, 'batch', batchSize);
  const ys: number[] = [], us: number[] = [], lows: number[] = [], highs: number[] = [];
  let converged = false, tolerance = NaN, target = Math.min(ceiling, 2 * batchSize);
  while (done + batchSize <= ceiling || ys.length === 0) {
    const m = Math.min(batchSize, ceiling - done);
    for (let b = 0; b < m; ) {
      const n = Math.min(chunk, m - b);
      runChunk(n);
      batch.set(out.subarray(0, n), b);
      b += n;
      opts.onProgress?.(done, Math.max(target, done));
    }
    let sum = 0;
    for (let i = 0; i < m; i++) sum += batch[i];
    const mean = sum / m;
    let ss = 0;
    for (let i = 0; i < m; i++) ss += (batch[i] - mean) ** 2;
    const [lo, hi] = coverageInterval(batch, m, p, opts.interval, ws);
    ys.push(mean); us.push(Math.sqrt(ss / Math.max(1, m - 1))); lows.push(lo); highs.push(hi);
    const h = ys.length;
    if (h < 2) continue;
    const uAll = acc.summaryMoments().u;
    tolerance = numericalTolerance(uAll, opts.digits);
    const worst = Math.max(...[ys, us, lows, highs].map((v) => 2 * sampleMeanSd(v).sdOfMean));
    if (worst <= tolerance) { converged = true; break; }
    // s ∝ 1/√h: batches needed ≈ h·(2s/δ)².
    const needed = tolerance > 0 ? Math.ceil(h * (worst / tolerance) ** 2) : h + 1;
    target = Math.min(ceiling, Math.max(h + 1, needed) * batchSize);
  }
  const s = acc.summary(opts.interval);
  return {
    trials: done, seed: opts.seed, y: s.y, u: s.u, interval: s.interval, intervalKind: opts.interval, histogram: s.histogram,
    adaptive: { converged, tolerance, batches: ys.length },
  };
}
