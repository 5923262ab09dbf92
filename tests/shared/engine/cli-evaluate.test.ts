/**
 * The CLI (server/cli/evaluate.ts) on the hand-written example budget and on broken input:
 * result JSON on stdout, or a message on stderr and exit code 2.
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = join(import.meta.dirname, '../../..');
const fixture = join(root, 'tests/fixtures/budgets/ir-thermometer.json');
import { parseArgs } from '../../../server/cli/evaluate';

/** Spawn `npx tsx server/cli/evaluate.ts …` and collect its output. */
function run(...args: string[]): Promise<{ status: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn('npx', ['tsx', 'server/cli/evaluate.ts', ...args], { cwd: root });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d) => (stdout += d));
    child.stderr.on('data', (d) => (stderr += d));
    child.on('error', reject);
    child.on('close', (status) => resolve({ status, stdout, stderr }));
  });
}

describe('npm run evaluate', () => {
  it('prints the result JSON for the example budget (GUM and Monte Carlo)', async () => {
    const r = await run(fixture, '--trials', '20000', '--seed', '7');
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const result = JSON.parse(r.stdout);
    expect(result.measurand).toBe('E');
    expect(result.unit).toBe('K');
    expect(result.gum.budget).toHaveLength(8);
    expect(result.mcm.trials).toBeGreaterThanOrEqual(20000);
    expect(result.mcm.seed).toBe(7);
    expect(result.reported.k).toMatch(/^\d+\.\d\d$/);
    expect(result.engineVersion).toMatch(/^emberline-engine /);
  }, 120_000);

  it('--threads 2 shares the trials among worker threads and prints the same result as one thread', async () => {
    const [one, two] = await Promise.all([
      run(fixture, '--trials', '150000', '--seed', '11'),
      run(fixture, '--trials', '150000', '--seed', '11', '--threads', '2'),
    ]);
    expect(two.stderr).toBe('');
    expect(two.status).toBe(0);
    expect(JSON.parse(two.stdout).mcm.trials).toBe(150000);
    expect(two.stdout).toBe(one.stdout);
  }, 180_000);

  it('--no-mcm gives null mcm and validation', async () => {
    const r = await run(fixture, '--no-mcm');
    expect(r.status).toBe(0);
    const result = JSON.parse(r.stdout);
    expect(result.mcm).toBeNull();
    expect(result.validation).toBeNull();
  }, 120_000);

  it('reports a random seed when neither the document nor --seed gives one', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'emberline-cli-'));
    const doc = { equations: ['y = a + b'], inputs: [{ symbol: 'a', distribution: { type: 'normal', mean: 0, sd: 1 } }, { symbol: 'b', distribution: { type: 'rectangular', min: -1, max: 1 } }] };
    const file = join(dir, 'noseed.json');
    writeFileSync(file, JSON.stringify(doc));
    const r = await run(file, '--trials', '10000');
    expect(r.status).toBe(0);
    expect(Number.isInteger(JSON.parse(r.stdout).mcm.seed)).toBe(true);
  }, 120_000);

  it('exits 2 with a message on stderr for broken input', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'emberline-cli-'));
    const badJson = join(dir, 'bad.json');
    writeFileSync(badJson, '{ "equations": [');
    const badSchema = join(dir, 'schema.json');
    writeFileSync(badSchema, JSON.stringify({ equations: ['y = x'], inputs: [{ symbol: 'x', distribution: { type: 'normal', mean: 0, sd: -1 } }] }));
    const badModel = join(dir, 'model.json');
    writeFileSync(badModel, JSON.stringify({ equations: ['y = x + import("fs")'], inputs: [{ symbol: 'x', distribution: { type: 'normal', mean: 0, sd: 1 } }] }));
    const cases: Array<[string[], RegExp]> = [
      [[join(dir, 'missing.json')], /cannot read .*no such file/],
      [[badJson], /is not valid JSON/],
      [[badSchema], /INVALID_DOCUMENT.*inputs\.0\.distribution\.sd: sd must not be negative/],
      [[badModel], /UNKNOWN_FUNCTION \(equation 1, character 9\).*unknown function "import"/],
    ];
    const results = await Promise.all(cases.map(([args]) => run(...args)));
    results.forEach((r, i) => {
      expect(r.status, cases[i][0].join(' ')).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr).toMatch(cases[i][1]);
    });
  }, 240_000);

  it('parses its options and refuses bad ones with a message', () => {
    expect(parseArgs(['f.json', '--trials', '5000', '--seed', '3', '--no-mcm'])).toEqual({ file: 'f.json', trials: 5000, seed: 3, mcm: false, threads: 1 });
    expect(parseArgs(['f.json', '--threads', '4'])).toMatchObject({ threads: 4 });
    expect(() => parseArgs(['f.json', '--threads', '0'])).toThrow(/--threads must lie between 1 and 256/);
    expect(() => parseArgs([])).toThrow(/no budget file given/);
    expect(() => parseArgs(['f.json', '--seed', '-1'])).toThrow(/--seed needs a whole number/);
    expect(() => parseArgs(['f.json', '--trials', '10'])).toThrow(/--trials must lie between 1000/);
    expect(() => parseArgs(['f.json', '--fast'])).toThrow(/unknown option --fast/);
    expect(() => parseArgs(['a.json', 'b.json'])).toThrow(/only one file/);
  });
});
