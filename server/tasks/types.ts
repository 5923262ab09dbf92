/**
 * The task runner: CPU-bound background work (Monte Carlo propagation, certificate PDF rendering)
 * behind one interface with two implementations —
 * - in-process (./in-process.ts): the piscina worker pool of this process; the default, and the
 *   only choice with the embedded PGlite database;
 * - durable (./durable.ts): a job queue in PostgreSQL (pg-boss) shared by every app instance on
 *   that database; a queued task survives a restart, a task's completion step runs exactly once,
 *   and progress made on one instance reaches subscribers on another (LISTEN/NOTIFY + task_runs).
 * ./index.ts picks one from the configuration (TASK_QUEUE, DATABASE_URL).
 */
import type { EvaluationResult } from '../../shared/engine';
import type { CertificateData } from '../../shared/schemas/certificate.schema';
import type { Db } from '../db/client';

/** A Monte Carlo run of one budget document (JCGM 101 §7) and what to do with its result. */
export type MonteCarloPayload = {
  doc: unknown;
  trials: number;
  seed: number;
  /** Passed back to the completion hook (point id, when the budget was read, who started it). */
  context?: Record<string, unknown>;
};

export type TaskKinds = {
  'monte-carlo': { payload: MonteCarloPayload; result: EvaluationResult };
  'certificate-pdf': { payload: CertificateData; result: Buffer };
};
export type TaskKind = keyof TaskKinds;
export const TASK_KINDS: readonly TaskKind[] = ['monte-carlo', 'certificate-pdf'];

export type TaskEvent<K extends TaskKind = TaskKind> =
  | { type: 'progress'; done: number; target: number; elapsedMs: number }
  | { type: 'done'; result: TaskKinds[K]['result']; elapsedMs: number }
  | { type: 'cancelled'; done: number; elapsedMs: number }
  | { type: 'failed'; code: string; message: string; elapsedMs: number };

export type TaskStatus = 'queued' | 'active' | 'done' | 'failed' | 'cancelled';

export type TaskInfo = {
  id: string;
  kind: TaskKind;
  subject: string | null;
  ownerId: string | null;
  status: TaskStatus;
  /** The latest event (progress while queued or active, else the final one). */
  last: TaskEvent;
};

export type SubmitOptions = {
  /** What the task is about (e.g. a calibration point id): `findActive(kind, subject)`. */
  subject?: string;
  /** The user who asked for it (for "only the owner may cancel"). */
  ownerId?: string;
};

/**
 * Runs when a task's result is in, before subscribers hear "done" (so a client that reloads on
 * "done" reads the stored result). With the durable runner it runs on the instance that did the
 * work — possibly not the one that submitted — so it is registered per kind, not per call, and
 * receives the payload's `context`. `tx` is the transaction that marks the task done.
 */
export type CompletionHook<K extends TaskKind> = (payload: TaskKinds[K]['payload'], result: TaskKinds[K]['result'], tx: Db) => Promise<void>;

export interface TaskRunner {
  readonly mode: 'in-process' | 'durable';
  /** Queues a task; resolves with its id once it is queued (durably, for the durable runner). */
  submit<K extends TaskKind>(kind: K, payload: TaskKinds[K]['payload'], opts?: SubmitOptions): Promise<string>;
  /**
   * Calls `onEvent` with the current state at once, then with each progress event and the final
   * one (done, failed or cancelled). Returns the unsubscribe function.
   */
  subscribe<K extends TaskKind>(taskId: string, onEvent: (event: TaskEvent<K>) => void): () => void;
  /** Asks the task to stop (a queued one is dropped, a running one stops at its next chunk). */
  cancel(taskId: string): Promise<void>;
  get(taskId: string): Promise<TaskInfo | null>;
  /** A queued or active task of that kind about that subject, if any. */
  findActive(kind: TaskKind, subject: string): Promise<TaskInfo | null>;
  /** Registers the completion step of a kind (one per kind; a later call replaces it). */
  onComplete<K extends TaskKind>(kind: K, hook: CompletionHook<K>): void;
  /** Submits, waits for the end and returns the result (rejects with a TaskFailedError). */
  run<K extends TaskKind>(kind: K, payload: TaskKinds[K]['payload'], opts?: SubmitOptions): Promise<TaskKinds[K]['result']>;
  /** Starts taking work (durable: the queue workers). Idempotent; submit starts it too. */
  start(): Promise<void>;
  stop(): Promise<void>;
}

export class TaskFailedError extends Error {
  constructor(
    readonly code: string,
    message: string,
  ) {
    super(message);
    this.name = 'TaskFailedError';
  }
}

export function isFinal(event: TaskEvent): boolean {
  return event.type !== 'progress';
}

/** Resolves with the final event of a task. */
export function waitForEnd<K extends TaskKind>(runner: TaskRunner, taskId: string): Promise<TaskEvent<K>> {
  return new Promise((resolve) => {
    let off: (() => void) | null = null;
    let ended = false;
    off = runner.subscribe<K>(taskId, (ev) => {
      if (ended || !isFinal(ev)) return;
      ended = true;
      resolve(ev);
      // subscribe may call back synchronously, before `off` is assigned.
      queueMicrotask(() => off?.());
    });
    if (ended) off();
  });
}

export async function runToEnd<K extends TaskKind>(runner: TaskRunner, kind: K, payload: TaskKinds[K]['payload'], opts?: SubmitOptions): Promise<TaskKinds[K]['result']> {
  const id = await runner.submit(kind, payload, opts);
  const ev = await waitForEnd<K>(runner, id);
  if (ev.type === 'done') return ev.result;
  if (ev.type === 'cancelled') throw new TaskFailedError('CANCELLED', 'The task was cancelled.');
  if (ev.type === 'failed') throw new TaskFailedError(ev.code, ev.message);
  throw new TaskFailedError('WORKER_FAILED', 'The task ended without a result.');
}
