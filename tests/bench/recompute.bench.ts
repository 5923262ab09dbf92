/**
 * How long a GUM recompute request (POST /api/calculations/gum) takes while a 10^7-trial Monte
 * Carlo run is in progress in the worker pool, against an idle server. Prints figures only; no
 * thresholds (timings depend on the machine).
 *
 *   npm run bench:recompute
 */
import fs from 'node:fs';
import { performance } from 'node:perf_hooks';
import { createTestApp } from '../setup/test-app';

const REQUESTS = Number(process.env.BENCH_REQUESTS ?? 200);
const TRIALS = Number(process.env.BENCH_TRIALS ?? 10_000_000);

function stats(ms: number[]) {
  const s = [...ms].sort((a, b) => a - b);
  const q = (p: number) => s[Math.min(s.length - 1, Math.floor(p * s.length))];
  return { n: s.length, median: q(0.5), p95: q(0.95), max: s.at(-1)!, mean: s.reduce((a, b) => a + b, 0) / s.length };
}
const fmt = (x: number) => x.toFixed(2).padStart(8);

async function main() {
  console.log('starting the app (temporary PGlite, demo seed) …');
  // As the product runs by default: session look-ups remembered for 5 s (off in tests otherwise).
  const t = await createTestApp({ env: { SESSION_CACHE_SECONDS: process.env.SESSION_CACHE_SECONDS ?? '5' } });
  try {
    const analyst = await t.signIn('analyst');
    const budget = JSON.parse(fs.readFileSync('tests/fixtures/budgets/ir-thermometer.json', 'utf8'));
    const timeOne = async () => {
      const t0 = performance.now();
      const res = await analyst.post('/api/calculations/gum').send({ budget });
      if (res.status !== 200) throw new Error(`GUM request failed: ${res.status} ${JSON.stringify(res.body)}`);
      return performance.now() - t0;
    };
    for (let i = 0; i < 20; i++) await timeOne(); // warm-up

    const idle: number[] = [];
    for (let i = 0; i < REQUESTS; i++) idle.push(await timeOne());

    // A point with a complete budget, then a long run on it.
    const opts = (await analyst.get('/api/jobs/options')).body;
    const version = opts.templateVersions.find((v: { key: string }) => v.key === 'ir-thermometer-blackbody');
    const item = opts.items[0];
    const job = (await analyst.post('/api/jobs').send({ customerId: item.customerId, itemId: item.id, templateVersionId: version.id })).body.job;
    const point = (await analyst.post(`/api/jobs/${job.id}/points`).send({ nominalValue: 80 })).body.point;
    await analyst.put(`/api/points/${point.id}/readings/T_ind`).send({ values: [80.9, 79.2, 81.6, 80.1, 78.9, 81.8, 80.4, 79.5, 81.2, 80.0], unit: '°C' });
    const standards = (await analyst.get('/api/jobs/reference-standards')).body.standards as Array<{ id: string; kind: string; values: Array<{ label: string }> }>;
    const thermometer = standards.find((s) => s.kind === 'reference_thermometer')!;
    const blackbody = standards.find((s) => s.kind === 'blackbody_source' && s.values.some((v) => /emissivity/i.test(v.label)))!;
    await analyst.put(`/api/points/${point.id}/inputs/T_ref/standard`).send({ standardId: thermometer.id });
    await analyst.put(`/api/points/${point.id}/inputs/eps_bb/standard`).send({ standardId: blackbody.id, valueIndex: blackbody.values.findIndex((v) => /emissivity/i.test(v.label)) });
    const run = await analyst.post(`/api/points/${point.id}/monte-carlo`).send({ trials: TRIALS, seed: 1 });
    if (run.status !== 202) throw new Error(`could not start the run: ${run.status} ${JSON.stringify(run.body)}`);
    const runId = run.body.runId as string;
    const registryRunning = async () => {
      // The run is still going when its event stream's first event is progress below the target.
      const res = await analyst.get(`/api/points/${point.id}`);
      return res.body.point.result === null || res.body.point.result.mcm === null;
    };

    // Let the worker start.
    await new Promise((r) => setTimeout(r, 300));
    const busy: number[] = [];
    const started = performance.now();
    for (let i = 0; i < REQUESTS; i++) {
      if (i % 25 === 0 && !(await registryRunning())) break;
      busy.push(await timeOne());
    }
    const stillRunning = await registryRunning();
    const busySpan = performance.now() - started;
    await analyst.delete(`/api/runs/${runId}`);

    const a = stats(idle);
    const b = stats(busy);
    console.log(`\nGUM recompute request (POST /api/calculations/gum, ${budget.inputs.length}-input radiometric budget, session cache ${t.deps.config.sessionCacheMs / 1000} s), milliseconds`);
    const busyLabel = `during a ${TRIALS.toExponential(0).replace('1e+', '10^')}-trial run`;
    console.log(`${''.padEnd(busyLabel.length)}       n    median       p95       max      mean`);
    console.log(`${'idle server'.padEnd(busyLabel.length)}  ${String(a.n).padStart(6)}  ${fmt(a.median)}  ${fmt(a.p95)}  ${fmt(a.max)}  ${fmt(a.mean)}`);
    console.log(`${busyLabel}  ${String(b.n).padStart(6)}  ${fmt(b.median)}  ${fmt(b.p95)}  ${fmt(b.max)}  ${fmt(b.mean)}`);
    console.log(`\nthe run was ${stillRunning ? 'still in progress' : 'finished'} after the last timed request (${(busySpan / 1000).toFixed(1)} s of requests); it was then cancelled.`);
    console.log(`median ratio busy/idle: ${(b.median / a.median).toFixed(2)}`);
  } finally {
    // Closing the app closes its task runner and worker pool too.
    await t.close();
  }
}

main().then(
  () => process.exit(0),
  (err) => {
    console.error(err);
    process.exit(1);
  },
);
