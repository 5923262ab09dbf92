/**
 * Monte Carlo evaluation of one budget document in a worker thread (piscina), so the API's
 * event loop stays free while 10^6–10^7 trials run (bundled by server/build.mjs to
 * dist/server/workers/mcm.worker.js).
 *
 * Progress and cancellation share one SharedArrayBuffer with the main thread (it is shared, not
 * copied, when the task is posted): BigInt64 slots [0] cancel flag, [1] trials done, [2] target.
 * The engine reports progress after each chunk and polls `isCancelled` between chunks.
 *
 * `nice` (MONTE_CARLO_NICE) puts the thread in the background first (./thread-priority.ts), so
 * that a long run takes only the processor time the API's requests leave.
 */
import { move } from 'piscina';
import { compileModel, computeBlock, evaluate, EngineError, McmWorkspace, type BlockTask, type EvaluationResult } from '../../shared/engine';
import type { TrialSampler } from '../../shared/engine/mcm';
import { taskHandler } from './task-handler';
import { lowerThreadPriority } from './thread-priority';

export type McmTask = {
  doc: unknown;
  trials: number;
  seed: number;
  shared: SharedArrayBuffer;
  /** Linux nice value for this worker thread (0–19; 0 or omitted: unchanged). */
  nice?: number;
};

export type McmTaskResult = { ok: true; result: EvaluationResult } | { ok: false; code: string; message: string };

export const MCM_SLOT = { cancel: 0, done: 1, target: 2 } as const;
export const MCM_SHARED_BYTES = 3 * 8;

// This thread's runs come one after another: they share their buffers (shared/engine/mcm/workspace.ts),
// so a finished run leaves no 16 MiB of garbage for the process's collector threads to mark.
const workspace = new McmWorkspace();

export function runMcm(task: McmTask): McmTaskResult {
  const slots = new BigInt64Array(task.shared);
  if (task.nice) lowerThreadPriority(task.nice);
  try {
    const result = evaluate(task.doc, {
      trials: task.trials,
      seed: task.seed,
      onProgress: (done, target) => {
        Atomics.store(slots, MCM_SLOT.target, BigInt(target));
        Atomics.store(slots, MCM_SLOT.done, BigInt(done));
      },
      isCancelled: () => Atomics.load(slots, MCM_SLOT.cancel) === 1n,
      workspace,
    });
    return { ok: true, result };
  } catch (err) {
    if (err instanceof EngineError) return { ok: false, code: err.code, message: err.message };
    return { ok: false, code: 'WORKER_FAILED', message: err instanceof Error ? err.message : String(err) };
  }
}

/** One block of a run shared among threads (shared/engine/mcm/run-in-blocks.ts). */
export type McmBlockTask = BlockTask & { nice?: number };
/** The block's model values (moved, not copied, to the caller), or the engine's refusal. */
export type McmBlockResult = Float64Array | { code: string; message: string };

// The blocks of one run arrive one after another with the same document: keep its compiled model
// and the sampler's column buffers (5 MiB for ten inputs) for the next block.
const recent = new Map<string, { model: ReturnType<typeof compileModel>; reuse: { sampler?: TrialSampler } }>();

export function runMcmBlock(task: McmBlockTask): McmBlockResult {
  if (task.nice) lowerThreadPriority(task.nice);
  try {
    const key = JSON.stringify(task.doc);
    let entry = recent.get(key);
    if (!entry) {
      entry = { model: compileModel(task.doc), reuse: {} };
      recent.clear();
      recent.set(key, entry);
    }
    return computeBlock(task, entry.model, entry.reuse);
  } catch (err) {
    if (err instanceof EngineError) return { code: err.code, message: err.message };
    return { code: 'WORKER_FAILED', message: err instanceof Error ? err.message : String(err) };
  }
}

export default taskHandler({
  'monte-carlo': (payload: McmTask) => runMcm(payload),
  'monte-carlo-block': (payload: McmBlockTask) => {
    const r = runMcmBlock(payload);
    return r instanceof Float64Array ? move(r) : r;
  },
});
