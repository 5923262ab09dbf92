/**
 * Model compilation: scalar function, vectorised kernel, sensitivity coefficients.
 * Reference values: Planck's law with the exact 2019 SI constants (../shared/reference/README.md
 * §2, computed with numpy from the SI defining constants); derivatives are checked against
 * central differences computed here with Richardson extrapolation (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import type { BudgetDocument } from '../../../../shared/schemas/budget.schema';
import { EngineError } from '../../../../shared/engine/errors';
import { compileModel, compileModelWith } from '../../../../shared/engine/model';
import { stubLibrary } from './stub-library';

const doc = (equations: string[], symbols: string[], extra: Partial<BudgetDocument> = {}): BudgetDocument => ({
  equations,
  inputs: symbols.map((symbol) => ({ symbol, distribution: { type: 'normal', mean: 0, sd: 1 } })),
  ...extra,
}) as BudgetDocument;

/** Richardson-extrapolated central difference (independent of the engine's step rule). */
function richardson(f: (v: number) => number, x: number, h: number): number {
  const d = (s: number) => (f(x + s) - f(x - s)) / (2 * s);
  return (4 * d(h / 2) - d(h)) / 3;
}

describe('compileModel', () => {
  it('evaluates intermediates in order, with document and library constants', () => {
    const m = compileModel(doc(['a = x + k', 'y = a * 2 + 0 * c2'], ['x'], { constants: { k: 3 } }));
    expect(m.measurand).toBe('y');
    expect(m.scalar([1])).toBe(8);
  });

  it('reproduces Planck check values through the model (README §2, computed from the SI constants)', () => {
    const m = compileModel(doc(['L = planck(lambda, T)'], ['lambda', 'T']));
    expect(m.scalar([1e-6, 1000]) / 6.720461e7 - 1).toBeLessThan(1e-6);
    expect(Math.abs(m.scalar([650e-9, 3000]) / 6.415912e11 - 1)).toBeLessThan(1e-6);
  });

  it('fills a Float64Array chunk with the kernel, equal to the scalar function', () => {
    const m = compileModel(doc(['L = eps * planck(lambda, T) + (1 - eps) * planck(lambda, Ta)', 'Tr = planck_temperature(lambda, L)'], ['eps', 'lambda', 'T', 'Ta']));
    const n = 5;
    const cols = [new Float64Array([0.9, 0.95, 0.99, 1, 0.5]), new Float64Array(n).fill(1e-5), new Float64Array([300, 400, 500, 600, 700]), new Float64Array(n).fill(296)];
    const out = new Float64Array(n);
    m.kernel(cols, out, n);
    for (let t = 0; t < n; t++) expect(out[t]).toBe(m.scalar(cols.map((c) => c[t])));
  });

  it('uses doc.measurand when it names a quantity defined by an equation, and refuses one that is not', () => {
    const m = compileModel(doc(['a = 2 * x', 'b = a + 1'], ['x'], { measurand: { symbol: 'a' } }));
    expect(m.scalar([2])).toBe(4);
    expect(() => compileModel(doc(['a = 2 * x'], ['x'], { measurand: { symbol: 'q' } }))).toThrow(/measurand q is not defined/);
  });

  it('names quantities in its errors by their typeset symbols (shared/format/symbols: eps_bb → ε_bb, dT_res → δT_res)', () => {
    expect(() => compileModel(doc(['eps_bb = 2 * x', 'dT_res = eps_bb + x'], ['x'], { measurand: { symbol: 'T_lambda' } }))).toThrow('the measurand T_λ is not defined by any equation (defined: ε_bb, δT_res)');
    expect(() => compileModel(doc(['dT_res = log(eps_bb)'], ['eps_bb'])).scalar([-1])).toThrow('equation 1 ("δT_res = log(ε_bb)") evaluates to NaN');
  });

  it('throws EngineError for a refused equation, with its equation index and position', () => {
    try {
      compileModel(doc(['a = x', 'y = a + nope'], ['x']));
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(EngineError);
      expect(e).toMatchObject({ code: 'UNKNOWN_SYMBOL', equation: 1, position: 8 });
    }
  });

  it('flags exp(1e6) as NON_FINITE naming the equation, never a silent Infinity', () => {
    const m = compileModel(doc(['a = exp(x)', 'y = a - 1'], ['x']));
    expect(() => m.scalar([1e6])).toThrow(EngineError);
    try {
      m.scalar([1e6]);
    } catch (e) {
      expect((e as EngineError).code).toBe('NON_FINITE');
      expect((e as EngineError).message).toMatch(/equation 1 \("a = exp\(x\)"\) evaluates to Infinity/);
    }
    expect(() => compileModel(doc(['y = log(x)'], ['x'])).scalar([-1])).toThrow(/evaluates to NaN/);
  });

  it('symbolic derivatives agree with central differences on a Planck model (radiance temperature with emissivity)', () => {
    const m = compileModel(doc(['L = eps * planck(lambda, T) + (1 - eps) * planck(lambda, Ta)', 'Tr = planck_temperature(lambda, L / eps0)'], ['eps', 'lambda', 'T', 'Ta', 'eps0']));
    const x = [0.98, 1.0e-5, 500, 296, 0.97];
    const u = [0.005, 5e-8, 0.1, 1, 0.005];
    const { c, method } = m.sensitivities(x, u);
    expect(method).toEqual(['symbolic', 'symbolic', 'symbolic', 'symbolic', 'symbolic']);
    x.forEach((xi, i) => {
      const f = (v: number) => m.scalar(x.map((q, j) => (j === i ? v : q)));
      const ref = richardson(f, xi, u[i]);
      expect(Math.abs(c[i] - ref)).toBeLessThanOrEqual(1e-6 * Math.abs(ref) + 1e-12);
    });
  });

  it('expands every radiometric function for symbolic differentiation (checked against central differences)', () => {
    const models: Array<[string, number[]]> = [
      ['y = planck_nu(nu, T)', [3e13, 1000]],
      ['y = stefan_boltzmann(T) * nu', [1000, 2]],
      ['y = wien_peak(T) * nu', [1000, 2]],
      ['y = sh_signal(T, nu, 1e-8, 3)', [1000, 9e-7]],
      ['y = sh_temperature(nu, 9e-7, 1e-8, 3)', [0.01, 0]],
      ['y = its90_ratio(1e-6 * nu, T, 1337.33)', [0.65, 1500]],
    ];
    for (const [eq, x] of models) {
      const symbols = eq.includes('sh_temperature') ? ['nu', 'T'] : ['nu', 'T'];
      const m = compileModel(doc([eq], symbols));
      const { c, method } = m.sensitivities(x);
      x.forEach((xi, i) => {
        if (!eq.includes(symbols[i])) return;
        const f = (v: number) => m.scalar(x.map((q, j) => (j === i ? v : q)));
        const ref = richardson(f, xi, Math.abs(xi) * 1e-4);
        expect(method[i]).toBe('symbolic');
        expect(Math.abs(c[i] - ref), `${eq} ∂/∂${symbols[i]}`).toBeLessThanOrEqual(1e-6 * Math.abs(ref) + 1e-15);
      });
    }
  });

  it('band_radiance: exact derivatives in the band limits, central differences for the temperature, and says so', () => {
    const m = compileModelWith(doc(['y = k * band_radiance(l1, l2, T)'], ['l1', 'l2', 'T', 'k']), stubLibrary);
    const x = [8e-6, 14e-6, 300, 2];
    const { c, method } = m.sensitivities(x, [1e-8, 1e-8, 0.1, 0.01]);
    expect(method).toEqual(['symbolic', 'symbolic', 'numeric', 'symbolic']);
    const fT = (v: number) => m.scalar([x[0], x[1], v, x[3]]);
    expect(Math.abs(c[2] / richardson(fT, 300, 0.1) - 1)).toBeLessThan(1e-6);
    // ∂B/∂λ1 = −L(λ1, T), ∂B/∂λ2 = L(λ2, T) (fundamental theorem of calculus).
    const planck = stubLibrary.functions.planck;
    expect(Math.abs(c[0] / (-2 * planck(8e-6, 300)) - 1)).toBeLessThan(1e-12);
    expect(Math.abs(c[1] / (2 * planck(14e-6, 300)) - 1)).toBeLessThan(1e-12);
    expect(c[3]).toBeCloseTo(stubLibrary.functions.band_radiance(8e-6, 14e-6, 300), 6);
  });

  it('band_radiance nested in a larger model with the real library: symbolic limits agree with central differences', () => {
    const m = compileModel(doc(['B = band_radiance(lc - w / 2, lc + w / 2, T)', 'y = eps * B / (w * planck(lc, T))'], ['lc', 'w', 'T', 'eps']));
    const x = [10e-6, 4e-6, 350, 0.97];
    const u = [2e-8, 2e-8, 0.1, 0.001];
    const { c, method } = m.sensitivities(x, u);
    expect(method).toEqual(['symbolic', 'symbolic', 'numeric', 'symbolic']);
    x.forEach((xi, i) => {
      const ref = richardson((v) => m.scalar(x.map((q, j) => (j === i ? v : q))), xi, u[i] * 10);
      expect(Math.abs(c[i] - ref)).toBeLessThanOrEqual(1e-6 * Math.abs(ref) + 1e-9);
    });
  });

  it('gives exact zero sensitivities for inputs the measurand does not use', () => {
    const m = compileModel(doc(['y = 2 * a'], ['a', 'unused']));
    expect(m.sensitivities([1, 5])).toEqual({ c: [2, 0], method: ['symbolic', 'symbolic'] });
  });

  it('falls back to central differences where mathjs has no derivative rule (max)', () => {
    const m = compileModel(doc(['y = max(a, b) * 3'], ['a', 'b']));
    const { c, method } = m.sensitivities([2, 1], [0.1, 0.1]);
    expect(method).toEqual(['numeric', 'numeric']);
    expect(c[0]).toBeCloseTo(3, 8);
    expect(c[1]).toBeCloseTo(0, 8);
  });
});

describe('compileModel reuse (a budget recomputed with new values keeps its compiled model)', () => {
  // Design property of the engine (shared/engine/model/index.ts), common practice, no source.
  it('hands out the same compiled model when only values and distributions change', () => {
    const a = compileModel(doc(['y = x * k'], ['x'], { constants: { k: 2 } }));
    const other = doc(['y = x * k'], ['x'], { constants: { k: 2 } });
    other.inputs[0].distribution = { type: 'rectangular', min: 1, max: 3 };
    expect(compileModel(other)).toBe(a);
    expect(a.scalar([5])).toBe(10);
  });

  it('compiles again when an equation, an input symbol, a constant, the measurand or codegen differ', () => {
    const a = compileModel(doc(['y = x * k'], ['x'], { constants: { k: 2 } }));
    const b = compileModel(doc(['y = x * k'], ['x'], { constants: { k: 3 } }));
    expect(b).not.toBe(a);
    expect(b.scalar([5])).toBe(15);
    expect(compileModel(doc(['y = x * 2'], ['x']))).not.toBe(a);
    expect(compileModel(doc(['y = z * k'], ['z'], { constants: { k: 2 } }))).not.toBe(a);
    expect(compileModel(doc(['y = x * k', 'w = y + 1'], ['x'], { constants: { k: 2 }, measurand: { symbol: 'y' } }))).not.toBe(a);
    expect(compileModel(doc(['y = x * k'], ['x'], { constants: { k: 2 } }), { codegen: false })).not.toBe(a);
  });

  it('refuses a refused model every time (a refusal is never kept)', () => {
    const bad = doc(['y = x + nope'], ['x']);
    expect(() => compileModel(bad)).toThrow(EngineError);
    expect(() => compileModel(bad)).toThrow(/nope/);
  });
});
