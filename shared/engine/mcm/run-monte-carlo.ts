import { correlationGroups, createCorrelatedNormalSampler, createSampler, resolveDistribution, type RandomSource } from '../distributions';
import { EngineError } from '../errors';
import { createStreams } from '../random';
import type { BudgetDocument, CompiledModel, McmOptions, McmResult } from '../types';
import { numericalTolerance } from '../validation';
import { coverageInterval } from './coverage-interval';
import { OutputAccumulator } from './output-accumulator';

/** Default number of trials per chunk (2^16: 512 KiB per input column). */
export const DEFAULT_CHUNK = 1 << 16;

interface Step {
  rng: RandomSource;
  fill(n: number): void;
}

function buildPlan(doc: BudgetDocument, model: CompiledModel, seed: number, chunk: number) {
  const docIndex = new Map(doc.inputs.map((input, i) => [input.symbol, i]));
  const columnOf = new Map<number, Float64Array>();
  const columns = model.inputSymbols.map((symbol) => {
    const i = docIndex.get(symbol);
    if (i === undefined) throw new EngineError('INVALID_DOCUMENT', `the model uses "${symbol}", which is not an input of the document`);
    const col = new Float64Array(chunk);
    columnOf.set(i, col);
    return col;
  });
  // Stream i belongs to doc.inputs[i]: samples of one input do not depend on the others.
  const streams = createStreams(seed, doc.inputs.length);
  const groups = correlationGroups(doc);
  const grouped = new Set(groups.flatMap((g) => g.indices));
  const steps: Step[] = [];
  for (const g of groups) {
    const resolved = g.indices.map((i) => resolveDistribution(doc.inputs[i].distribution, doc.inputs[i].symbol));
    const means = resolved.map((r) => (r.type === 'normal' ? r.mean : NaN));
    const sds = resolved.map((r) => (r.type === 'normal' ? r.sd : NaN));
    const sampler = createCorrelatedNormalSampler(g, means, sds);
    const cols = g.indices.map((i) => columnOf.get(i) ?? new Float64Array(chunk));
    const rng = streams[g.indices[0]];
    steps.push({ rng, fill: (n) => sampler.fill(rng, cols, n) });
  }
  doc.inputs.forEach((input, i) => {
    const sampler = createSampler(input.distribution, input.symbol); // validates even unused inputs
    const col = columnOf.get(i);
    if (grouped.has(i) || !col) return;
    const rng = streams[i];
    steps.push({ rng, fill: (n) => sampler.fill(rng, col, n) });
  });
  return { columns, steps };
}

function checkOptions(opts: McmOptions): void {
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
 * is a few chunk buffers plus the bounded output store of OutputAccumulator, whatever M. Because
 * every sampler consumes its stream trial by trial, the result for a seed does not depend on the
 * chunk size.
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
 * chunk and stops the run with EngineError('CANCELLED').
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
  const { columns, steps } = buildPlan(doc, model, opts.seed, chunk);
  const out = new Float64Array(chunk);
  const acc = new OutputAccumulator(opts.adaptive ? Math.min(ceiling, 8 * batchSize) : ceiling, p);
  let done = 0;

  const runChunk = (n: number): void => {
    if (opts.isCancelled?.()) throw new EngineError('CANCELLED', `Monte Carlo run cancelled after ${done} trials`);
    for (let s = 0; s < steps.length; s++) steps[s].fill(n);
    model.kernel(columns, out, n);
    let bad = 0, first = -1;
    for (let t = 0; t < n; t++) {
      const v = out[t];
      if (v - v !== 0) { bad++; if (first < 0) first = t; }
    }
    if (bad > 0) {
      const where = model.inputSymbols.map((s, j) => `${s} = ${columns[j][first]}`).join(', ');
      throw new EngineError(
        'NON_FINITE',
        `the model value is not finite (NaN or ±∞) in ${bad} of ${n} trials (trials ${done + 1}–${done + n}); first at trial ${done + first + 1} with ${where}`,
      );
    }
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

  const batch = new Float64Array(batchSize);
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
    const [lo, hi] = coverageInterval(batch, m, p, opts.interval);
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
