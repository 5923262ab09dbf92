/**
 * Evaluate a budget document from the command line:
 *
 *   npm run -s evaluate -- FILE.json [--trials N] [--seed S] [--no-mcm] [--threads T]
 *
 * Prints the result JSON (DESIGN.md) on stdout. Invalid input — an unreadable file, bad JSON,
 * schema errors, engine errors, bad options — gives a message on stderr and exit code 2.
 * When neither --seed nor the document gives a Monte Carlo seed, a random one is drawn here
 * (the engine itself has no hidden randomness) and reported in `mcm.seed`.
 * --threads T (default 1) shares the Monte Carlo trials among T worker threads
 * (server/workers/monte-carlo-in-blocks.ts): the same result for the same seed, sooner for long
 * runs; starting the threads takes a few seconds, so it pays from about 10^7 trials.
 */
import { readFileSync } from 'node:fs';
import { randomInt } from 'node:crypto';
import { pathToFileURL } from 'node:url';
import { evaluate, EngineError } from '../../shared/engine';
import { createParallelEvaluator } from '../workers/monte-carlo-in-blocks';

const USAGE = 'usage: npm run -s evaluate -- FILE.json [--trials N] [--seed S] [--no-mcm] [--threads T]';

class UsageError extends Error {}

interface Args {
  file: string;
  trials?: number;
  seed?: number;
  mcm: boolean;
  threads: number;
}

function wholeNumber(flag: string, value: string | undefined, min: number, max: number): number {
  if (value === undefined || !/^\d+$/.test(value)) throw new UsageError(`${flag} needs a whole number, got ${value === undefined ? 'nothing' : JSON.stringify(value)}`);
  const n = Number(value);
  if (n < min || n > max) throw new UsageError(`${flag} must lie between ${min} and ${max}, got ${value}`);
  return n;
}

export function parseArgs(argv: string[]): Args {
  const args: Partial<Args> & { mcm: boolean; threads: number } = { mcm: true, threads: 1 };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--trials') args.trials = wholeNumber('--trials', argv[++i], 1000, 100_000_000);
    else if (a === '--seed') args.seed = wholeNumber('--seed', argv[++i], 0, 2 ** 32 - 1);
    else if (a === '--no-mcm') args.mcm = false;
    else if (a === '--threads') args.threads = wholeNumber('--threads', argv[++i], 1, 256);
    else if (a.startsWith('--')) throw new UsageError(`unknown option ${a}`);
    else if (args.file === undefined) args.file = a;
    else throw new UsageError(`only one file can be evaluated, got ${JSON.stringify(args.file)} and ${JSON.stringify(a)}`);
  }
  if (!args.file) throw new UsageError('no budget file given');
  return args as Args;
}

function fail(message: string): never {
  process.stderr.write(`evaluate: ${message}\n`);
  process.exit(2);
}

async function main(): Promise<void> {
  let args: Args;
  try {
    args = parseArgs(process.argv.slice(2));
  } catch (e) {
    fail(`${(e as Error).message}\n${USAGE}`);
  }
  let text: string;
  try {
    text = readFileSync(args.file, 'utf8');
  } catch (e) {
    fail(`cannot read ${args.file}: ${(e as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such file' : (e as Error).message}`);
  }
  let doc: unknown;
  try {
    doc = JSON.parse(text);
  } catch (e) {
    fail(`${args.file} is not valid JSON: ${(e as Error).message}`);
  }
  const opts = { mcm: args.mcm, trials: args.trials, seed: args.seed, seedSource: () => randomInt(0, 2 ** 32 - 1) };
  const parallel = args.threads > 1 && args.mcm ? createParallelEvaluator(args.threads) : null;
  try {
    const result = parallel ? await parallel.evaluate(doc, opts) : evaluate(doc, opts);
    process.stdout.write(`${JSON.stringify(result, null, 2)}\n`);
  } catch (e) {
    if (e instanceof EngineError) {
      const where = e.equation !== undefined ? ` (equation ${e.equation + 1}${e.position !== undefined ? `, character ${e.position + 1}` : ''})` : '';
      await parallel?.destroy();
      fail(`${args.file}: ${e.code}${where}: ${e.message}`);
    }
    throw e;
  } finally {
    await parallel?.destroy();
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) void main();
