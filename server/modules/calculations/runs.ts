/**
 * Monte Carlo runs in the worker pool. A run has an id; its progress (trials done, target,
 * elapsed) is read from the shared buffer the worker writes and pushed to listeners (the SSE
 * stream); cancelling sets the flag the worker polls between chunks. Finished runs are kept for
 * a few minutes so a late listener still gets the final event.
 */
import crypto from 'node:crypto';
import { EventEmitter } from 'node:events';
import type { EvaluationResult } from '../../../shared/engine';
import type { WorkerPool } from '../../workers/pool';
import { MCM_SHARED_BYTES, MCM_SLOT, type McmTaskResult } from '../../workers/mcm.worker';
import type { Logger } from '../../logger';

export type RunState = 'running' | 'done' | 'cancelled' | 'failed';

export type RunEvent =
  | { type: 'progress'; done: number; target: number; elapsedMs: number }
  | { type: 'done'; result: EvaluationResult; elapsedMs: number }
  | { type: 'cancelled'; done: number; elapsedMs: number }
  | { type: 'failed'; message: string; code: string; elapsedMs: number };

export type Run = {
  id: string;
  pointId: string;
  ownerId: string;
  trials: number;
  seed: number;
  state: RunState;
  startedAt: number;
  last: RunEvent;
  events: EventEmitter;
  cancel(): void;
};

const KEEP_FINISHED_MS = 10 * 60_000;
const PROGRESS_EVERY_MS = 150;

export function createRunRegistry(deps: { pool: () => WorkerPool; logger: Logger; now?: () => number }) {
  const runs = new Map<string, Run>();
  const now = deps.now ?? (() => performance.now());

  function finish(run: Run, event: RunEvent) {
    run.last = event;
    run.state = event.type === 'done' ? 'done' : event.type === 'cancelled' ? 'cancelled' : 'failed';
    run.events.emit('event', event);
    setTimeout(() => runs.delete(run.id), KEEP_FINISHED_MS).unref();
  }

  return {
    get: (id: string) => runs.get(id) ?? null,

    activeFor(pointId: string): Run | null {
      for (const r of runs.values()) if (r.pointId === pointId && r.state === 'running') return r;
      return null;
    },

    /**
     * Starts a run; `onResult` stores the result before the final event goes out, so a client
     * that reloads on "done" reads the stored result.
     */
    start(args: { pointId: string; ownerId: string; doc: unknown; trials: number; seed: number; onResult: (r: EvaluationResult) => Promise<void> }): Run {
      const shared = new SharedArrayBuffer(MCM_SHARED_BYTES);
      const slots = new BigInt64Array(shared);
      Atomics.store(slots, MCM_SLOT.target, BigInt(args.trials));
      const startedAt = now();
      const run: Run = {
        id: crypto.randomUUID(),
        pointId: args.pointId,
        ownerId: args.ownerId,
        trials: args.trials,
        seed: args.seed,
        state: 'running',
        startedAt,
        last: { type: 'progress', done: 0, target: args.trials, elapsedMs: 0 },
        events: new EventEmitter(),
        cancel: () => Atomics.store(slots, MCM_SLOT.cancel, 1n),
      };
      run.events.setMaxListeners(50);
      runs.set(run.id, run);

      const tick = setInterval(() => {
        if (run.state !== 'running') return;
        const ev: RunEvent = { type: 'progress', done: Number(Atomics.load(slots, MCM_SLOT.done)), target: Number(Atomics.load(slots, MCM_SLOT.target)), elapsedMs: Math.round(now() - startedAt) };
        if (run.last.type === 'progress' && run.last.done === ev.done && ev.done !== 0) return;
        run.last = ev;
        run.events.emit('event', ev);
      }, PROGRESS_EVERY_MS);

      const elapsed = () => Math.round(now() - startedAt);
      deps
        .pool()
        .runTask('monte-carlo', { doc: args.doc, trials: args.trials, seed: args.seed, shared })
        .then(async (out) => {
          clearInterval(tick);
          const r = out as McmTaskResult;
          if (r.ok) {
            try {
              await args.onResult(r.result);
              finish(run, { type: 'done', result: r.result, elapsedMs: elapsed() });
            } catch (err) {
              deps.logger.error('storing a Monte Carlo result failed', { error: err });
              finish(run, { type: 'failed', code: 'STORE_FAILED', message: 'The result could not be stored. Run it again.', elapsedMs: elapsed() });
            }
          } else if (r.code === 'CANCELLED') {
            finish(run, { type: 'cancelled', done: Number(Atomics.load(slots, MCM_SLOT.done)), elapsedMs: elapsed() });
          } else {
            finish(run, { type: 'failed', code: r.code, message: r.message, elapsedMs: elapsed() });
          }
        })
        .catch((err: unknown) => {
          clearInterval(tick);
          deps.logger.error('Monte Carlo worker failed', { error: err });
          finish(run, { type: 'failed', code: 'WORKER_FAILED', message: 'The calculation stopped unexpectedly. Run it again.', elapsedMs: elapsed() });
        });
      return run;
    },
  };
}

export type RunRegistry = ReturnType<typeof createRunRegistry>;
