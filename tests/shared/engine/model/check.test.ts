/**
 * The allow-list check of the model language (DESIGN.md, "The model language"): every refusal
 * names what is wrong and where (a 0-based character position), and nothing crashes.
 * Expected positions are counted by hand from the equation text (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { checkEquations, MAX_EXPRESSION_LENGTH, MAX_NESTING } from '../../../../shared/engine/model/check';

const known = ['x', 'T', 'lambda'];
const one = (eq: string) => {
  const r = checkEquations([eq], known);
  expect(r.ok).toBe(false);
  return r.errors[0];
};

describe('checkEquations: accepted models', () => {
  it('accepts numbers, symbols, + - * / ^, unary minus, parentheses and the listed functions', () => {
    const r = checkEquations(['a = -x^2 + 3*(x - 1)/2 + exp(x) + log(x) + log10(x) + sqrt(x) + abs(x)', 'b = sin(x) + cos(x) + tan(x) + asin(x) + acos(x) + atan(x) + min(x, 1) + max(x, a, 2)', 'L = planck(lambda, T) * c1L / c2 + sigma * h * c0 * kB + c2_its90 + pi + b'], known);
    expect(r.errors).toEqual([]);
    expect(r.ok).toBe(true);
    expect(r.defines).toEqual(['a', 'b', 'L']);
  });

  it('accepts every radiometric function with its number of arguments', () => {
    const r = checkEquations(['y = planck(lambda, T) + planck_nu(x, T) + planck_temperature(lambda, x) + band_radiance(lambda, x, T) + stefan_boltzmann(T) + wien_peak(T) + sh_signal(T, x, x, x) + sh_temperature(x, x, x, x) + its90_ratio(lambda, T, x)'], known);
    expect(r.errors).toEqual([]);
  });
});

describe('checkEquations: refusals with message and position', () => {
  const cases: Array<[string, string, number, RegExp]> = [
    ['y = foo + x', 'UNKNOWN_SYMBOL', 4, /unknown symbol "foo"/],
    ['y = bar(x)', 'UNKNOWN_FUNCTION', 4, /unknown function "bar"/],
    ['y = import("fs")', 'UNKNOWN_FUNCTION', 4, /unknown function "import"/],
    ['y = x.constructor', 'FORBIDDEN_SYNTAX', 5, /property access "x.constructor"/],
    ['y = x[1]', 'FORBIDDEN_SYNTAX', 5, /indexing/],
    ['y = [1, 2]', 'FORBIDDEN_SYNTAX', 4, /matrices/],
    ['y = "text"', 'FORBIDDEN_SYNTAX', 4, /strings/],
    ['y = (z = 3) + x', 'FORBIDDEN_SYNTAX', 7, /assignment inside an expression/],
    ['f(t) = t^2', 'FORBIDDEN_SYNTAX', 5, /function definitions/],
    ['y = 1:3', 'FORBIDDEN_SYNTAX', 5, /ranges/],
    ['y = x > 1 ? x : 1', 'FORBIDDEN_SYNTAX', 10, /conditional expressions/],
    ['y = x mod 2', 'FORBIDDEN_SYNTAX', 6, /operator "mod"/],
    ['y = 2x', 'FORBIDDEN_SYNTAX', 5, /implicit multiplication/],
    ['y = {a: 1}', 'FORBIDDEN_SYNTAX', 4, /objects/],
    ['y = true', 'FORBIDDEN_SYNTAX', 4, /not a number/],
    ['y = x; z = 2', 'FORBIDDEN_SYNTAX', 5, /more than one statement/],
    ['y = x +', 'PARSE_ERROR', 6, /cannot be read/],
    ['x + 1', 'FORBIDDEN_SYNTAX', 0, /symbol = expression/],
    ['y = planck(lambda)', 'FORBIDDEN_SYNTAX', 4, /planck takes 2 arguments \(lambda, T\), not 1/],
    ['y = log(x, 2)', 'FORBIDDEN_SYNTAX', 4, /log takes 1 argument/],
  ];
  for (const [eq, code, position, message] of cases) {
    it(`refuses ${JSON.stringify(eq)}`, () => {
      const e = one(eq);
      expect(e.code).toBe(code);
      expect(e.message).toMatch(message);
      expect(e.position).toBe(position);
      expect(e.equation).toBe(0);
      expect(e.length).toBeGreaterThanOrEqual(1);
    });
  }

  it('refuses a 10^6-character expression before parsing it', () => {
    const e = one(`y = ${'x + '.repeat(250_000)}x`);
    expect(e.code).toBe('TOO_LARGE');
    expect(e.message).toMatch(new RegExp(`at most ${MAX_EXPRESSION_LENGTH}`));
  });

  it('refuses deeply nested parentheses before parsing, pointing at the first bracket too deep', () => {
    const eq = `y = ${'('.repeat(MAX_NESTING + 1)}x${')'.repeat(MAX_NESTING + 1)}`;
    const e = one(eq);
    expect(e.code).toBe('TOO_LARGE');
    expect(e.position).toBe(4 + MAX_NESTING);
    expect(checkEquations([`y = ${'('.repeat(MAX_NESTING)}x${')'.repeat(MAX_NESTING)}`], known).ok).toBe(true);
  });

  it('refuses a long chain of unary minus (deep tree) without crashing', () => {
    const e = one(`y = ${'-'.repeat(5000)}x`);
    expect(e.code).toBe('TOO_LARGE');
  });

  it('names a symbol used before the equation that defines it', () => {
    const r = checkEquations(['a = b + x', 'b = 2 * x'], known);
    expect(r.errors[0]).toMatchObject({ equation: 0, position: 4, code: 'UNKNOWN_SYMBOL' });
    expect(r.errors[0].message).toMatch(/equation 1: b is used before it is defined \(by equation 2\)/);
  });

  it('points at the right side when an equation uses its own symbol', () => {
    expect(checkEquations(['y = y + 1'], known).errors[0]).toMatchObject({ position: 4, code: 'UNKNOWN_SYMBOL' });
  });

  it('refuses redefining an input or an earlier intermediate', () => {
    expect(checkEquations(['x = 2 * T'], known).errors[0].message).toMatch(/redefines x, which is an input quantity/);
    expect(checkEquations(['a = x', 'a = T'], known).errors[0].message).toMatch(/defines a again/);
  });

  it('names quantities of the model by their typeset symbol (shared/format/symbols), and quotes an unknown name as typed', () => {
    // The plain-text reading the budget table and the certificate use: eps_bb → ε_bb,
    // dT_res → δT_res, lambda_eff → λ_eff (ISO 80000-1 §7.1; tests/shared/format/symbols.test.ts).
    const inputs = ['eps_bb', 'dT_drift', 'lambda_eff'];
    expect(checkEquations(['y = eps_bb * dT_res', 'dT_res = 2 * dT_drift'], inputs).errors[0].message).toBe('equation 1: δT_res is used before it is defined (by equation 2); equations are evaluated in order');
    expect(checkEquations(['eps_bb = 2 * dT_drift'], inputs).errors[0].message).toBe('equation 1 redefines ε_bb, which is an input quantity or a constant');
    expect(checkEquations(['T_lambda = lambda_eff', 'T_lambda = 2'], inputs).errors[0].message).toBe('equation 2 defines T_λ again (already defined by equation 1)');
    expect(checkEquations(['dT = dT + 1'], inputs).errors[0].message).toBe('equation 1: δT is defined by this equation and cannot be used on its right side');
    // Not a quantity of the model: the author finds it in the equation as typed.
    expect(checkEquations(['y = lamda_eff * eps_bb'], inputs).errors[0].message).toMatch(/unknown symbol "lamda_eff"/);
  });

  it('reports the equation index of a problem in a later equation', () => {
    const r = checkEquations(['a = x', 'b = a + nope'], known);
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]).toMatchObject({ equation: 1, position: 8, length: 4 });
  });
});

describe('checkEquations never crashes (property test, fast-check)', () => {
  it('returns a result with in-range positions for arbitrary text', async () => {
    const fc = (await import('fast-check')).default;
    const alphabet = fc.constantFrom(...'xyT()[]{}.,;:?!=+-*/^%\'"0123456789e abc_\n'.split(''), 'exp(', 'import(', 'planck(', '==', '.*', 'mod', ' to ');
    fc.assert(
      fc.property(fc.array(alphabet, { maxLength: 60 }), (parts) => {
        const eq = parts.join('');
        const r = checkEquations([eq], known);
        for (const e of r.errors) {
          expect(e.position).toBeGreaterThanOrEqual(0);
          expect(e.position).toBeLessThanOrEqual(Math.max(0, eq.length));
          expect(e.message.length).toBeGreaterThan(0);
        }
      }),
      { numRuns: 2000, seed: 20261201 },
    );
  });
});
