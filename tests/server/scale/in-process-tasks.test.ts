/**
 * The in-process task runner (server/tasks/in-process.ts, the default with PGlite): a Monte Carlo
 * task reports progress, runs its completion hook once before "done", and can be cancelled.
 * The budget is the hand-written example tests/fixtures/budgets/ir-thermometer.json (invented values).
 */
import fs from 'node:fs';
import { afterAll, describe, expect, it } from 'vitest';
import { createInProcessRunner, processWorkerPool, waitForEnd, type TaskEvent } from '../../../server/tasks';
import { createWorkerPool } from '../../../server/workers/pool';
import { silentLogger } from '../../../server/logger';
import type { Db } from '../../../server/db/client';

const BUDGET = JSON.parse(fs.readFileSync('tests/fixtures/budgets/ir-thermometer.json', 'utf8'));
const runner = createInProcessRunner({ pool: processWorkerPool, db: {} as Db, logger: silentLogger });
afterAll(() => runner.stop());

describe('in-process task runner', () => {
  it('when a Monte Carlo task runs, then subscribers see progress, the hook runs once before "done", and the result has the trials asked for', async () => {
    const stored: number[] = [];
    runner.onComplete('monte-carlo', async (payload) => {
      stored.push(payload.seed);
    });
    const id = await runner.submit('monte-carlo', { doc: BUDGET, trials: 400_000, seed: 11 }, { subject: 'p1', ownerId: 'u1' });
    expect((await runner.findActive('monte-carlo', 'p1'))?.id).toBe(id);
    const seen: TaskEvent[] = [];
    const end = await new Promise<TaskEvent>((resolve) => runner.subscribe(id, (ev) => (seen.push(ev), ev.type !== 'progress' && resolve(ev))));
    expect(end.type).toBe('done');
    expect(stored).toEqual([11]);
    expect((end as Extract<TaskEvent<'monte-carlo'>, { type: 'done' }>).result.mcm?.trials).toBe(400_000);
    expect(seen[0].type).toBe('progress');
    expect(await runner.findActive('monte-carlo', 'p1')).toBeNull();
    expect((await runner.get(id))?.status).toBe('done');
    // A late subscriber gets the final event at once.
    expect((await waitForEnd(runner, id)).type).toBe('done');
  }, 120_000);

  it('when a task is cancelled, then it ends "cancelled" and the hook does not run', async () => {
    let hooks = 0;
    runner.onComplete('monte-carlo', async () => void hooks++);
    const id = await runner.submit('monte-carlo', { doc: BUDGET, trials: 20_000_000, seed: 3 }, { subject: 'p2' });
    await new Promise<void>((resolve) => runner.subscribe(id, (ev) => ev.type === 'progress' && ev.done > 0 && resolve()));
    await runner.cancel(id);
    expect((await waitForEnd(runner, id)).type).toBe('cancelled');
    expect(hooks).toBe(0);
  }, 120_000);

  it('when the document is invalid, then run() rejects with the engine code', async () => {
    await expect(runner.run('monte-carlo', { doc: { equations: ['y = x +'], inputs: [] }, trials: 1000, seed: 1 })).rejects.toMatchObject({ name: 'TaskFailedError' });
  }, 60_000);

  it('when MONTE_CARLO_NICE is set, then the Monte Carlo worker thread runs at that nice value and the API thread keeps its own', async () => {
    // Linux only: the nice value of each thread is field 19 of /proc/<pid>/task/<tid>/stat (proc(5)).
    if (!fs.existsSync('/proc/thread-self')) return;
    const niceOf = (tid: string) => Number(fs.readFileSync(`/proc/${process.pid}/task/${tid}/stat`, 'utf8').replace(/^.*\) /s, '').split(' ')[16]);
    const threads = () => new Map(fs.readdirSync(`/proc/${process.pid}/task`).map((tid) => [tid, niceOf(tid)]));
    const before = threads();
    const pool = createWorkerPool({ maxThreads: 1 });
    const niced = createInProcessRunner({ pool: () => pool, db: {} as Db, logger: silentLogger, monteCarloNice: 7 });
    try {
      const end = await niced.run('monte-carlo', { doc: BUDGET, trials: 10_000, seed: 5 });
      expect(end.mcm?.trials).toBe(10_000);
      const after = threads();
      const newlyNiced = [...after].filter(([tid, nice]) => nice === 7 && before.get(tid) !== 7);
      expect(newlyNiced).toHaveLength(1);
      expect(after.get(String(process.pid))).toBe(before.get(String(process.pid)));
    } finally {
      await niced.stop();
      await pool.destroy();
    }
  }, 60_000);
});
