/**
 * Monte Carlo runs of calibration points over the task runner: the shape the runs routes use
 * (modules/calculations: get a run, is one active for a point, start one), whichever runner is
 * configured. With the durable runner the run may be started on one instance, computed on a
 * second and watched (SSE) from a third, so every lookup reads the runner, and a run's `events`
 * emitter subscribes to the runner while someone listens to it.
 */
import { EventEmitter } from 'node:events';
import type { EvaluationResult } from '../../shared/engine';
import type { TaskEvent, TaskInfo, TaskRunner } from './types';

export type PointRunState = 'running' | 'done' | 'cancelled' | 'failed';

export type PointRun = {
  id: string;
  pointId: string;
  ownerId: string;
  trials: number;
  seed: number;
  state: PointRunState;
  last: TaskEvent<'monte-carlo'>;
  /** Emits 'event' with each TaskEvent while the run is watched. */
  events: EventEmitter;
  cancel(): void;
};

/** What the completion step needs to store a result; carried in the task payload. */
export type PointRunContext = { pointId: string; readAt: string; actor: unknown };

export type StorePointResult<A> = (pointId: string, result: EvaluationResult, readAt: Date, actor: A) => Promise<void>;

export function createPointRuns<A>(tasks: TaskRunner, store: StorePointResult<A>) {
  tasks.onComplete('monte-carlo', async (payload, result) => {
    const c = payload.context as PointRunContext | undefined;
    if (c?.pointId) await store(c.pointId, result, new Date(c.readAt), c.actor as A);
  });

  function toRun(info: TaskInfo, extra: { trials?: number; seed?: number } = {}): PointRun {
    const events = new EventEmitter();
    events.setMaxListeners(50);
    let off: (() => void) | null = null;
    const run: PointRun = {
      id: info.id,
      pointId: info.subject ?? '',
      ownerId: info.ownerId ?? '',
      trials: extra.trials ?? (info.last.type === 'progress' ? info.last.target : 0),
      seed: extra.seed ?? 0,
      state: info.status === 'queued' || info.status === 'active' ? 'running' : info.status,
      last: info.last as TaskEvent<'monte-carlo'>,
      events,
      cancel: () => void tasks.cancel(info.id).catch(() => {}),
    };
    // Subscribe to the runner while the emitter has listeners.
    events.on('newListener', (name) => {
      if (name !== 'event' || off) return;
      queueMicrotask(() => {
        if (off || !events.listenerCount('event')) return;
        off = tasks.subscribe<'monte-carlo'>(info.id, (ev) => {
          run.last = ev;
          if (ev.type !== 'progress') run.state = ev.type;
          events.emit('event', ev);
        });
      });
    });
    events.on('removeListener', (name) => {
      if (name === 'event' && !events.listenerCount('event') && off) {
        off();
        off = null;
      }
    });
    return run;
  }

  return {
    async get(id: string): Promise<PointRun | null> {
      const info = await tasks.get(id);
      return info && info.kind === 'monte-carlo' ? toRun(info) : null;
    },

    async activeFor(pointId: string): Promise<PointRun | null> {
      const info = await tasks.findActive('monte-carlo', pointId);
      return info ? toRun(info) : null;
    },

    /** Queues a run; its result is stored by `store` (on whichever instance computes it) before "done". */
    async start(args: { pointId: string; ownerId: string; doc: unknown; trials: number; seed: number; readAt: Date; actor: A }): Promise<PointRun> {
      const context: PointRunContext = { pointId: args.pointId, readAt: args.readAt.toISOString(), actor: args.actor };
      const id = await tasks.submit('monte-carlo', { doc: args.doc, trials: args.trials, seed: args.seed, context }, { subject: args.pointId, ownerId: args.ownerId });
      const info = (await tasks.get(id)) ?? { id, kind: 'monte-carlo' as const, subject: args.pointId, ownerId: args.ownerId, status: 'queued' as const, last: { type: 'progress' as const, done: 0, target: args.trials, elapsedMs: 0 } };
      return toRun(info, { trials: args.trials, seed: args.seed });
    },
  };
}

export type PointRuns = ReturnType<typeof createPointRuns>;
