/**
 * Worker-thread pools (piscina) for CPU-bound work: PDF rendering now, Monte Carlo later.
 *
 * Layout: one pool per worker file, and a task table naming the file that runs each task.
 * A worker file `server/workers/<name>.worker.ts` default-exports `taskHandler({ task: fn })`.
 * To add a task (e.g. Monte Carlo): write `mcm.worker.ts` with
 * `export default taskHandler({ 'monte-carlo': run })` and add `'monte-carlo': 'mcm'` to TASKS.
 * Separate files keep react-pdf and its fonts out of the Monte Carlo threads and vice versa.
 *
 * Where the worker code is:
 * - under tsx / vitest (this file is .ts): the .ts worker, loaded through tsx-bootstrap.mjs;
 * - in the built server (esbuild, server/build.mjs): dist/server/workers/<name>.worker.js.
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Piscina } from 'piscina';
import type { CertificateData } from '../../shared/schemas/certificate.schema';

/** Task name → worker file (without `.worker.ts` / `.worker.js`). */
export const TASKS = {
  'render-certificate': 'pdf',
  'monte-carlo': 'mcm',
  'monte-carlo-block': 'mcm',
} as const satisfies Record<string, string>;

export type TaskName = keyof typeof TASKS;
export type WorkerName = (typeof TASKS)[TaskName];

export interface WorkerPoolOptions {
  /** Threads per worker file (default: half the cores, at least 1). */
  maxThreads?: number;
  /** Folder holding the built `<name>.worker.js` files; found automatically when omitted. */
  builtWorkersDir?: string;
  /** Threads started at once and kept (default 0: started on demand). */
  minThreads?: number;
  /** Idle threads end after this many ms (default 30 s). */
  idleTimeout?: number;
}

export interface WorkerPool {
  renderCertificate(data: CertificateData): Promise<Buffer>;
  runTask(name: TaskName, payload: unknown): Promise<unknown>;
  destroy(): Promise<void>;
}

const here = dirname(fileURLToPath(import.meta.url));
const fromSource = import.meta.url.endsWith('.ts');

function workerFile(name: WorkerName, builtDir?: string): { filename: string; workerData?: unknown } {
  if (fromSource) {
    return {
      filename: join(here, 'tsx-bootstrap.mjs'),
      workerData: { tsWorker: pathToFileURL(join(here, `${name}.worker.ts`)).href },
    };
  }
  // Bundled: this code sits in dist/server/index.js (workers in ./workers/) or in a worker itself.
  const candidates = [builtDir, join(here, 'workers'), here].filter((d): d is string => Boolean(d)).map((d) => join(d, `${name}.worker.js`));
  const found = candidates.find((f) => existsSync(f));
  if (!found) throw new Error(`Worker ${name}.worker.js not found (looked in: ${candidates.join(', ')}). Run npm run build.`);
  return { filename: found };
}

export function createWorkerPool(options: WorkerPoolOptions = {}): WorkerPool {
  const pools = new Map<WorkerName, Piscina>();
  let destroyed = false;
  const maxThreads = options.maxThreads ?? Math.max(1, Math.floor(availableParallelism() / 2));

  function poolFor(name: WorkerName): Piscina {
    if (destroyed) throw new Error('The worker pool has been destroyed.');
    let pool = pools.get(name);
    if (!pool) {
      const { filename, workerData } = workerFile(name, options.builtWorkersDir);
      pool = new Piscina({ filename, workerData, minThreads: options.minThreads ?? 0, maxThreads, idleTimeout: options.idleTimeout ?? 30_000 });
      pools.set(name, pool);
    }
    return pool;
  }

  async function runTask(name: TaskName, payload: unknown): Promise<unknown> {
    if (!Object.hasOwn(TASKS, name)) throw new Error(`Unknown worker task "${String(name)}".`);
    return poolFor(TASKS[name]).run({ task: name, payload });
  }

  return {
    runTask,
    async renderCertificate(data) {
      const bytes = (await runTask('render-certificate', data)) as Uint8Array;
      return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    },
    async destroy() {
      destroyed = true;
      await Promise.all([...pools.values()].map((p) => p.destroy()));
      pools.clear();
    },
  };
}
