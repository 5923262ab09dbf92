/**
 * Monte Carlo in blocks (shared/engine/mcm/run-in-blocks.ts): the blocks of 2^16 trials computed
 * apart — here in this thread, finishing in a shuffled order, as worker threads would — give the
 * same result, bit for bit, as runMonteCarlo for the same seed, whatever the chunk size. The model
 * and distributions are hand-written test data; what is checked is sameness, not a published value.
 */
import { describe, expect, it } from 'vitest';
import { compileModel, parseBudget } from '../../../../shared/engine';
import { EngineError } from '../../../../shared/engine/errors';
import { BLOCK_TRIALS, computeBlock, runMonteCarlo, runMonteCarloInBlocks, type BlockRunner, type BlockTask } from '../../../../shared/engine/mcm';
import type { McmOptions } from '../../../../shared/engine/types';

const doc = parseBudget({
  equations: ['y = a * exp(b) + c / d + e'],
  inputs: [
    { symbol: 'a', distribution: { type: 'normal', mean: 1, sd: 0.1 } },
    { symbol: 'b', distribution: { type: 'rectangular', min: -0.2, max: 0.2 } },
    { symbol: 'c', distribution: { type: 'readings', values: [10.1, 10.3, 9.9, 10.0, 10.2] } },
    { symbol: 'd', distribution: { type: 'normal', mean: 5, sd: 0.2 } },
    { symbol: 'e', distribution: { type: 'normal', mean: 0, sd: 0.05 } },
  ],
  correlations: [{ between: ['a', 'd'], r: 0.6 }],
});
const model = compileModel(doc);
const opts: McmOptions = { trials: 3 * BLOCK_TRIALS + 1234, seed: 20261203, adaptive: false, interval: 'shortest', coverage: 0.95, digits: 2 };

/** A block runner in this thread whose blocks finish in a scrambled order; `busy` tracks how many are outstanding. */
function scrambled(log: BlockTask[] = [], busy = { now: 0, most: 0 }): BlockRunner {
  return (task) => {
    log.push(task);
    busy.most = Math.max(busy.most, ++busy.now);
    const out = computeBlock(task, model);
    return new Promise((resolve) => setTimeout(() => (busy.now--, resolve(out)), ((task.first / BLOCK_TRIALS) * 7) % 5));
  };
}

describe('runMonteCarloInBlocks', () => {
  it('gives the result of runMonteCarlo for the same seed, to the last bit, with blocks finishing out of order', async () => {
    const log: BlockTask[] = [];
    const busy = { now: 0, most: 0 };
    const inBlocks = await runMonteCarloInBlocks(doc, model, opts, scrambled(log, busy), 3);
    expect(inBlocks).toEqual(runMonteCarlo(doc, model, opts));
    expect(busy.most).toBe(3);
    expect(log.map((t) => [t.first, t.n])).toEqual([[0, BLOCK_TRIALS], [BLOCK_TRIALS, BLOCK_TRIALS], [2 * BLOCK_TRIALS, BLOCK_TRIALS], [3 * BLOCK_TRIALS, 1234]]);
  });

  it('runMonteCarlo draws the same trials whatever the chunk size, also across block boundaries (correlated inputs included)', () => {
    const whole = runMonteCarlo(doc, model, opts);
    for (const chunkSize of [10_007, BLOCK_TRIALS * 2]) {
      const r = runMonteCarlo(doc, model, { ...opts, chunkSize });
      // The same model values: the same order statistics and histogram; y and u are sums taken
      // chunk by chunk, so they may differ in the last bits only.
      expect(r.interval).toEqual(whole.interval);
      expect(r.histogram).toEqual(whole.histogram);
      expect(r.y).toBeCloseTo(whole.y, 12);
      expect(r.u / whole.u).toBeCloseTo(1, 12);
    }
  });

  it('different blocks draw different numbers (each block starts from its own subsequence)', () => {
    const task = (first: number, states: Uint32Array): BlockTask => ({ doc, first, n: 1000, states });
    const starts = new Uint32Array(4 * doc.inputs.length).map((_, i) => i + 1);
    const other = starts.map((v) => v ^ 0x9e3779b9);
    expect(Array.from(computeBlock(task(0, starts), model))).not.toEqual(Array.from(computeBlock(task(0, other), model)));
  });

  it('reports progress after each block, in trial order, and stops with CANCELLED when asked', async () => {
    const seen: number[] = [];
    let cancel = false;
    const run = runMonteCarloInBlocks(doc, model, { ...opts, onProgress: (done) => { seen.push(done); cancel = done >= 2 * BLOCK_TRIALS; }, isCancelled: () => cancel }, scrambled(), 2);
    await expect(run).rejects.toMatchObject({ code: 'CANCELLED' });
    expect(seen).toEqual([BLOCK_TRIALS, 2 * BLOCK_TRIALS]);
  });

  it('passes on a block’s NON_FINITE error with the trial numbers of the whole run', async () => {
    const bad = parseBudget({ equations: ['y = 1 / (x - 0.5)'], inputs: [{ symbol: 'x', distribution: { type: 'constant', value: 0.5 } }] });
    const badModel = compileModel(bad);
    const runBlock: BlockRunner = async (task) => computeBlock(task, badModel);
    const err = await runMonteCarloInBlocks(bad, badModel, { ...opts, trials: 2 * BLOCK_TRIALS }, runBlock, 2).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(EngineError);
    expect((err as EngineError).code).toBe('NON_FINITE');
    expect((err as EngineError).message).toMatch(/trials 1–65536\); first at trial 1 with x = 0.5/);
  });

  it('runs the adaptive procedure in the calling thread, as runMonteCarlo does', async () => {
    const adaptive = { ...opts, adaptive: true, trials: 200_000 };
    const log: BlockTask[] = [];
    expect(await runMonteCarloInBlocks(doc, model, adaptive, scrambled(log), 2)).toEqual(runMonteCarlo(doc, model, adaptive));
    expect(log).toEqual([]);
  });
});
