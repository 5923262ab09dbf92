/**
 * Picks the task runner from the configuration (TASK_QUEUE, see .env.example):
 * - `in-process`: this process's worker pool (the only choice with PGlite);
 * - `pgboss`: the durable queue in PostgreSQL (needs DATABASE_URL);
 * - `auto` (default): `pgboss` when DATABASE_URL is set, else `in-process`.
 */
import type { Config } from '../config/env';
import type { Database } from '../db/client';
import type { Logger } from '../logger';
import { createWorkerPool, type WorkerPool } from '../workers/pool';
import { createDurableRunner } from './durable';
import { createInProcessRunner } from './in-process';
import type { TaskRunner } from './types';

export * from './types';
export { createDurableRunner } from './durable';
export { createInProcessRunner } from './in-process';

let processPool: WorkerPool | null = null;

/** One worker pool per process, shared by every runner in it (tests open many apps). */
export function processWorkerPool(): WorkerPool {
  processPool ??= createWorkerPool();
  return processPool;
}

export function taskQueueMode(config: Pick<Config, 'taskQueue' | 'databaseUrl'>): 'in-process' | 'durable' {
  if (config.taskQueue === 'in-process') return 'in-process';
  if (config.taskQueue === 'pgboss') return 'durable';
  return config.databaseUrl ? 'durable' : 'in-process';
}

export function createTaskRunner(opts: { config: Config; database: Database; logger: Logger; pool?: () => WorkerPool }): TaskRunner {
  const pool = opts.pool ?? processWorkerPool;
  if (taskQueueMode(opts.config) === 'durable') {
    if (!opts.config.databaseUrl || opts.database.kind !== 'postgres') throw new Error('TASK_QUEUE=pgboss needs DATABASE_URL (a PostgreSQL server).');
    return createDurableRunner({ connectionString: opts.config.databaseUrl, db: opts.database.db, pool, logger: opts.logger, concurrency: opts.config.taskConcurrency, monteCarloNice: opts.config.monteCarloNice });
  }
  return createInProcessRunner({ pool, db: opts.database.db, logger: opts.logger, monteCarloNice: opts.config.monteCarloNice });
}
