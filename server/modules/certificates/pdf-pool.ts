/**
 * The worker pool certificate PDFs are rendered in: the app's pool when AppDeps carries one
 * (`workers`), otherwise one created on first use for the process (as modules/calculations does).
 */
import type { AppDeps } from '../../context';
import { createWorkerPool, type WorkerPool } from '../../workers/pool';

let own: WorkerPool | null = null;

export function certificatePdfPool(deps: AppDeps): WorkerPool {
  const given = (deps as AppDeps & { workers?: WorkerPool }).workers;
  if (given) return given;
  own ??= createWorkerPool({ maxThreads: 1 });
  return own;
}
