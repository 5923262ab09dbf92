/**
 * Hostile input to the model language (issue 8), property-based with fast-check: arbitrary text
 * and arbitrary expression trees given to checkEquations, compileModel and evaluateGum either
 * give a result or throw the engine's own EngineError — never another exception, never run code
 * outside the allow-list (a canary on globalThis must stay untouched, Object.prototype unpolluted)
 * and always finish: each case is bounded by the engine's own limits (MAX_EXPRESSION_LENGTH,
 * MAX_NESTING, the tree-depth limit), the test timeout is generous, no time is measured.
 * Sources: OWASP ASVS 4.0 V5.2.4 (no eval or dynamic code execution on untrusted input), V5.1.3
 * (input validated by allow-list), fast-check documentation (fc.letrec, fc.assert).
 */
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkEquations, compileModel, EngineError, evaluateGum, MAX_EXPRESSION_LENGTH, MAX_NESTING, parseBudget } from '../../../shared/engine';

const CANARY = '__emberline_canary';
/** Fixed seeds, so a failure repeats; FC_SEED=n explores another part of the space. */
const seedOffset = Number(process.env.FC_SEED ?? 0);
let touched = 0;
beforeAll(() => {
  Object.defineProperty(globalThis, CANARY, {
    configurable: true,
    get() {
      touched++;
      return () => {
        touched++;
        return 1;
      };
    },
  });
});
afterAll(() => {
  delete (globalThis as Record<string, unknown>)[CANARY];
});

const KNOWN_CODES = new Set(['INVALID_DOCUMENT', 'PARSE_ERROR', 'UNKNOWN_SYMBOL', 'UNKNOWN_FUNCTION', 'FORBIDDEN_SYNTAX', 'TOO_LARGE', 'UNDEFINED_MEASURAND', 'NON_FINITE', 'INVALID_DISTRIBUTION', 'NOT_POSITIVE_DEFINITE', 'UNIT_MISMATCH', 'TOO_FEW_READINGS']);

const doc = (equations: string[], inputSymbols: string[] = ['x1', 'x2']) => ({
  measurand: { symbol: 'y', unit: '1' },
  equations,
  constants: {},
  inputs: inputSymbols.map((symbol, i) => ({ symbol, unit: '1', distribution: { type: 'normal', mean: i + 1, sd: 0.1 } })),
  correlations: [],
  coverage: 0.9545,
});

/** Runs `f`; passes when it returns or throws an EngineError with a known code. */
function onlyEngineErrors(f: () => unknown): 'ok' | string {
  try {
    f();
    return 'ok';
  } catch (err) {
    if (!(err instanceof EngineError)) throw new Error(`not an EngineError: ${err instanceof Error ? `${err.name}: ${err.message}` : String(err)}`, { cause: err });
    expect(KNOWN_CODES.has(err.code), err.code).toBe(true);
    expect(err.message.length).toBeGreaterThan(0);
    return err.code;
  }
}

function expectNoSideEffects() {
  expect(touched, 'generated code reached the canary on globalThis').toBe(0);
  expect(Object.keys(Object.prototype)).toEqual([]);
  expect(({} as Record<string, unknown>).polluted).toBeUndefined();
}

/** Everything a hostile model might try: JS and mathjs syntax, names of dangerous globals. */
const HOSTILE_TOKENS = [
  'x1', 'x2', 'y', 'pi', 'c2', ' ', '(', ')', '[', ']', '{', '}', ',', ';', '\n', '=', '==', '+', '-', '*', '/', '^', '%', '!', '?', ':', '.', "'", '"', '`', '${', '=>', '\\',
  'exp(', 'log(', 'sqrt(', 'min(', 'planck(', 'band_radiance(', 'import(', 'eval(', 'evaluate(', 'parse(', 'Function(', 'require(', 'createUnit(', 'simplify(', 'derivative(',
  'constructor', '__proto__', 'prototype', 'globalThis', 'process', 'this', 'window', CANARY, `${CANARY}(`, '.constructor', '["constructor"]', 'polluted',
  'f(x) = ', ' to ', ' cm', ' in ', 'mod', 'and', 'or', 'not', 'true', 'null', 'undefined', 'NaN', 'Infinity', '1e308', '1e400', '0x1F', '0b1', '-0', '1:3', '@', '#', '\u0000', 'é', '𝛌',
];

describe('model language: arbitrary text', () => {
  it('when an equation is arbitrary text (any characters, hostile tokens), then only results or EngineErrors come back and nothing outside the engine runs', () => {
    const text = fc.oneof(
      fc.string({ unit: 'binary', maxLength: 200 }),
      fc.array(fc.constantFrom(...HOSTILE_TOKENS), { maxLength: 40 }).map((parts) => parts.join('')),
      fc.array(fc.constantFrom(...HOSTILE_TOKENS), { maxLength: 40 }).map((parts) => `y = ${parts.join('')}`),
    );
    fc.assert(
      fc.property(fc.array(text, { minLength: 1, maxLength: 3 }), (equations) => {
        const checked = checkEquations(equations, ['x1', 'x2']);
        expect(typeof checked.ok).toBe('boolean');
        onlyEngineErrors(() => compileModel(parseBudget(doc(equations))));
        onlyEngineErrors(() => evaluateGum(doc(equations)));
      }),
      { numRuns: 1500, seed: 8_2026_12 + seedOffset },
    );
    expectNoSideEffects();
  });

  it('when an equation is over the length or nesting limit, then it is refused (TOO_LARGE, or by the document schema first)', () => {
    const long = `y = ${'x1 + '.repeat(MAX_EXPRESSION_LENGTH / 5)}x2`;
    expect(checkEquations([long], ['x1', 'x2']).errors[0].code).toBe('TOO_LARGE');
    expect(['TOO_LARGE', 'INVALID_DOCUMENT']).toContain(onlyEngineErrors(() => evaluateGum(doc([long]))));
    const deep = `y = ${'('.repeat(MAX_NESTING * 50)}x1${')'.repeat(MAX_NESTING * 50)}`;
    expect(onlyEngineErrors(() => evaluateGum(doc([deep])))).toBe('TOO_LARGE');
    const deepCalls = `y = ${'exp('.repeat(MAX_NESTING + 1)}x1${')'.repeat(MAX_NESTING + 1)}`;
    expect(onlyEngineErrors(() => evaluateGum(doc([deepCalls])))).toBe('TOO_LARGE');
    // Deep without brackets: a long chain of unary minus or powers.
    expect(onlyEngineErrors(() => evaluateGum(doc([`y = ${'-'.repeat(5000)}x1`])))).not.toBe('ok');
    expectNoSideEffects();
  });

  it('when the classic escapes are tried, then each is refused before any code is generated', () => {
    const attempts = [
      'y = x1.constructor',
      'y = x1["constructor"]("return 1")',
      'y = constructor.constructor("return process")()',
      'y = import({ exp: 1 }, { override: true })',
      'y = evaluate("1+1")',
      'y = parse("1").compile().evaluate()',
      `y = ${CANARY}()`,
      `y = ${CANARY}`,
      'y = __proto__.polluted',
      'y = f(x) = 1',
      'f(x) = x1',
      'y = "text"',
      'y = 5 cm to m',
      'y = x1; y = x2',
      'y = x1 ? x2 : 0',
      'y = [x1, x2]',
      'y = {a: x1}',
      'y = x1 == x2',
      'y = x1!',
      'y = globalThis',
      'y = process.exit(1)',
      'y = Infinity',
      'y = NaN',
      'y = 1e400 * x1',
    ];
    for (const a of attempts) {
      const r = checkEquations([a], ['x1', 'x2']);
      expect(r.ok, a).toBe(false);
      expect(onlyEngineErrors(() => evaluateGum(doc([a]))), a).not.toBe('ok');
    }
    expectNoSideEffects();
  });
});

/** Random expression trees in mathjs syntax, with allowed and forbidden constructs mixed. */
const expression = fc.letrec<{ expr: string }>((tie) => ({
  expr: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    fc.constantFrom('x1', 'x2', 'pi', 'c2', 'sigma', 'kB', 'nope', 'constructor', '__proto__', 'globalThis', 'process', 'this', CANARY, 'NaN', 'Infinity', 'true', 'null', 'undefined'),
    fc.double().map((v) => String(v)),
    fc.integer().map(String),
    fc.constantFrom('1e308', '1e-320', '0', '-0', '"x"', "'y'", '5 cm', '[1, 2]', '{a: 1}'),
    fc.tuple(tie('expr'), fc.constantFrom('+', '-', '*', '/', '^', ' mod ', '==', ' and ', ' to ', '.*', ':'), tie('expr')).map(([a, op, b]) => `(${a}${op}${b})`),
    tie('expr').map((a) => `-(${a})`),
    tie('expr').map((a) => `(${a})!`),
    fc.tuple(fc.constantFrom('exp', 'log', 'log10', 'sqrt', 'abs', 'sin', 'cos', 'tan', 'asin', 'acos', 'atan', 'stefan_boltzmann', 'wien_peak', 'eval', 'import', 'evaluate', 'Function', 'require', CANARY, 'constructor', 'f'), tie('expr')).map(([f, a]) => `${f}(${a})`),
    fc.tuple(fc.constantFrom('min', 'max', 'planck', 'planck_nu', 'planck_temperature', 'band_radiance', 'sh_signal', 'its90_ratio'), fc.array(tie('expr'), { minLength: 0, maxLength: 4 })).map(([f, args]) => `${f}(${args.join(', ')})`),
    fc.tuple(tie('expr'), tie('expr'), tie('expr')).map(([c, a, b]) => `(${c} ? ${a} : ${b})`),
    tie('expr').map((a) => `(${a}).constructor`),
    tie('expr').map((a) => `(${a})["constructor"]`),
    tie('expr').map((a) => `(${a})[1]`),
  ),
})).expr;

describe('model language: arbitrary expression trees', () => {
  it('when the right side is a random expression tree, then evaluateGum gives a result or an EngineError, with no side effects', () => {
    fc.assert(
      fc.property(expression, fc.boolean(), (expr, twoEquations) => {
        const equations = twoEquations ? [`a = ${expr}`, `y = a * x1`] : [`y = ${expr}`];
        const outcome = onlyEngineErrors(() => evaluateGum(doc(equations)));
        if (outcome === 'ok') {
          // Anything accepted must be made of allowed names only.
          expect(expr).not.toMatch(new RegExp(`constructor|__proto__|globalThis|process|${CANARY}|eval|import|Function|require`));
        }
      }),
      { numRuns: 1500, seed: 8_2026_13 + seedOffset, maxSkipsPerRun: 0 },
    );
    expectNoSideEffects();
  });

  it('when input symbols carry dangerous names, then the document is refused or the names stay plain variables', () => {
    fc.assert(
      fc.property(fc.constantFrom('constructor', '__proto__', 'toString', 'hasOwnProperty', 'valueOf', 'process', 'globalThis', 'F', 'x', 'Math', CANARY, 'return', 'function', 'let'), (name) => {
        const outcome = onlyEngineErrors(() => evaluateGum(doc([`y = ${name} * 2`], [name])));
        if (outcome === 'ok') {
          const result = evaluateGum(doc([`y = ${name} * 2`], [name]));
          expect(result.gum.y).toBeCloseTo(2, 12);
        }
      }),
      { numRuns: 14, seed: 8_2026_14 + seedOffset },
    );
    expectNoSideEffects();
  });
});
