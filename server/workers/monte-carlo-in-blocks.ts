/**
 * Monte Carlo on several cores: the blocks of 2^16 trials of one run go to the `mcm` worker
 * threads (mcm.worker.ts, task 'monte-carlo-block') and come back in trial order through
 * shared/engine's runMonteCarloInBlocks, which gives the same result as one thread for the same
 * seed. Used by the command-line evaluation and the engine benchmark. The server runs each job on
 * one thread of its pool instead, so that jobs and API requests share the cores (DEVELOPERS.md).
 */
import { availableParallelism } from 'node:os';
import { EngineError, evaluateInBlocks, type BlockRunner, type EvaluateOptions, type EvaluationResult } from '../../shared/engine';
import type { EngineErrorCode } from '../../shared/engine/errors';
import type { McmBlockResult } from './mcm.worker';
import { createWorkerPool, type WorkerPool } from './pool';

/** A BlockRunner that hands each block to a thread of `pool`. */
export function poolBlockRunner(pool: WorkerPool, nice = 0): BlockRunner {
  return async (task) => {
    const r = (await pool.runTask('monte-carlo-block', { ...task, nice })) as McmBlockResult;
    if (r instanceof Float64Array) return r;
    throw new EngineError(r.code as EngineErrorCode, r.message);
  };
}

export interface ParallelEvaluator {
  readonly threads: number;
  evaluate(input: unknown, opts?: EvaluateOptions): Promise<EvaluationResult>;
  destroy(): Promise<void>;
}

/**
 * An evaluator whose Monte Carlo runs on `threads` worker threads (default: every core). Four
 * blocks per thread are kept in flight so that no thread waits for the next one.
 */
export function createParallelEvaluator(threads = availableParallelism()): ParallelEvaluator {
  const n = Math.max(1, Math.trunc(threads));
  const pool = createWorkerPool({ maxThreads: n, minThreads: n });
  const runBlock = poolBlockRunner(pool);
  return {
    threads: n,
    evaluate: (input, opts = {}) => evaluateInBlocks(input, opts, runBlock, 4 * n),
    destroy: () => pool.destroy(),
  };
}
