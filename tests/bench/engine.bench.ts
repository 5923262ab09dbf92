/**
 * Engine benchmark (issue 3): the ten-input radiometric model — an infrared thermometer read
 * against a blackbody, with blackbody emissivity and reflected ambient radiation, an uncertain
 * effective wavelength and repeated readings as Type A — at 10^4 … 10^7 Monte Carlo trials:
 *   engine on one thread (runMonteCarlo on compileModel's kernel) · engine on every core
 *   (runMonteCarloInBlocks, its blocks on worker threads; the same result for the same seed) ·
 *   a per-trial mathjs loop, twice: with each equation compiled once and evaluated per trial, and
 *   with mathjs's evaluate(text, scope) per trial (10^4 … 10^6, measured, never extrapolated) ·
 *   vectorised numpy (python3, if importable; one thread).
 * Prints figures only; nothing here is asserted. All magnitudes are invented demo values.
 *
 * Run: npm run bench   (tsx --expose-gc, so the memory baseline is taken after a collection)
 * Times: best of two runs (one at 10^7) after JIT warm-up; numpy likewise (best of two below 10^7).
 * Extra memory: peak of heapUsed + arrayBuffers sampled after every chunk, minus the baseline.
 */
import { spawnSync } from 'node:child_process';
import { all, create } from 'mathjs';
import { availableParallelism } from 'node:os';
import { compileModel, createSampler, runMonteCarlo, runMonteCarloInBlocks, planck, planck_temperature, type BudgetDocument } from '../../shared/engine';
import { createWorkerPool } from '../../server/workers/pool';
import { poolBlockRunner } from '../../server/workers/monte-carlo-in-blocks';
import { OutputAccumulator } from '../../shared/engine/mcm';
import { createStreams } from '../../shared/engine/random';

// ── The model (demo values, invented) ─────────────────────────────────────────────────────────
const readings = [773.62, 773.58, 773.71, 773.55, 773.66, 773.60, 773.69, 773.57, 773.64, 773.61];
const doc = {
  measurand: { symbol: 'E', unit: 'K', description: 'error of indication (demo)' },
  equations: [
    'T_bb = T_ref + dT_drift + dT_unif + dT_stab',
    'L_s = eps * planck(lambda, T_bb) + (1 - eps) * planck(lambda, T_amb)',
    'T_s = planck_temperature(lambda, L_s)',
    'E = T_ind + dT_res + dT_sse - T_s',
  ],
  inputs: [
    { symbol: 'T_ref', unit: 'K', distribution: { type: 'normal', mean: 773.15, expanded: 0.1, k: 2 } },
    { symbol: 'dT_drift', unit: 'K', distribution: { type: 'rectangular', mean: 0, halfWidth: 0.03 } },
    { symbol: 'dT_unif', unit: 'K', distribution: { type: 'rectangular', mean: 0, halfWidth: 0.1 } },
    { symbol: 'dT_stab', unit: 'K', distribution: { type: 'triangular', min: -0.05, max: 0.05 } },
    { symbol: 'eps', unit: '1', distribution: { type: 'rectangular', min: 0.99, max: 0.998 } },
    { symbol: 'T_amb', unit: 'K', distribution: { type: 'normal', mean: 296.15, sd: 1 } },
    { symbol: 'lambda', unit: 'm', distribution: { type: 'rectangular', min: 9.5e-6, max: 10.5e-6 } },
    { symbol: 'dT_sse', unit: 'K', distribution: { type: 'rectangular', mean: 0, halfWidth: 0.15 } },
    { symbol: 'dT_res', unit: 'K', distribution: { type: 'rectangular', mean: 0, halfWidth: 0.05 } },
    { symbol: 'T_ind', unit: 'K', distribution: { type: 'readings', values: readings } },
  ],
  coverage: 0.9545,
} as BudgetDocument;
const SIZES = [1e4, 1e5, 1e6, 1e7];
const MATHJS_SIZES = [1e4, 1e5, 1e6];
const SEED = 1;

const gc = (globalThis as { gc?: () => void }).gc;
const usage = () => { const m = process.memoryUsage(); return m.heapUsed + m.arrayBuffers; };
const MB = (b: number) => b / 1048576;

// ── Engine ────────────────────────────────────────────────────────────────────────────────────
// The model is compiled once per budget (as the server does), then run at every size.
const c0 = performance.now();
const compiled = compileModel(doc);
const compileMs = performance.now() - c0;

function runEngine(M: number) {
  let kernelMs = 0;
  const model = {
    ...compiled,
    kernel(cols: Float64Array[], out: Float64Array, n: number) {
      const k0 = performance.now();
      compiled.kernel(cols, out, n);
      kernelMs += performance.now() - k0;
    },
  };
  gc?.();
  const base = usage();
  let peak = base;
  const t0 = performance.now();
  const r = runMonteCarlo(doc, model, {
    trials: M, seed: SEED, adaptive: false, interval: 'shortest', coverage: 0.9545, digits: 2,
    onProgress: () => { const u = usage(); if (u > peak) peak = u; },
  });
  const ms = performance.now() - t0;
  const end = usage();
  return { ms, kernelMs, mem: MB(Math.max(peak, end) - base), r };
}

// ── Engine on every core: the blocks on a warm pool of worker threads ────────────────────────
const THREADS = availableParallelism();
const pool = createWorkerPool({ maxThreads: THREADS, minThreads: THREADS });
const runBlock = poolBlockRunner(pool);
async function runEngineThreads(M: number) {
  gc?.();
  const base = usage();
  let peak = base;
  const t0 = performance.now();
  const r = await runMonteCarloInBlocks(doc, compiled, {
    trials: M, seed: SEED, adaptive: false, interval: 'shortest', coverage: 0.9545, digits: 2,
    onProgress: () => { const u = usage(); if (u > peak) peak = u; },
  }, runBlock, 4 * THREADS);
  const ms = performance.now() - t0;
  return { ms, mem: MB(Math.max(peak, usage()) - base), r };
}
// Each worker keeps its sampler's columns (one 2^16 column per input) and allocates one block of values.
const workerMB = THREADS * MB((doc.inputs.length + 1) * 65536 * 8);

// ── mathjs per-trial loop: the same equations, interpreted trial by trial ─────────────────────
// text: false — each equation compiled once (math.compile), evaluated per trial;
// text: true  — math.evaluate(equation text, scope) per trial, which parses each time.
function runMathjs(M: number, text = false) {
  const math = create(all);
  math.import({ planck, planck_temperature }, { override: true });
  const compiled = doc.equations.map((e) => {
    const [lhs, rhs] = e.split('=').map((s) => s.trim());
    return { lhs, code: text ? { evaluate: (scope: Map<string, number>) => math.evaluate(rhs, scope) } : math.compile(rhs) };
  });
  const t0 = performance.now();
  const chunk = 1 << 16;
  const streams = createStreams(SEED, doc.inputs.length);
  const samplers = doc.inputs.map((i) => createSampler(i.distribution, i.symbol));
  const cols = doc.inputs.map(() => new Float64Array(chunk));
  const out = new Float64Array(chunk);
  const acc = new OutputAccumulator(M, 0.9545);
  const scope = new Map<string, number>();
  let evalMs = 0;
  for (let done = 0; done < M; done += chunk) {
    const n = Math.min(chunk, M - done);
    samplers.forEach((s, i) => s.fill(streams[i], cols[i], n));
    const e0 = performance.now();
    for (let t = 0; t < n; t++) {
      for (let i = 0; i < cols.length; i++) scope.set(doc.inputs[i].symbol, cols[i][t]);
      let v = 0;
      for (const eq of compiled) { v = eq.code.evaluate(scope) as number; scope.set(eq.lhs, v); }
      out[t] = v;
    }
    evalMs += performance.now() - e0;
    acc.add(out, n);
  }
  const s = acc.summary('shortest');
  return { ms: performance.now() - t0, evalMs, y: s.y, u: s.u };
}

// ── numpy: vectorised, same distributions, same interval rule, in chunks of 10^6 ──────────────
const NUMPY = String.raw`
import json, sys, time
import numpy as np
c1L = 2 * 6.62607015e-34 * 299792458.0**2
c2 = 6.62607015e-34 * 299792458.0 / 1.380649e-23
r = np.array(${JSON.stringify(readings)})
n_r = r.size; r_mean = r.mean(); r_u = r.std(ddof=1) / np.sqrt(n_r)
def planck(l, T): return c1L / l**5 / np.expm1(c2 / (l * T))
def planck_temperature(l, L): return c2 / (l * np.log1p(c1L / (l**5 * L)))
def chunk(rng, n):
    T_ref = rng.normal(773.15, 0.05, n)
    dT_drift = rng.uniform(-0.03, 0.03, n)
    dT_unif = rng.uniform(-0.1, 0.1, n)
    dT_stab = rng.triangular(-0.05, 0.0, 0.05, n)
    eps = rng.uniform(0.99, 0.998, n)
    T_amb = rng.normal(296.15, 1.0, n)
    lam = rng.uniform(9.5e-6, 10.5e-6, n)
    dT_sse = rng.uniform(-0.15, 0.15, n)
    dT_res = rng.uniform(-0.05, 0.05, n)
    T_ind = r_mean + r_u * rng.standard_t(n_r - 1, n)
    T_bb = T_ref + dT_drift + dT_unif + dT_stab
    L_s = eps * planck(lam, T_bb) + (1 - eps) * planck(lam, T_amb)
    return T_ind + dT_res + dT_sse - planck_temperature(lam, L_s)
def run(M):
    t0 = time.perf_counter()
    rng = np.random.default_rng(1)
    y = np.empty(M)
    step = 1000000
    for s in range(0, M, step):
        y[s:s + step] = chunk(rng, min(step, M - s))
    mean = y.mean(); u = y.std(ddof=1)
    q = int(np.floor(0.9545 * M + 0.5)); K = M - q
    y.partition((K - 1, q))
    lo = np.sort(y[:K]); hi = np.sort(y[q:])
    w = hi - lo; i = int(np.argmin(w))
    edges = np.linspace(lo[i] - (hi[i] - lo[i]) / 4, hi[i] + (hi[i] - lo[i]) / 4, 121)
    counts, _ = np.histogram(y, edges)
    return time.perf_counter() - t0, mean, u, lo[i], hi[i]
run(10000)
for M in [int(m) for m in sys.argv[1:]]:
    t, mean, u, lo, hi = run(M)
    if M < 10000000:
        t = min(t, run(M)[0])
    print(json.dumps({"M": M, "ms": t * 1000, "y": mean, "u": u, "low": lo, "high": hi}))
`;
function runNumpy(): Map<number, { ms: number; u: number }> | string {
  const env = { ...process.env };
  delete env.OPENBLAS_CORETYPE;
  delete env.OPENBLAS_L2_SIZE;
  const probe = spawnSync('python3', ['-c', 'import numpy'], { env, encoding: 'utf8' });
  if (probe.status !== 0) return 'skipped: python3 cannot import numpy';
  const res = spawnSync('python3', ['-c', NUMPY, ...SIZES.map(String)], { env, encoding: 'utf8', maxBuffer: 1 << 20 });
  if (res.status !== 0) return `skipped: numpy script failed (${res.stderr.trim().split('\n').pop()})`;
  const out = new Map<number, { ms: number; u: number }>();
  for (const line of res.stdout.trim().split('\n')) { const j = JSON.parse(line); out.set(j.M, { ms: j.ms, u: j.u }); }
  return out;
}

// ── Run and print ─────────────────────────────────────────────────────────────────────────────
const fmt = (v: number | undefined, d = 1) => (v === undefined || !Number.isFinite(v) ? '—' : v.toFixed(d));
console.log(`Engine benchmark: ten-input radiometric model (infrared thermometer vs blackbody; demo values invented)`);
console.log(`node ${process.version}, gc exposed: ${gc ? 'yes' : 'no (memory figures include garbage)'}, ${new Date().toISOString()}`);
// Warm-up runs (JIT), then the best of two runs per size (one at 10^7), as is common practice.
for (const M of [1e4, 1e4, 1e4, 1e5]) runEngine(M);
const best = <T extends { ms: number }>(f: () => T, times: number): T => {
  let b = f();
  for (let i = 1; i < times; i++) { const r = f(); if (r.ms < b.ms) b = r; }
  return b;
};
const engine = new Map<number, ReturnType<typeof runEngine>>();
for (const M of SIZES) engine.set(M, best(() => runEngine(M), M >= 1e7 ? 1 : 2));
for (const M of [1e4, 1e5, 1e5]) await runEngineThreads(M); // warm the worker threads' JIT
const threads = new Map<number, Awaited<ReturnType<typeof runEngineThreads>>>();
for (const M of SIZES) {
  let b = await runEngineThreads(M);
  if (M < 1e7) { const r = await runEngineThreads(M); if (r.ms < b.ms) b = r; }
  threads.set(M, b);
}
await pool.destroy();
const mathjs = new Map<number, ReturnType<typeof runMathjs>>();
for (const M of [1e3, 1e4]) runMathjs(M);
for (const M of MATHJS_SIZES) mathjs.set(M, best(() => runMathjs(M), M >= 1e6 ? 1 : 2));
const mathjsText = new Map<number, ReturnType<typeof runMathjs>>();
runMathjs(1e3, true);
for (const M of MATHJS_SIZES) mathjsText.set(M, runMathjs(M, true));
const numpy = runNumpy();
if (typeof numpy === 'string') console.log(`numpy: ${numpy}`);

const r6 = engine.get(1e6)!.r;
const t6 = threads.get(1e6)!.r;
console.log(`result at 10^6: E = ${r6.y.toFixed(4)} K, u = ${r6.u.toFixed(4)} K, shortest 95.45 % interval [${r6.interval[0].toFixed(4)}, ${r6.interval[1].toFixed(4)}] K`);
console.log(`on ${THREADS} threads, the same seed: ${JSON.stringify(t6) === JSON.stringify(r6) ? 'the same result, to the last bit' : 'A DIFFERENT RESULT (a defect)'}`);
console.log('');
console.log(`compileModel (once per budget, not in the times below): ${fmt(compileMs)} ms`);
console.log('1 thread ms = runMonteCarlo (sampling, kernel, statistics, interval, histogram); model ms = its kernel calls only.');
console.log(`${THREADS} threads ms = runMonteCarloInBlocks, blocks of 2^16 trials on ${THREADS} warm worker threads, statistics in this thread.`);
console.log('extra MB = peak of this thread\'s heap + array buffers during the run, minus the baseline;');
console.log(`  with threads, each worker also keeps its column buffers: ${fmt(workerMB)} MB for ${THREADS} workers, not included.`);
console.log('numpy = vectorised, one thread, same distributions, same interval rule.');
console.log('');
console.log(`trials    | 1 thread ms | trials/s  | extra MB | model ms | ${THREADS} threads ms | trials/s  | extra MB | numpy ms | 1 thread/numpy | ${THREADS} threads/numpy`);
console.log('----------|-------------|-----------|----------|----------|-------------|-----------|----------|----------|----------------|----------------');
for (const M of SIZES) {
  const e = engine.get(M)!;
  const t = threads.get(M)!;
  const np = typeof numpy === 'string' ? undefined : numpy.get(M);
  console.log([
    M.toExponential(0).padEnd(9),
    fmt(e.ms).padStart(11),
    (M / (e.ms / 1000)).toExponential(2).padStart(9),
    fmt(e.mem).padStart(8),
    fmt(e.kernelMs).padStart(8),
    fmt(t.ms).padStart(11),
    (M / (t.ms / 1000)).toExponential(2).padStart(9),
    fmt(t.mem).padStart(8),
    fmt(np?.ms).padStart(8),
    (np ? fmt(e.ms / np.ms, 2) : '—').padStart(14),
    (np ? fmt(t.ms / np.ms, 2) : '—').padStart(14),
  ].join(' | '));
}
console.log('');
console.log('Against a per-trial mathjs loop (same samplers and statistics, one thread, like the 1-thread engine):');
console.log('compiled = each equation math.compile()d once, evaluated per trial; text = math.evaluate(equation, scope) per trial.');
console.log('eval ms = the per-trial evaluation loop only (compare with the engine\'s model ms).');
console.log('');
console.log('trials    | 1 thread ms | compiled ms |  eval ms | compiled/engine | eval/model |    text ms | text/engine');
console.log('----------|-------------|-------------|----------|-----------------|------------|------------|------------');
for (const M of MATHJS_SIZES) {
  const e = engine.get(M)!;
  const mj = mathjs.get(M)!;
  const tx = mathjsText.get(M)!;
  console.log([
    M.toExponential(0).padEnd(9),
    fmt(e.ms).padStart(11),
    fmt(mj.ms).padStart(11),
    fmt(mj.evalMs).padStart(8),
    (fmt(mj.ms / e.ms, 1) + '×').padStart(15),
    (fmt(mj.evalMs / e.kernelMs, 0) + '×').padStart(10),
    fmt(tx.ms, 0).padStart(10),
    (fmt(tx.ms / e.ms, 0) + '×').padStart(11),
  ].join(' | '));
}
if (typeof numpy !== 'string') {
  const np6 = numpy.get(1e6);
  if (np6) console.log(`numpy u at 10^6 = ${np6.u.toFixed(4)} K (engine ${r6.u.toFixed(4)} K; different generators, same distributions)`);
}
console.log('Targets at 10^6: engine/numpy ≤ 1.0, at least 30× faster than the per-trial mathjs loop, extra memory ≤ 64 MB, time linear in trials.');
