/**
 * The durable task queue (server/tasks/durable.ts, pg-boss) with several app instances on one
 * PostgreSQL database: shared work, exactly-once completion, a queued task surviving the loss of
 * the instance that queued it, progress from one instance reaching a subscriber on another, and
 * cancellation from another instance. PostgreSQL only (skipped with PGlite).
 * The budget is the hand-written example tests/fixtures/budgets/ir-thermometer.json (invented values).
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../../setup/test-app';
import { createDurableRunner, waitForEnd, type TaskEvent, type TaskRunner } from '../../../server/tasks';
import { processWorkerPool } from '../../../server/tasks';
import { silentLogger } from '../../../server/logger';

const pgUrl = process.env.DATABASE_URL;
const BUDGET = JSON.parse(fs.readFileSync('tests/fixtures/budgets/ir-thermometer.json', 'utf8'));

const title = pgUrl
  ? 'durable task queue on PostgreSQL, two app instances'
  : 'durable task queue on PostgreSQL — skipped: DATABASE_URL is not set (run: bash tests/setup/with-postgres.sh npx vitest run --project api)';

if (!pgUrl) console.info(`[tests/server/scale] ${title}`);

describe.skipIf(!pgUrl)(title, () => {
  let dir: string;
  let a: TestApp;
  let b: TestApp;
  const extra: TaskRunner[] = [];

  beforeAll(async () => {
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-scale-'));
    // Two app instances on one database (the second reopens the first one's scratch database).
    a = await createTestApp({ dataDir: dir, keepDatabase: true, env: { TASK_QUEUE: 'pgboss', TASK_CONCURRENCY: '1' } });
    b = await createTestApp({ dataDir: dir, keepDatabase: true, env: { TASK_QUEUE: 'pgboss', TASK_CONCURRENCY: '1' }, seed: false });
    await a.database.query('CREATE TABLE scale_completions (task_id uuid NOT NULL, instance text NOT NULL)');
  }, 240_000);

  afterAll(async () => {
    for (const r of extra) await r.stop().catch(() => {});
    await b?.close();
    await a?.close().catch(() => {});
    // Drop the shared scratch database: reopen it once more without keepDatabase.
    const last = await createTestApp({ dataDir: dir, seed: false, env: { TASK_QUEUE: 'in-process' } });
    await last.close();
    fs.rmSync(dir, { recursive: true, force: true });
  }, 120_000);

  function submitOnly(): TaskRunner {
    const r = createDurableRunner({ connectionString: a.config.databaseUrl!, db: a.database.db, pool: processWorkerPool, logger: silentLogger, work: false, instanceId: 'submit-only' });
    extra.push(r);
    return r;
  }

  it('when Monte Carlo tasks are queued on one instance, then the instances share them and each is completed exactly once', async () => {
    // Count completions in the database: the hook writes through the transaction that marks the
    // task done, and records the instance that finished it.
    for (const [name, t] of [['A', a], ['B', b]] as const) {
      t.deps.tasks.onComplete('monte-carlo', async (payload, result, tx) => {
        const id = (payload.context as { tag: string }).tag;
        await tx.execute(sql`INSERT INTO scale_completions (task_id, instance) VALUES (${id}, ${name})`);
        expect(result.mcm?.trials).toBe(payload.trials);
      });
    }
    await Promise.all([a.deps.tasks.start(), b.deps.tasks.start()]);
    const n = 8;
    const tags = Array.from({ length: n }, () => crypto.randomUUID());
    const ids = [];
    for (let i = 0; i < n; i++) ids.push(await a.deps.tasks.submit('monte-carlo', { doc: BUDGET, trials: 200_000, seed: i + 1, context: { tag: tags[i] } }, { subject: `scale-${i}` }));
    const ends = await Promise.all(ids.map((id) => waitForEnd(a.deps.tasks, id)));
    expect(ends.map((e) => e.type)).toEqual(Array(n).fill('done'));

    const rows = await a.database.query<{ id: string; completions: number; finished_by: string; state: string }>('SELECT id, completions, finished_by, state FROM task_runs WHERE id = ANY($1)', [ids]);
    expect(rows).toHaveLength(n);
    expect(rows.every((r) => r.completions === 1 && r.state === 'done')).toBe(true);
    const hookRows = await a.database.query<{ task_id: string; instance: string; count: string }>('SELECT task_id, min(instance) AS instance, count(*) AS count FROM scale_completions GROUP BY task_id');
    expect(hookRows.map((r) => r.task_id).sort()).toEqual([...tags].sort());
    expect(hookRows.every((r) => Number(r.count) === 1)).toBe(true);
    // pg-boss itself: each job completed once, none retried.
    const jobs = await a.database.query<{ state: string; retry_count: number }>("SELECT state, retry_count FROM pgboss.job WHERE id = ANY($1) UNION ALL SELECT state, retry_count FROM pgboss.archive WHERE id = ANY($1)", [ids]);
    expect(jobs.map((j) => j.state)).toEqual(Array(n).fill('completed'));
    const by = (name: string) => hookRows.filter((r) => r.instance === name).length;
    console.log(`scale: ${n} Monte Carlo tasks done exactly once — by instance A: ${by('A')}, by instance B: ${by('B')}`);
    expect(new Set(rows.map((r) => r.finished_by)).size).toBeGreaterThanOrEqual(1);
  }, 180_000);

  it('when the instance that queued a task goes away before anyone works on it, then the task waits in the database and another instance finishes it; progress reaches a subscriber on a third', async () => {
    // Stop the workers of A and B: only submit-only instances are up.
    await a.deps.tasks.stop();
    await b.deps.tasks.stop();
    const s1 = submitOnly();
    const id = await s1.submit('monte-carlo', { doc: BUDGET, trials: 2_000_000, seed: 99, context: { tag: crypto.randomUUID() } }, { subject: 'restart' });
    await s1.stop();
    const [queued] = await a.database.query<{ state: string }>('SELECT state FROM task_runs WHERE id = $1', [id]);
    expect(queued.state).toBe('queued');

    // A new subscriber-only instance, then a fresh worker instance (a restarted app) on the same database.
    const s2 = submitOnly();
    const seen: TaskEvent[] = [];
    const end = new Promise<TaskEvent>((resolve) => s2.subscribe(id, (ev) => (seen.push(ev), ev.type !== 'progress' && resolve(ev))));
    const worker = createDurableRunner({ connectionString: a.config.databaseUrl!, db: b.database.db, pool: processWorkerPool, logger: silentLogger, instanceId: 'restarted', concurrency: 1 });
    extra.push(worker);
    await worker.start();
    const final = await end;
    expect(final.type).toBe('done');
    expect((final as Extract<TaskEvent<'monte-carlo'>, { type: 'done' }>).result.mcm?.trials).toBe(2_000_000);
    const progress = seen.filter((e) => e.type === 'progress') as Array<Extract<TaskEvent, { type: 'progress' }>>;
    expect(progress.some((e) => e.done > 0 && e.done < 2_000_000)).toBe(true);
    const [row] = await a.database.query<{ state: string; completions: number; finished_by: string }>('SELECT state, completions, finished_by FROM task_runs WHERE id = $1', [id]);
    expect(row).toEqual({ state: 'done', completions: 1, finished_by: 'restarted' });
  }, 180_000);

  it('when a running task is cancelled from another instance, then it ends "cancelled" and nothing is completed', async () => {
    const worker = extra.find((r) => (r as { instanceId?: string }).instanceId === 'restarted')!;
    const s = submitOnly();
    const id = await s.submit('monte-carlo', { doc: BUDGET, trials: 20_000_000, seed: 5, context: { tag: crypto.randomUUID() } }, { subject: 'cancel' });
    await new Promise<void>((resolve) => {
      const off = s.subscribe(id, (ev) => {
        if (ev.type === 'progress' && ev.done > 0) {
          resolve();
          queueMicrotask(() => off());
        }
      });
    });
    expect((await s.findActive('monte-carlo', 'cancel'))?.id).toBe(id);
    await worker.cancel(id);
    const final = await waitForEnd(s, id);
    expect(final.type).toBe('cancelled');
    const [row] = await a.database.query<{ state: string; completions: number }>('SELECT state, completions FROM task_runs WHERE id = $1', [id]);
    expect(row).toEqual({ state: 'cancelled', completions: 0 });
    expect(await s.findActive('monte-carlo', 'cancel')).toBeNull();
  }, 120_000);
});
