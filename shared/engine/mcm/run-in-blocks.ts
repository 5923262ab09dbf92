import { EngineError } from '../errors';
import type { BudgetDocument, CompiledModel, McmOptions, McmResult } from '../types';
import { OutputAccumulator } from './output-accumulator';
import { BLOCK_TRIALS, BlockStarts, checkFinite, checkOptions, runMonteCarlo, TrialSampler } from './run-monte-carlo';

/** One block of trials to compute: trials `first` … `first + n − 1` from the streams' `states`. */
export interface BlockTask {
  doc: BudgetDocument;
  first: number;
  n: number;
  /** Start states of every input's stream for this block, 4 words each (BlockStarts). */
  states: Uint32Array;
}

/**
 * Computes one block's model values somewhere else (a worker thread) and resolves to them, in
 * trial order; rejects with an EngineError (NON_FINITE, …) when computeBlock would throw.
 */
export type BlockRunner = (task: BlockTask) => Promise<Float64Array>;

/**
 * The model values of one block (what a worker thread runs for runMonteCarloInBlocks). `reuse`
 * keeps the sampler and its column buffers between blocks of the same document.
 */
export function computeBlock(task: BlockTask, model: CompiledModel, reuse?: { sampler?: TrialSampler }): Float64Array {
  let sampler = reuse?.sampler;
  if (!sampler || sampler.columns[0]?.length !== BLOCK_TRIALS) {
    sampler = new TrialSampler(task.doc, model, BLOCK_TRIALS);
    if (reuse) reuse.sampler = sampler;
  }
  sampler.loadStates(task.states);
  sampler.fill(task.n);
  const out = new Float64Array(task.n);
  model.kernel(sampler.columns, out, task.n);
  checkFinite(out, task.n, task.first, model, sampler.columns);
  return out;
}

/**
 * runMonteCarlo with its blocks of 2^16 trials computed by `runBlock` — worker threads, so that a
 * run uses more than one core — and the same result, to the last bit, as runMonteCarlo for the
 * same seed: block b's streams are the same (BlockStarts), and the values are added to the
 * statistics in trial order whatever order the blocks finish in.
 *
 * At most `inFlight` blocks are outstanding or waiting for their turn (memory: inFlight × 512 KiB
 * of values on top of the output store). Progress is reported and cancellation polled after
 * each block. The adaptive procedure (§7.9) decides after each batch whether to go on, so it
 * runs here in this thread with runMonteCarlo.
 */
export async function runMonteCarloInBlocks(doc: BudgetDocument, model: CompiledModel, opts: McmOptions, runBlock: BlockRunner, inFlight: number): Promise<McmResult> {
  if (opts.adaptive) return runMonteCarlo(doc, model, opts);
  // The checks of runMonteCarlo (options, distributions, the model's inputs) before any block runs.
  checkOptions(opts);
  new TrialSampler(doc, model, 1);

  const M = opts.trials;
  const blocks = Math.ceil(M / BLOCK_TRIALS);
  const starts = new BlockStarts(opts.seed, doc.inputs.length);
  const acc = new OutputAccumulator(M, opts.coverage);
  const pending = new Map<number, Promise<Float64Array>>();
  let launched = 0, consumed = 0, stopped = false;
  // Keep `inFlight` blocks outstanding: a new one is started as soon as any finishes (not only
  // when the next in trial order does), so no thread waits while an earlier block is still running.
  const topUp = (): void => {
    while (!stopped && launched < blocks && launched - consumed < Math.max(1, inFlight)) {
      const { block, states } = starts.next();
      const first = block * BLOCK_TRIALS;
      const p = runBlock({ doc, first, n: Math.min(BLOCK_TRIALS, M - first), states });
      p.then(topUp, () => {}); // a failure is awaited, in order, below
      pending.set(block, p);
      launched++;
    }
  };
  let done = 0;
  try {
    topUp();
    for (let b = 0; b < blocks; b++) {
      if (opts.isCancelled?.()) throw new EngineError('CANCELLED', `Monte Carlo run cancelled after ${done} trials`);
      const out = await pending.get(b)!;
      pending.delete(b);
      consumed++;
      topUp();
      acc.add(out, out.length);
      done += out.length;
      opts.onProgress?.(done, M);
    }
  } finally {
    stopped = true;
    pending.clear();
  }
  const s = acc.summary(opts.interval);
  return { trials: done, seed: opts.seed, y: s.y, u: s.u, interval: s.interval, intervalKind: opts.interval, histogram: s.histogram };
}
