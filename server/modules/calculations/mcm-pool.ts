/**
 * The worker pool Monte Carlo runs in: the app's pool when AppDeps carries one (`workers`),
 * otherwise one created on first use for the process.
 */
import type { AppDeps } from '../../context';
import { createWorkerPool, type WorkerPool } from '../../workers/pool';

let own: WorkerPool | null = null;

export function sharedMcmPool(deps: AppDeps): WorkerPool {
  const given = (deps as AppDeps & { workers?: WorkerPool }).workers;
  if (given) return given;
  own ??= createWorkerPool();
  return own;
}

/** Ends the pool created here, if any (benchmarks, tools). */
export async function sharedMcmPoolForShutdown(): Promise<void> {
  await own?.destroy();
  own = null;
}
