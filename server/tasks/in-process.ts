/**
 * The in-process task runner: tasks run in this process's piscina worker pool and their state
 * lives in memory (the default; the only choice with PGlite). Monte Carlo progress is read from
 * the SharedArrayBuffer the worker writes (server/workers/mcm.worker.ts) and cancelling sets the
 * flag it polls between chunks. Finished tasks are kept ten minutes for late subscribers.
 */
import crypto from 'node:crypto';
import { EventEmitter } from 'node:events';
import type { Logger } from '../logger';
import type { WorkerPool } from '../workers/pool';
import { MCM_SHARED_BYTES, MCM_SLOT, type McmTaskResult } from '../workers/mcm.worker';
import type { Db } from '../db/client';
import { runToEnd, type CompletionHook, type SubmitOptions, type TaskEvent, type TaskInfo, type TaskKind, type TaskKinds, type TaskRunner, type TaskStatus } from './types';

const KEEP_FINISHED_MS = 10 * 60_000;
const PROGRESS_EVERY_MS = 150;

type Entry = {
  info: TaskInfo;
  events: EventEmitter;
  cancel: () => void;
};

export function createInProcessRunner(deps: {
  pool: () => WorkerPool;
  db: Db;
  logger: Logger;
  /** Nice value of the Monte Carlo worker threads (MONTE_CARLO_NICE; 0 or omitted: unchanged). */
  monteCarloNice?: number;
}): TaskRunner {
  const tasks = new Map<string, Entry>();
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  const hooks = new Map<TaskKind, CompletionHook<any>>();
  let stopped = false;

  function finish(entry: Entry, event: TaskEvent) {
    entry.info.last = event;
    entry.info.status = event.type === 'done' ? 'done' : (event.type as TaskStatus);
    entry.events.emit('event', event);
    setTimeout(() => tasks.delete(entry.info.id), KEEP_FINISHED_MS).unref();
  }

  async function complete<K extends TaskKind>(entry: Entry, kind: K, payload: TaskKinds[K]['payload'], result: TaskKinds[K]['result'], elapsed: () => number) {
    const hook = hooks.get(kind);
    try {
      if (hook) await hook(payload, result, deps.db);
      finish(entry, { type: 'done', result, elapsedMs: elapsed() });
    } catch (err) {
      deps.logger.error('storing a task result failed', { kind, taskId: entry.info.id, error: err });
      finish(entry, { type: 'failed', code: 'STORE_FAILED', message: 'The result could not be stored. Run it again.', elapsedMs: elapsed() });
    }
  }

  function startMonteCarlo(entry: Entry, payload: TaskKinds['monte-carlo']['payload']) {
    const shared = new SharedArrayBuffer(MCM_SHARED_BYTES);
    const slots = new BigInt64Array(shared);
    Atomics.store(slots, MCM_SLOT.target, BigInt(payload.trials));
    entry.cancel = () => Atomics.store(slots, MCM_SLOT.cancel, 1n);
    const startedAt = performance.now();
    const elapsed = () => Math.round(performance.now() - startedAt);
    entry.info.status = 'active';
    const tick = setInterval(() => {
      if (entry.info.status !== 'active') return;
      const ev: TaskEvent = { type: 'progress', done: Number(Atomics.load(slots, MCM_SLOT.done)), target: Number(Atomics.load(slots, MCM_SLOT.target)), elapsedMs: elapsed() };
      const last = entry.info.last;
      if (last.type === 'progress' && last.done === ev.done && ev.done !== 0) return;
      entry.info.last = ev;
      entry.events.emit('event', ev);
    }, PROGRESS_EVERY_MS);
    deps
      .pool()
      .runTask('monte-carlo', { doc: payload.doc, trials: payload.trials, seed: payload.seed, shared, nice: deps.monteCarloNice ?? 0 })
      .then(async (out) => {
        clearInterval(tick);
        const r = out as McmTaskResult;
        if (r.ok) await complete(entry, 'monte-carlo', payload, r.result, elapsed);
        else if (r.code === 'CANCELLED') finish(entry, { type: 'cancelled', done: Number(Atomics.load(slots, MCM_SLOT.done)), elapsedMs: elapsed() });
        else finish(entry, { type: 'failed', code: r.code, message: r.message, elapsedMs: elapsed() });
      })
      .catch((err: unknown) => {
        clearInterval(tick);
        deps.logger.error('Monte Carlo worker failed', { error: err });
        finish(entry, { type: 'failed', code: 'WORKER_FAILED', message: 'The calculation stopped unexpectedly. Run it again.', elapsedMs: elapsed() });
      });
  }

  function startPdf(entry: Entry, payload: TaskKinds['certificate-pdf']['payload']) {
    const startedAt = performance.now();
    const elapsed = () => Math.round(performance.now() - startedAt);
    entry.info.status = 'active';
    let cancelled = false;
    entry.cancel = () => (cancelled = true);
    deps
      .pool()
      .renderCertificate(payload)
      .then(async (pdf) => {
        if (cancelled) return finish(entry, { type: 'cancelled', done: 0, elapsedMs: elapsed() });
        await complete(entry, 'certificate-pdf', payload, pdf, elapsed);
      })
      .catch((err: unknown) => {
        deps.logger.error('certificate rendering failed', { error: err });
        finish(entry, { type: 'failed', code: 'RENDER_FAILED', message: err instanceof Error ? err.message : String(err), elapsedMs: elapsed() });
      });
  }

  const runner: TaskRunner = {
    mode: 'in-process',

    async submit(kind, payload, opts: SubmitOptions = {}) {
      if (stopped) throw new Error('The task runner has been stopped.');
      const id = crypto.randomUUID();
      const target = kind === 'monte-carlo' ? (payload as TaskKinds['monte-carlo']['payload']).trials : 0;
      const entry: Entry = {
        info: { id, kind, subject: opts.subject ?? null, ownerId: opts.ownerId ?? null, status: 'queued', last: { type: 'progress', done: 0, target, elapsedMs: 0 } },
        events: new EventEmitter(),
        cancel: () => {},
      };
      entry.events.setMaxListeners(50);
      tasks.set(id, entry);
      if (kind === 'monte-carlo') startMonteCarlo(entry, payload as TaskKinds['monte-carlo']['payload']);
      else startPdf(entry, payload as TaskKinds['certificate-pdf']['payload']);
      return id;
    },

    subscribe(taskId, onEvent) {
      const entry = tasks.get(taskId);
      if (!entry) {
        onEvent({ type: 'failed', code: 'NOT_FOUND', message: 'There is no such task.', elapsedMs: 0 });
        return () => {};
      }
      const listener = (ev: TaskEvent) => onEvent(ev as never);
      onEvent(entry.info.last as never);
      if (entry.info.status === 'queued' || entry.info.status === 'active') entry.events.on('event', listener);
      return () => entry.events.off('event', listener);
    },

    async cancel(taskId) {
      tasks.get(taskId)?.cancel();
    },

    async get(taskId) {
      const e = tasks.get(taskId);
      return e ? { ...e.info } : null;
    },

    async findActive(kind, subject) {
      for (const e of tasks.values()) {
        if (e.info.kind === kind && e.info.subject === subject && (e.info.status === 'queued' || e.info.status === 'active')) return { ...e.info };
      }
      return null;
    },

    onComplete(kind, hook) {
      hooks.set(kind, hook);
    },

    run: (kind, payload, opts) => runToEnd(runner, kind, payload, opts),

    async start() {},

    async stop() {
      stopped = true;
      for (const e of tasks.values()) if (e.info.status === 'active') e.cancel();
    },
  };
  return runner;
}
