/**
 * Two app instances (two createApp over their own AppDeps) on one PostgreSQL database, as behind
 * a load balancer: an analyst signs in on A, queues Monte Carlo runs on A
 * (POST /api/points/:id/monte-carlo), follows them on B (GET /api/runs/:id/events, the same
 * session cookie), and each run is done — by either instance — exactly once: one stored result
 * and one `monte_carlo` audit row per point, `task_runs.completions` = 1 per run.
 * PostgreSQL only. Budget values are the shipped template's invented demo values.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../../setup/test-app';
import { DEMO_PASSWORD, DEMO_USERS } from '../../../server/db/seed';

const pgUrl = process.env.DATABASE_URL;
const title = pgUrl
  ? 'two app instances on one PostgreSQL: Monte Carlo over the API'
  : 'two app instances on one PostgreSQL — skipped: DATABASE_URL is not set (run: bash tests/setup/with-postgres.sh npx vitest run --project api)';
if (!pgUrl) console.info(`[tests/server/scale] ${title}`);

type Template = { key: string; inputs: Array<{ symbol: string; distribution: unknown; dof?: number }> };
const TEMPLATE = JSON.parse(fs.readFileSync('templates/ir-thermometer-blackbody.json', 'utf8')) as Template;

describe.skipIf(!pgUrl)(title, () => {
  let dir: string;
  let a: TestApp;
  let b: TestApp;
  let cookie: string;

  beforeAll(async () => {
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-two-'));
    const env = { TASK_QUEUE: 'pgboss', TASK_CONCURRENCY: '1' };
    a = await createTestApp({ dataDir: dir, keepDatabase: true, env });
    b = await createTestApp({ dataDir: dir, keepDatabase: true, env, seed: false });
    await Promise.all([a.deps.tasks.start(), b.deps.tasks.start()]);
    const analyst = DEMO_USERS.find((u) => u.role === 'analyst')!;
    const res = await request(a.app).post('/api/auth/sign-in/email').set('Origin', a.origin).send({ email: analyst.email, password: DEMO_PASSWORD }).expect(200);
    cookie = (res.headers['set-cookie'] as unknown as string[]).map((c) => c.split(';')[0]).join('; ');
  }, 240_000);

  afterAll(async () => {
    await b?.close();
    await a?.close();
    const last = await createTestApp({ dataDir: dir, seed: false, env: { TASK_QUEUE: 'in-process' } });
    await last.close();
    fs.rmSync(dir, { recursive: true, force: true });
  }, 120_000);

  const on = (t: TestApp) => ({
    get: (url: string) => request(t.app).get(url).set('Cookie', cookie).set('Origin', t.origin),
    post: (url: string) => request(t.app).post(url).set('Cookie', cookie).set('Origin', t.origin),
    patch: (url: string) => request(t.app).patch(url).set('Cookie', cookie).set('Origin', t.origin),
  });

  async function filledPoints(n: number): Promise<string[]> {
    const options = (await on(a).get('/api/jobs/options').expect(200)).body as { templateVersions: Array<{ id: string; key: string }>; items: Array<{ id: string; customerId: string }> };
    const version = options.templateVersions.find((v) => v.key === TEMPLATE.key)!;
    const item = options.items[0];
    const job = (await on(a).post('/api/jobs').send({ customerId: item.customerId, itemId: item.id, templateVersionId: version.id }).expect(201)).body.job as { id: string };
    const ids: string[] = [];
    for (let i = 0; i < n; i++) {
      const point = (await on(a).post(`/api/jobs/${job.id}/points`).send({ nominalValue: 100 + i }).expect(201)).body.point as { id: string; inputs: Array<{ symbol: string; distribution: unknown }> };
      const inputs = point.inputs.map((inp) => {
        const t = TEMPLATE.inputs.find((x) => x.symbol === inp.symbol);
        return inp.distribution ? inp : { ...inp, distribution: t?.distribution ?? null, ...(t?.dof ? { dof: t.dof } : {}) };
      });
      await on(a).patch(`/api/points/${point.id}`).send({ inputs }).expect(200);
      ids.push(point.id);
    }
    return ids;
  }

  /** Reads a run's event stream to its end on the given instance. */
  async function events(t: TestApp, runId: string) {
    const res = await on(t)
      .get(`/api/runs/${runId}/events`)
      .buffer(true)
      .parse((response, cb) => {
        let text = '';
        response.setEncoding('utf8');
        response.on('data', (d: string) => (text += d));
        response.on('end', () => cb(null, text));
      })
      .expect(200);
    return String(res.body)
      .split('\n\n')
      .filter((blk) => blk.includes('data:'))
      .map((blk) => ({ event: /event: (\w+)/.exec(blk)![1], data: JSON.parse(/data: (.*)/.exec(blk)![1]) as Record<string, unknown> }));
  }

  it('when runs are queued on A and followed on B, then each is done exactly once and its result is stored once', async () => {
    const points = await filledPoints(4);
    const runs: string[] = [];
    for (const [i, p] of points.entries()) {
      const res = await on(a).post(`/api/points/${p}/monte-carlo`).send({ trials: 200_000, seed: 100 + i }).expect(202);
      runs.push(res.body.runId as string);
    }
    // A second run for a point that has one queued or running is refused, also on the other instance.
    await on(b).post(`/api/points/${points[0]}/monte-carlo`).send({ trials: 1000 }).expect(409);

    const streams = await Promise.all(runs.map((r) => events(b, r)));
    for (const [i, evs] of streams.entries()) {
      expect(evs.at(-1)!.event).toBe('done');
      expect((evs.at(-1)!.data.result as { mcm: { seed: number } }).mcm.seed).toBe(100 + i);
    }
    for (const [i, p] of points.entries()) {
      const got = await on(b).get(`/api/points/${p}`).expect(200);
      expect(got.body.point.resultSeed).toBe(100 + i);
    }

    const completions = await a.database.query<{ id: string; completions: number; finished_by: string }>('SELECT id, completions, finished_by FROM task_runs WHERE id = ANY($1)', [runs]);
    expect(completions.map((c) => c.completions)).toEqual([1, 1, 1, 1]);
    const audits = await a.database.query<{ entity_id: string; n: string }>("SELECT entity_id, count(*) AS n FROM audit_log WHERE action = 'monte_carlo' AND entity_id = ANY($1) GROUP BY entity_id", [points]);
    expect(audits.map((r) => [r.entity_id, Number(r.n)]).sort()).toEqual(points.map((p) => [p, 1]).sort());
    const aId = (a.deps.tasks as unknown as { instanceId: string }).instanceId;
    const byA = completions.filter((c) => c.finished_by === aId).length;
    console.log(`scale: 4 Monte Carlo runs queued on A, done exactly once — by A: ${byA}, by B: ${completions.length - byA}`);
  }, 240_000);
});
