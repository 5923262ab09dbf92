/**
 * Load benchmark (`npm run bench:load`): autocannon against a locally started server — 50
 * concurrent clients posting a shipped template's budget document to the stateless GUM recompute
 * (POST /api/calculations/gum) — first alone, then while 10^6-trial Monte Carlo runs keep going
 * on the same server. Once on the embedded PGlite, once on a throw-away PostgreSQL cluster
 * (Debian's postgresql; skipped with a message when it is not installed) with the durable queue.
 * Prints p50, p95 and p99 latency and throughput. Nothing is asserted: the goal (p95 ≤ 50 ms for
 * the recompute) is reported next to the figures. Everything listens on 127.0.0.1 only.
 *
 * The server is the production bundle that `npm start` runs (dist/server, built here first by
 * server/build.mjs), not the TypeScript sources under tsx: under tsx a worker thread compiles the
 * engine when it starts, which a lab's server never does. The phase beside Monte Carlo is measured
 * once every run stream has finished its first run, so the worker thread has started: it times
 * the steady state, not the thread's start. On Linux each phase also prints how much of the time
 * the API's thread was on a core and how much it waited for one (/proc/<pid>/task/<tid>/schedstat).
 *
 *   npm run bench:load                     # both databases, 12 s per phase
 *   npm run bench:load -- --seconds 5 --only pglite
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { createRequire } from 'node:module';
import { DEMO_PASSWORD, DEMO_USERS } from '../../server/db/seed/demo-data';
import { freePort } from '../setup/free-port';

type AutocannonResult = {
  requests: { average: number; total: number };
  latency: { p50: number; p97_5: number; p99: number; max: number };
  errors: number;
  timeouts: number;
  non2xx: number;
  duration: number;
};
type AutocannonInstance = PromiseLike<AutocannonResult> & {
  on(event: 'response', fn: (client: unknown, statusCode: number, bytes: number, responseTimeMs: number) => void): void;
  stop(): void;
};
type Autocannon = (opts: Record<string, unknown>) => AutocannonInstance;
const autocannon = createRequire(import.meta.url)('autocannon') as Autocannon;

const args = process.argv.slice(2);
const arg = (name: string) => {
  const i = args.indexOf(`--${name}`);
  return i >= 0 ? args[i + 1] : undefined;
};
const SECONDS = Math.min(30, Math.max(3, Number(arg('seconds') ?? 12)));
const ONLY = arg('only');
const CLIENTS = 50;
const MC_TRIALS = 1_000_000;
const MC_STREAMS = 2;
const GOAL_P95_MS = 50;
const ROOT = path.resolve(path.dirname(new URL(import.meta.url).pathname), '../..');

// --- helpers ------------------------------------------------------------------------------

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return NaN;
  const i = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
  return sorted[i];
}

/** A throw-away PostgreSQL cluster as in tests/setup/with-postgres.sh; null when not installed. */
async function startPostgres(): Promise<{ url: string; stop(): void } | null> {
  const base = '/usr/lib/postgresql';
  const versions = fs.existsSync(base) ? fs.readdirSync(base).sort((a, b) => Number(a) - Number(b)) : [];
  const bin = versions.length ? path.join(base, versions.at(-1)!, 'bin') : null;
  if (!bin || !fs.existsSync(path.join(bin, 'initdb'))) return null;
  const root = process.getuid?.() === 0;
  const asPg = (cmd: string, cmdArgs: string[]) => {
    const r = root ? spawnSync('runuser', ['-u', 'postgres', '--', cmd, ...cmdArgs], { encoding: 'utf8' }) : spawnSync(cmd, cmdArgs, { encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`${path.basename(cmd)} failed: ${r.stderr || r.stdout}`);
  };
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-bench-pg-'));
  if (root) spawnSync('chown', ['postgres:postgres', dir]);
  const port = await freePort();
  asPg(path.join(bin, 'initdb'), ['-D', path.join(dir, 'data'), '-U', 'postgres', '--auth=trust', '-E', 'UTF8']);
  asPg(path.join(bin, 'pg_ctl'), ['-D', path.join(dir, 'data'), '-o', `-c listen_addresses=127.0.0.1 -p ${port} -k ${dir} -c max_connections=200 -c fsync=off`, '-l', path.join(dir, 'log'), '-w', 'start']);
  return {
    url: `postgres://postgres@127.0.0.1:${port}/postgres`,
    stop() {
      try {
        asPg(path.join(bin, 'pg_ctl'), ['-D', path.join(dir, 'data'), '-m', 'fast', 'stop']);
      } finally {
        fs.rmSync(dir, { recursive: true, force: true });
      }
    },
  };
}

type Server = { baseUrl: string; child: ChildProcess; dataDir: string; log: string[]; stop(): Promise<void> };

async function startServer(env: Record<string, string>): Promise<Server> {
  const port = await freePort();
  const smtpPort = await freePort();
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-bench-'));
  const baseUrl = `http://127.0.0.1:${port}`;
  const child = spawn(process.execPath, ['dist/server/index.js'], {
    cwd: ROOT,
    env: { ...process.env, NODE_ENV: 'production', HOST: '127.0.0.1', PORT: String(port), FAKE_SMTP_PORT: String(smtpPort), DATA_DIR: dataDir, PUBLIC_URL: baseUrl, SEED_DEMO: 'true', DATABASE_URL: '', TASK_QUEUE: '', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const log: string[] = [];
  child.stdout!.on('data', (d) => log.push(String(d)));
  child.stderr!.on('data', (d) => log.push(String(d)));
  const deadline = Date.now() + 120_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`the server exited during start-up:\n${log.join('')}`);
    try {
      const r = await fetch(`${baseUrl}/api/health`);
      if (r.ok) break;
    } catch {
      /* not listening yet */
    }
    if (Date.now() > deadline) throw new Error(`the server did not start in 120 s:\n${log.join('')}`);
    await sleep(250);
  }
  return {
    baseUrl,
    child,
    dataDir,
    log,
    async stop() {
      if (child.exitCode === null) {
        const exited = new Promise((r) => child.once('exit', r));
        child.kill('SIGTERM');
        await Promise.race([exited, sleep(15_000)]);
        if (child.exitCode === null) child.kill('SIGKILL');
      }
      fs.rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

async function signIn(baseUrl: string, role: string): Promise<string> {
  const u = DEMO_USERS.find((d) => d.role === role)!;
  const r = await fetch(`${baseUrl}/api/auth/sign-in/email`, { method: 'POST', headers: { 'content-type': 'application/json', origin: baseUrl }, body: JSON.stringify({ email: u.email, password: DEMO_PASSWORD }) });
  if (!r.ok) throw new Error(`sign-in as ${u.email} failed: ${r.status} ${await r.text()}`);
  return r.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
}

async function api<T>(baseUrl: string, cookie: string, method: string, url: string, body?: unknown): Promise<T> {
  const r = await fetch(baseUrl + url, { method, headers: { cookie, origin: baseUrl, ...(body === undefined ? {} : { 'content-type': 'application/json' }) }, body: body === undefined ? undefined : JSON.stringify(body) });
  const text = await r.text();
  if (!r.ok) throw new Error(`${method} ${url}: ${r.status} ${text.slice(0, 300)}`);
  return (text ? JSON.parse(text) : undefined) as T;
}

type TemplateInput = { symbol: string; distribution: unknown; dof?: number };
type Template = { key: string; inputs: TemplateInput[] };

/** The shipped template, as the budget the GUM endpoint recomputes. */
function templateBudget(key: string): Template {
  return JSON.parse(fs.readFileSync(path.join(ROOT, 'templates', `${key}.json`), 'utf8')) as Template;
}

/** The budget-document fields of a template (DESIGN.md "The budget document"). */
function budgetDocument(template: Template): Record<string, unknown> {
  const keys = ['measurand', 'equations', 'constants', 'inputs', 'correlations', 'coverage', 'monteCarlo'];
  return Object.fromEntries(Object.entries(template).filter(([k]) => keys.includes(k)));
}

/** A draft job with points whose inputs are all filled from the template's demo values. */
async function preparePoints(baseUrl: string, cookie: string, template: Template, n: number): Promise<string[]> {
  const options = await api<{ templateVersions: Array<{ id: string; key: string }>; items: Array<{ id: string; customerId: string }> }>(baseUrl, cookie, 'GET', '/api/jobs/options');
  const version = options.templateVersions.find((v) => v.key === template.key);
  const item = options.items[0];
  if (!version || !item) throw new Error('the demo data has no released template version or no customer item');
  const { job } = await api<{ job: { id: string } }>(baseUrl, cookie, 'POST', '/api/jobs', { customerId: item.customerId, itemId: item.id, templateVersionId: version.id });
  const ids: string[] = [];
  for (let i = 0; i < n; i++) {
    const { point } = await api<{ point: { id: string; inputs: Array<Record<string, unknown> & { symbol: string; distribution: unknown }> } }>(baseUrl, cookie, 'POST', `/api/jobs/${job.id}/points`, { nominalValue: 100 });
    const inputs = point.inputs.map((inp) => {
      const t = template.inputs.find((x) => x.symbol === inp.symbol);
      return inp.distribution ? inp : { ...inp, distribution: t?.distribution ?? null, ...(t?.dof ? { dof: t.dof } : {}) };
    });
    await api(baseUrl, cookie, 'PATCH', `/api/points/${point.id}`, { inputs });
    ids.push(point.id);
  }
  return ids;
}

/** Keeps one 10^6-trial Monte Carlo run going on a point until `stop()`; counts finished runs. */
function monteCarloLoop(baseUrl: string, cookie: string, pointId: string) {
  let stopped = false;
  let finished = 0;
  let failed = 0;
  let current: AbortController | null = null;
  const loop = (async () => {
    while (!stopped) {
      try {
        const { runId } = await api<{ runId: string }>(baseUrl, cookie, 'POST', `/api/points/${pointId}/monte-carlo`, { trials: MC_TRIALS });
        current = new AbortController();
        const r = await fetch(`${baseUrl}/api/runs/${runId}/events`, { headers: { cookie }, signal: current.signal });
        const text = await r.text();
        if (/event: done/.test(text)) finished++;
        else failed++;
      } catch (err) {
        if (stopped) break;
        failed++;
        await sleep(500);
        if (failed > 20) throw err;
      }
    }
  })();
  return {
    get finished() {
      return finished;
    },
    async stop() {
      stopped = true;
      current?.abort();
      await loop.catch(() => {});
      return { finished, failed };
    },
  };
}

/** Waits until every loop has finished a run (the worker thread is up), at most `ms`. */
async function firstRuns(loops: Array<{ finished: number }>, ms: number): Promise<void> {
  const deadline = Date.now() + ms;
  while (loops.some((l) => l.finished === 0) && Date.now() < deadline) await sleep(100);
}

/** The API thread's time on a core and waiting for one, in ns (Linux schedstat), or null. */
function apiThreadTimes(pid: number | undefined): { run: number; wait: number } | null {
  try {
    const [run, wait] = fs.readFileSync(`/proc/${pid}/task/${pid}/schedstat`, 'utf8').split(' ').map(Number);
    return { run, wait };
  } catch {
    return null;
  }
}

type Figures = { label: string; p50: number; p95: number; p99: number; rps: number; total: number; errors: number; non2xx: number; acP97_5: number; mcRuns?: number; onCore?: number; waiting?: number };

async function gumLoad(label: string, baseUrl: string, cookie: string, body: string, seconds: number, serverPid?: number): Promise<Figures> {
  const latencies: number[] = [];
  const before = apiThreadTimes(serverPid);
  const startedAt = process.hrtime.bigint();
  const instance = autocannon({
    url: `${baseUrl}/api/calculations/gum`,
    method: 'POST',
    connections: CLIENTS,
    duration: seconds,
    headers: { 'content-type': 'application/json', cookie, origin: baseUrl },
    body,
  });
  instance.on('response', (_c, status, _b, ms) => {
    if (status === 200) latencies.push(ms);
  });
  const res = await instance;
  const after = apiThreadTimes(serverPid);
  const wallNs = Number(process.hrtime.bigint() - startedAt);
  latencies.sort((a, b) => a - b);
  return {
    label,
    p50: percentile(latencies, 50),
    p95: percentile(latencies, 95),
    p99: percentile(latencies, 99),
    rps: res.requests.total / res.duration,
    total: res.requests.total,
    errors: res.errors + res.timeouts,
    non2xx: res.non2xx,
    acP97_5: res.latency.p97_5,
    ...(before && after ? { onCore: (after.run - before.run) / wallNs, waiting: (after.wait - before.wait) / wallNs } : {}),
  };
}

async function benchBackend(name: string, env: Record<string, string>): Promise<Figures[]> {
  const server = await startServer(env);
  try {
    const cookie = await signIn(server.baseUrl, 'analyst');
    const template = templateBudget('ir-thermometer-blackbody');
    // The budget document of DESIGN.md (model, inputs, coverage), as a client recomputing a budget
    // sends it; the template's certificate wording, CMC rows and reference case stay at home.
    const budget = budgetDocument(template);
    const body = JSON.stringify({ budget });
    // The body must be accepted before it is timed.
    await api(server.baseUrl, cookie, 'POST', '/api/calculations/gum', { budget });
    const points = await preparePoints(server.baseUrl, cookie, template, MC_STREAMS);
    const pid = server.child.pid;
    await gumLoad('warm-up', server.baseUrl, cookie, body, 2);
    const alone = await gumLoad(`${name}: GUM recompute alone`, server.baseUrl, cookie, body, SECONDS, pid);
    const loops = points.map((p) => monteCarloLoop(server.baseUrl, cookie, p));
    await firstRuns(loops, 60_000);
    const finishedBefore = loops.reduce((s, l) => s + l.finished, 0);
    const busy = await gumLoad(`${name}: GUM recompute + ${MC_STREAMS}× 10^6-trial Monte Carlo`, server.baseUrl, cookie, body, SECONDS, pid);
    const mc = await Promise.all(loops.map((l) => l.stop()));
    busy.mcRuns = mc.reduce((s, m) => s + m.finished, 0) - finishedBefore;
    const mcFailed = mc.reduce((s, m) => s + m.failed, 0);
    if (mcFailed) console.log(`  (${name}: ${mcFailed} Monte Carlo runs did not end with "done", e.g. stopped at the end of the phase)`);
    return [alone, busy];
  } catch (err) {
    console.error(`${name}: the benchmark failed: ${err instanceof Error ? err.message : String(err)}\n--- server log ---\n${server.log.join('').slice(-3000)}`);
    return [];
  } finally {
    await server.stop();
  }
}

function print(rows: Figures[], loadBefore: number) {
  const fmt = (n: number, d = 1) => (Number.isFinite(n) ? n.toFixed(d) : '–');
  console.log('');
  console.log(`POST /api/calculations/gum, ${CLIENTS} concurrent clients, ${SECONDS} s per phase, ${os.availableParallelism()} cores (${os.cpus()[0]?.model ?? 'cpu'}), load average at start ${loadBefore.toFixed(1)}`);
  console.log('phase'.padEnd(62) + 'p50 ms'.padStart(8) + 'p95 ms'.padStart(8) + 'p99 ms'.padStart(8) + 'req/s'.padStart(9) + 'requests'.padStart(10) + 'errors'.padStart(8) + '  MC runs done');
  for (const r of rows) {
    console.log(
      r.label.padEnd(62) + fmt(r.p50).padStart(8) + fmt(r.p95).padStart(8) + fmt(r.p99).padStart(8) + fmt(r.rps, 0).padStart(9) + String(r.total).padStart(10) + String(r.errors + r.non2xx).padStart(8) + (r.mcRuns !== undefined ? `  ${r.mcRuns}` : ''),
    );
  }
  for (const r of rows) console.log(`  ${r.label}: p95 ${fmt(r.p95)} ms — goal p95 ≤ ${GOAL_P95_MS} ms ${r.p95 <= GOAL_P95_MS ? 'met' : 'NOT met'} (autocannon's own p97.5: ${fmt(r.acP97_5)} ms)`);
  for (const r of rows) {
    if (r.onCore !== undefined) console.log(`  ${r.label}: the API's thread was on a core ${fmt(100 * r.onCore)} % of the time and waited for one ${fmt(100 * (r.waiting ?? 0))} %`);
  }
}

async function main() {
  const built = spawnSync(process.execPath, ['server/build.mjs'], { cwd: ROOT, encoding: 'utf8' });
  if (built.status !== 0) throw new Error(`building the server bundle failed: ${built.stderr || built.stdout}`);
  const loadBefore = os.loadavg()[0];
  const rows: Figures[] = [];
  if (ONLY !== 'postgres') rows.push(...(await benchBackend('PGlite', {})));
  if (ONLY !== 'pglite') {
    const pgc = await startPostgres().catch((err) => {
      console.log(`PostgreSQL: could not start a throw-away cluster (${err instanceof Error ? err.message : String(err)}): skipped`);
      return null;
    });
    if (!pgc) console.log('PostgreSQL: the server binaries are not installed (apt-get install postgresql): skipped');
    else {
      try {
        rows.push(...(await benchBackend('PostgreSQL', { DATABASE_URL: pgc.url, TASK_QUEUE: 'pgboss' })));
      } finally {
        pgc.stop();
      }
    }
  }
  print(rows, loadBefore);
  if (loadBefore > os.availableParallelism()) console.log(`  note: the machine was already loaded (load average ${loadBefore.toFixed(1)} on ${os.availableParallelism()} cores); figures are noisy.`);
}

main().then(
  () => process.exit(0),
  (err) => {
    console.error(err);
    process.exit(1);
  },
);
