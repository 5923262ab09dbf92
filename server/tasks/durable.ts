/**
 * The durable task runner: a job queue in PostgreSQL (pg-boss 10, its own `pgboss` schema) shared
 * by every app instance on the database, plus one `task_runs` row per task that every instance
 * reads (server/db/schema/tasks.ts).
 *
 * - Sharing: each instance runs queue workers (pg-boss fetches with SELECT … FOR UPDATE SKIP
 *   LOCKED, so one job goes to one worker); the computation itself runs in the instance's own
 *   piscina pool. A submit sends NOTIFY so idle workers on every instance fetch at once instead of
 *   at their next poll.
 * - Restart: a queued job is a row in the database and waits for any instance. An instance that
 *   stops gracefully stops its running jobs at the next chunk and hands them back to the queue
 *   (pg-boss retry); one that dies leaves its job active until pg-boss expires it (expireIn) and
 *   retries it elsewhere.
 * - Exactly once: delivery is at-least-once (pg-boss), so the completion step is guarded: it locks
 *   the task_runs row (FOR UPDATE), runs the kind's completion hook only while the task is not
 *   final, and marks it done with `completions = completions + 1` in the same transaction. A
 *   second delivery of a finished task finds it final and does nothing.
 *   The hook receives that transaction; a hook that writes through its own transaction instead
 *   commits just before the mark, so only a crash between those two commits could repeat it.
 * - Progress: the working instance writes progress to the row and NOTIFYs `emberline_tasks`
 *   (a few times a second); every instance LISTENs and forwards to its subscribers. Final events
 *   are read back from the row (the result is stored there), and subscribers also re-read their
 *   rows every few seconds so a lost notification only delays an event.
 * - Cancel: sets `cancel_requested`; a queued task is cancelled at once, a running one sees the
 *   flag at its next progress write and the engine stops between chunks.
 */
import crypto from 'node:crypto';
import os from 'node:os';
import { and, eq, inArray, lt, sql } from 'drizzle-orm';
import pg from 'pg';
import PgBoss from 'pg-boss';
import type { Db } from '../db/client';
import { taskRuns, type TaskRunRow } from '../db/schema/tasks';
import type { Logger } from '../logger';
import type { WorkerPool } from '../workers/pool';
import { MCM_SHARED_BYTES, MCM_SLOT, type McmTaskResult } from '../workers/mcm.worker';
import { runToEnd, type CompletionHook, type SubmitOptions, type TaskEvent, type TaskInfo, type TaskKind, type TaskKinds, type TaskRunner, type TaskStatus, TASK_KINDS } from './types';

export const TASK_CHANNEL = 'emberline_tasks';
const QUEUE: Record<TaskKind, string> = { 'monte-carlo': 'emberline-monte-carlo', 'certificate-pdf': 'emberline-certificate-pdf' };
const KIND_OF_QUEUE = new Map(Object.entries(QUEUE).map(([k, q]) => [q, k as TaskKind]));
/** Longest a single attempt may run before pg-boss gives it to another worker. */
const EXPIRE_SECONDS: Record<TaskKind, number> = { 'monte-carlo': 15 * 60, 'certificate-pdf': 5 * 60 };
const PROGRESS_EVERY_MS = 200;
const RESYNC_EVERY_MS = 2000;
const FINAL: TaskStatus[] = ['done', 'failed', 'cancelled'];
/** Finished task rows are deleted after a day (results that matter are stored by the completion hook). */
const KEEP_FINISHED_MS = 24 * 3600_000;

export type DurableRunnerOptions = {
  connectionString: string;
  db: Db;
  pool: () => WorkerPool;
  logger: Logger;
  /** Jobs of each kind this instance runs at once (default: half the cores, at least 1). */
  concurrency?: number;
  /** false: submit and subscribe only, never take work (default true). */
  work?: boolean;
  /** Names this instance in task_runs.started_by / finished_by. */
  instanceId?: string;
  /** Nice value of the Monte Carlo worker threads (MONTE_CARLO_NICE; 0 or omitted: unchanged). */
  monteCarloNice?: number;
};

type Notice = { id: string; type: 'queued' | 'progress' | 'final'; done?: number; target?: number; elapsedMs?: number };
type Listener = (ev: TaskEvent) => void;

export function createDurableRunner(opts: DurableRunnerOptions): TaskRunner & { instanceId: string } {
  const { db, logger } = opts;
  const instanceId = opts.instanceId ?? `${os.hostname()}:${process.pid}:${crypto.randomBytes(3).toString('hex')}`;
  const concurrency = opts.concurrency ?? Math.max(1, Math.floor(os.availableParallelism() / 2));
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  const hooks = new Map<TaskKind, CompletionHook<any>>();
  const subscribers = new Map<string, Set<Listener>>();
  /** Jobs running here: id → stop it (the engine returns CANCELLED at its next chunk). */
  const running = new Map<string, () => void>();
  const workerIds: string[] = [];
  let boss: PgBoss | null = null;
  let listener: pg.Client | null = null;
  let starting: Promise<void> | null = null;
  let stopping = false;
  let resync: NodeJS.Timeout | null = null;
  let prune: NodeJS.Timeout | null = null;

  // --- notifications -------------------------------------------------------------------------

  async function notify(n: Notice) {
    await db.execute(sql`SELECT pg_notify(${TASK_CHANNEL}, ${JSON.stringify(n)})`);
  }

  async function listen() {
    const client = new pg.Client({ connectionString: opts.connectionString, application_name: 'emberline-tasks-listen' });
    client.on('error', (err) => {
      logger.warn('task notifications: connection lost, reconnecting', { error: err });
      listener = null;
      if (!stopping) setTimeout(() => void listen().catch((e) => logger.error('task notifications: reconnect failed', { error: e })), 1000).unref();
    });
    client.on('notification', (msg) => {
      if (msg.channel !== TASK_CHANNEL || !msg.payload) return;
      let n: Notice;
      try {
        n = JSON.parse(msg.payload) as Notice;
      } catch {
        return;
      }
      if (n.type === 'queued') {
        for (const w of workerIds) boss?.notifyWorker(w);
        return;
      }
      const subs = subscribers.get(n.id);
      if (!subs) return;
      if (n.type === 'progress') emit(n.id, { type: 'progress', done: n.done ?? 0, target: n.target ?? 0, elapsedMs: n.elapsedMs ?? 0 });
      else void refresh([n.id]);
    });
    await client.connect();
    await client.query(`LISTEN ${TASK_CHANNEL}`);
    listener = client;
  }

  function emit(id: string, ev: TaskEvent) {
    const subs = subscribers.get(id);
    if (!subs) return;
    for (const fn of [...subs]) fn(ev);
    if (ev.type !== 'progress') subscribers.delete(id);
  }

  /** Re-reads rows and delivers final events (after a "final" notice, and periodically). */
  async function refresh(ids: string[]) {
    if (!ids.length) return;
    const rows = await db.select().from(taskRuns).where(inArray(taskRuns.id, ids));
    for (const row of rows) {
      if (FINAL.includes(row.state)) emit(row.id, eventOf(row));
    }
  }

  // --- rows ----------------------------------------------------------------------------------

  function encodeResult(kind: TaskKind, result: unknown): unknown {
    return kind === 'certificate-pdf' ? { pdfBase64: (result as Buffer).toString('base64') } : result;
  }
  function decodeResult(kind: TaskKind, stored: unknown): unknown {
    return kind === 'certificate-pdf' ? Buffer.from((stored as { pdfBase64: string }).pdfBase64, 'base64') : stored;
  }

  function eventOf(row: TaskRunRow): TaskEvent {
    const elapsedMs = row.elapsedMs ?? (row.startedAt ? Date.now() - row.startedAt.getTime() : 0);
    switch (row.state) {
      case 'done':
        return { type: 'done', result: decodeResult(row.kind as TaskKind, row.result) as never, elapsedMs };
      case 'cancelled':
        return { type: 'cancelled', done: row.progressDone, elapsedMs };
      case 'failed':
        return { type: 'failed', code: row.errorCode ?? 'FAILED', message: row.errorMessage ?? 'The task failed.', elapsedMs };
      default:
        return { type: 'progress', done: row.progressDone, target: row.progressTarget, elapsedMs };
    }
  }

  function infoOf(row: TaskRunRow): TaskInfo {
    return { id: row.id, kind: row.kind as TaskKind, subject: row.subject, ownerId: row.ownerId, status: row.state, last: eventOf(row) };
  }

  async function row(id: string): Promise<TaskRunRow | null> {
    const [r] = await db.select().from(taskRuns).where(eq(taskRuns.id, id));
    return r ?? null;
  }

  /** Moves a task that is not final yet to a final state other than done; false if it was final. */
  async function finalize(id: string, state: 'failed' | 'cancelled', fields: { errorCode?: string; errorMessage?: string; elapsedMs?: number } = {}) {
    const changed = await db
      .update(taskRuns)
      .set({ state, errorCode: fields.errorCode ?? null, errorMessage: fields.errorMessage ?? null, elapsedMs: fields.elapsedMs ?? null, finishedAt: new Date(), finishedBy: instanceId })
      .where(and(eq(taskRuns.id, id), inArray(taskRuns.state, ['queued', 'active'])))
      .returning({ id: taskRuns.id });
    if (changed.length) await notify({ id, type: 'final' });
    return changed.length > 0;
  }

  /** The exactly-once step: hook + mark done in one transaction over the locked row. */
  async function complete<K extends TaskKind>(id: string, kind: K, payload: TaskKinds[K]['payload'], result: TaskKinds[K]['result'], elapsedMs: number) {
    let marked = false;
    try {
      await db.transaction(async (tx) => {
        const [r] = await tx.select({ state: taskRuns.state, target: taskRuns.progressTarget }).from(taskRuns).where(eq(taskRuns.id, id)).for('update');
        if (!r || FINAL.includes(r.state)) return;
        const hook = hooks.get(kind);
        if (hook) await hook(payload, result, tx);
        await tx
          .update(taskRuns)
          .set({ state: 'done', result: encodeResult(kind, result), completions: sql`${taskRuns.completions} + 1`, progressDone: r.target, elapsedMs, finishedAt: new Date(), finishedBy: instanceId })
          .where(eq(taskRuns.id, id));
        marked = true;
      });
    } catch (err) {
      logger.error('storing a task result failed', { kind, taskId: id, error: err });
      await finalize(id, 'failed', { errorCode: 'STORE_FAILED', errorMessage: 'The result could not be stored. Run it again.', elapsedMs });
      return;
    }
    if (marked) await notify({ id, type: 'final' });
  }

  // --- the queue worker ----------------------------------------------------------------------

  async function handle(job: PgBoss.Job<{ payload: unknown }>) {
    const kind = KIND_OF_QUEUE.get(job.name);
    if (!kind) throw new Error(`unknown queue ${job.name}`);
    const id = job.id;
    const [claimed] = await db
      .update(taskRuns)
      .set({ state: 'active', attempts: sql`${taskRuns.attempts} + 1`, startedBy: instanceId, startedAt: new Date() })
      .where(and(eq(taskRuns.id, id), inArray(taskRuns.state, ['queued', 'active'])))
      .returning({ cancelRequested: taskRuns.cancelRequested, target: taskRuns.progressTarget });
    if (!claimed) return; // finished (or removed) already: a repeated delivery
    if (claimed.cancelRequested) {
      await finalize(id, 'cancelled', { elapsedMs: 0 });
      return;
    }
    const started = performance.now();
    const elapsed = () => Math.round(performance.now() - started);
    await notify({ id, type: 'progress', done: 0, target: claimed.target, elapsedMs: 0 });

    if (kind === 'monte-carlo') {
      const payload = job.data.payload as TaskKinds['monte-carlo']['payload'];
      const shared = new SharedArrayBuffer(MCM_SHARED_BYTES);
      const slots = new BigInt64Array(shared);
      Atomics.store(slots, MCM_SLOT.target, BigInt(payload.trials));
      let cancelledByUser = false;
      const stop = () => Atomics.store(slots, MCM_SLOT.cancel, 1n);
      running.set(id, stop);
      let lastDone = -1;
      let writing = false;
      const tick = setInterval(() => {
        if (writing) return;
        const done = Number(Atomics.load(slots, MCM_SLOT.done));
        const target = Number(Atomics.load(slots, MCM_SLOT.target));
        if (done === lastDone) return;
        lastDone = done;
        writing = true;
        void (async () => {
          const [r] = await db.update(taskRuns).set({ progressDone: done, progressTarget: target }).where(eq(taskRuns.id, id)).returning({ cancel: taskRuns.cancelRequested });
          if (r?.cancel) {
            cancelledByUser = true;
            stop();
          }
          await notify({ id, type: 'progress', done, target, elapsedMs: elapsed() });
        })()
          .catch((err) => logger.warn('task progress could not be written', { taskId: id, error: err }))
          .finally(() => (writing = false));
      }, PROGRESS_EVERY_MS);
      let out: McmTaskResult;
      try {
        out = (await opts.pool().runTask('monte-carlo', { doc: payload.doc, trials: payload.trials, seed: payload.seed, shared, nice: opts.monteCarloNice ?? 0 })) as McmTaskResult;
      } catch (err) {
        logger.error('Monte Carlo worker failed', { taskId: id, error: err });
        out = { ok: false, code: 'WORKER_FAILED', message: 'The calculation stopped unexpectedly. Run it again.' };
      } finally {
        clearInterval(tick);
        running.delete(id);
      }
      if (out.ok) return complete(id, 'monte-carlo', payload, out.result, elapsed());
      if (out.code === 'CANCELLED' && !cancelledByUser && stopping) return handBack(job, id);
      if (out.code === 'CANCELLED') return void (await finalize(id, 'cancelled', { elapsedMs: elapsed() }));
      return void (await finalize(id, 'failed', { errorCode: out.code, errorMessage: out.message, elapsedMs: elapsed() }));
    }

    const payload = job.data.payload as TaskKinds['certificate-pdf']['payload'];
    let pdf: Buffer;
    try {
      pdf = await opts.pool().renderCertificate(payload);
    } catch (err) {
      logger.error('certificate rendering failed', { taskId: id, error: err });
      await finalize(id, 'failed', { errorCode: 'RENDER_FAILED', errorMessage: err instanceof Error ? err.message : String(err), elapsedMs: elapsed() });
      return;
    }
    await complete(id, 'certificate-pdf', payload, pdf, elapsed());
  }

  /** This instance is stopping: give the job back to the queue for another instance. */
  async function handBack(job: PgBoss.Job<unknown>, id: string) {
    await db.update(taskRuns).set({ state: 'queued', startedBy: null }).where(and(eq(taskRuns.id, id), eq(taskRuns.state, 'active')));
    await boss?.fail(job.name, id, { reason: `instance ${instanceId} stopped; handed back to the queue` });
    logger.info('task handed back to the queue on shutdown', { taskId: id });
  }

  // --- lifecycle -----------------------------------------------------------------------------

  async function doStart() {
    const b = new PgBoss({ connectionString: opts.connectionString, max: 4, application_name: 'emberline-tasks', schedule: false, retryLimit: 2, retryDelay: 0 });
    b.on('error', (err) => {
      if (!stopping) logger.warn('task queue error', { error: err });
    });
    try {
      await b.start();
      await createQueues(b);
      await listen();
    } catch (err) {
      await b.stop({ graceful: false, wait: true, timeout: 2000 }).catch(() => {});
      throw err;
    }
    boss = b;
    if (opts.work ?? true) {
      for (const kind of TASK_KINDS) {
        for (let i = 0; i < concurrency; i++) {
          let self = '';
          self = await b.work<{ payload: unknown }>(QUEUE[kind], { pollingIntervalSeconds: 2, batchSize: 1 }, async ([job]) => {
            try {
              await handle(job);
            } finally {
              // pg-boss waits out the polling interval after a fetch unless the worker is notified;
              // a worker that has just finished a task looks for the next one at once instead, so
              // a run queued behind another starts when that one ends, not up to 2 s later.
              if (self) b.notifyWorker(self);
            }
          });
          workerIds.push(self);
        }
      }
    }
    resync = setInterval(() => void refresh([...subscribers.keys()]).catch(() => {}), RESYNC_EVERY_MS);
    resync.unref();
    const pruneOld = () =>
      void db
        .delete(taskRuns)
        .where(and(inArray(taskRuns.state, FINAL), lt(taskRuns.finishedAt, new Date(Date.now() - KEEP_FINISHED_MS))))
        .catch((err) => logger.warn('old task rows could not be deleted', { error: err }));
    pruneOld();
    prune = setInterval(pruneOld, 3600_000);
    prune.unref();
    logger.info('durable task queue started', { instanceId, work: opts.work ?? true, concurrency });
  }

  /** pg-boss makes a table per queue; instances creating them at once can deadlock, so one at a time. */
  async function createQueues(b: PgBoss) {
    const lock = new pg.Client({ connectionString: opts.connectionString, application_name: 'emberline-tasks-setup' });
    lock.on('error', () => {});
    await lock.connect();
    try {
      await lock.query('SELECT pg_advisory_lock(hashtext($1))', ['emberline:task-queues']);
      for (const kind of TASK_KINDS) {
        if (await b.getQueue(QUEUE[kind])) continue;
        await b.createQueue(QUEUE[kind], { name: QUEUE[kind], policy: 'standard', retryLimit: 2, retryDelay: 0, expireInSeconds: EXPIRE_SECONDS[kind] });
      }
    } finally {
      await lock.query('SELECT pg_advisory_unlock(hashtext($1))', ['emberline:task-queues']).catch(() => {});
      await lock.end().catch(() => {});
    }
  }

  function ensureStarted(): Promise<void> {
    if (stopping) return Promise.reject(new Error('The task runner has been stopped.'));
    starting ??= doStart().catch((err) => {
      starting = null;
      throw err;
    });
    return starting;
  }

  const runner: TaskRunner & { instanceId: string } = {
    mode: 'durable',
    instanceId,

    async submit(kind, payload, o: SubmitOptions = {}) {
      await ensureStarted();
      const id = crypto.randomUUID();
      const target = kind === 'monte-carlo' ? (payload as TaskKinds['monte-carlo']['payload']).trials : 0;
      await db.insert(taskRuns).values({ id, kind, subject: o.subject ?? null, ownerId: o.ownerId ?? null, state: 'queued', progressTarget: target });
      try {
        await boss!.send(QUEUE[kind], { payload: encodePayload(kind, payload) }, { id, retryLimit: 2, retryDelay: 0, expireInSeconds: EXPIRE_SECONDS[kind] });
      } catch (err) {
        await db.delete(taskRuns).where(eq(taskRuns.id, id));
        throw err;
      }
      await notify({ id, type: 'queued' });
      return id;
    },

    subscribe(taskId, onEvent) {
      let active = true;
      const fn: Listener = (ev) => {
        if (!active) return;
        if (ev.type !== 'progress') active = false;
        onEvent(ev as never);
      };
      let set = subscribers.get(taskId);
      if (!set) subscribers.set(taskId, (set = new Set()));
      set.add(fn);
      // The current state, read after this listener is in place (a final notice in between is
      // then also seen through the row).
      void ensureStarted()
        .then(() => row(taskId))
        .then((r) => {
          if (!r) return fn({ type: 'failed', code: 'NOT_FOUND', message: 'There is no such task.', elapsedMs: 0 });
          fn(eventOf(r));
        })
        .catch((err) => {
          logger.error('reading a task failed', { taskId, error: err });
          fn({ type: 'failed', code: 'UNAVAILABLE', message: 'The task state could not be read.', elapsedMs: 0 });
        })
        .finally(() => {
          if (!active) unsubscribe();
        });
      const unsubscribe = () => {
        active = false;
        const s = subscribers.get(taskId);
        s?.delete(fn);
        if (s && !s.size) subscribers.delete(taskId);
      };
      return unsubscribe;
    },

    async cancel(taskId) {
      await ensureStarted();
      const [r] = await db
        .update(taskRuns)
        .set({ cancelRequested: true })
        .where(and(eq(taskRuns.id, taskId), inArray(taskRuns.state, ['queued', 'active'])))
        .returning({ kind: taskRuns.kind, state: taskRuns.state });
      if (!r) return;
      running.get(taskId)?.();
      if (r.state === 'queued') {
        const [gone] = await db.update(taskRuns).set({ state: 'cancelled', finishedAt: new Date(), finishedBy: instanceId, elapsedMs: 0 }).where(and(eq(taskRuns.id, taskId), eq(taskRuns.state, 'queued'))).returning({ id: taskRuns.id });
        if (gone) {
          await boss!.cancel(QUEUE[r.kind as TaskKind], taskId).catch(() => {});
          await notify({ id: taskId, type: 'final' });
        }
      }
    },

    async get(taskId) {
      await ensureStarted();
      const r = await row(taskId);
      return r ? infoOf(r) : null;
    },

    async findActive(kind, subject) {
      await ensureStarted();
      const [r] = await db
        .select()
        .from(taskRuns)
        .where(and(eq(taskRuns.kind, kind), eq(taskRuns.subject, subject), inArray(taskRuns.state, ['queued', 'active'])))
        .limit(1);
      return r ? infoOf(r) : null;
    },

    onComplete(kind, hook) {
      hooks.set(kind, hook);
    },

    run: (kind, payload, o) => runToEnd(runner, kind, payload, o),

    start: ensureStarted,

    async stop() {
      if (stopping) return;
      stopping = true;
      if (resync) clearInterval(resync);
      if (prune) clearInterval(prune);
      await starting?.catch(() => {});
      for (const stopJob of running.values()) stopJob();
      await boss?.stop({ graceful: true, wait: true, timeout: 8_000 });
      await listener?.end().catch(() => {});
      listener = null;
    },
  };
  return runner;
}

/** Payloads go into a jsonb column: a Monte Carlo payload is plain JSON already. */
function encodePayload(_kind: TaskKind, payload: unknown): unknown {
  return payload;
}
