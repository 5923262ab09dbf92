/**
 * The worker side of the pool: a worker file's default export is `taskHandler({ name: fn })`,
 * and the pool sends `{ task, payload }` to it (see ./pool.ts for how tasks map to files).
 */

// Payloads arrive structured-cloned from the main thread; each task validates its own.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type TaskFunctions = Record<string, (payload: any) => unknown>;

export interface TaskMessage {
  task: string;
  payload: unknown;
}

export function taskHandler(tasks: TaskFunctions): (message: TaskMessage) => Promise<unknown> {
  return async ({ task, payload }) => {
    const fn = Object.hasOwn(tasks, task) ? tasks[task] : undefined;
    if (!fn) throw new Error(`This worker has no task "${task}" (it has: ${Object.keys(tasks).join(', ')}).`);
    return fn(payload);
  };
}
