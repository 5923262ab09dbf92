/**
 * evaluate / evaluateGum end to end: schema validation, GUM, Monte Carlo, validation, reported
 * strings. Monte Carlo numbers of the reference cases at 10^6 trials against
 * ../shared/reference/uncertainty-cases.json (values recalled from memory, recomputed
 * independently) within the tolerances of that folder's README §6: y within 3u/√M, u within
 * 0.5 %, probabilistically symmetric interval ends within 0.3 % of the half-width, shortest
 * interval ends within 1 % (JCGM 101 9.3: ±0.003 mg on the ends, ±0.0005 mg on u).
 */
import { describe, expect, it } from 'vitest';
import { EngineError, evaluate, evaluateGum, ENGINE_VERSION, roundUncertainty } from '../../../shared/engine';
import { referenceCase, toBudget } from './reference-cases';

const M = 1_000_000;

describe('evaluate: Monte Carlo on the reference cases (10^6 trials)', () => {
  const symmetric: Array<[string, number, number]> = [
    // id, exact u, exact half-width of the 95 % interval (computed notes of the case file)
    ['JCGM101-9.2.2-additive-normal', 2.0, 3.919928],
    ['JCGM101-9.2.3-additive-rectangular', 2.0, 3.8794],
    ['JCGM101-9.2.4-additive-rectangular-dominant', 10.1489, 17.016],
  ];
  for (const [id, u, half] of symmetric) {
    it(`${id}: u and the probabilistically symmetric interval (recalled from JCGM 101 §9.2, recomputed independently)`, () => {
      const r = evaluate(toBudget(referenceCase(id), { monteCarlo: { trials: M, seed: 11, interval: 'symmetric' } }));
      const mcm = r.mcm!;
      expect(mcm.trials).toBe(M);
      expect(mcm.intervalKind).toBe('symmetric');
      expect(Math.abs(mcm.y)).toBeLessThanOrEqual((3 * u) / Math.sqrt(M));
      expect(Math.abs(mcm.u / u - 1)).toBeLessThanOrEqual(0.005);
      expect(Math.abs(mcm.interval[0] + half)).toBeLessThanOrEqual(0.003 * half);
      expect(Math.abs(mcm.interval[1] - half)).toBeLessThanOrEqual(0.003 * half);
      expect(r.validation).not.toBeNull();
    }, 60_000);
  }

  it('JCGM101-9.2.4: GUM fails validation against Monte Carlo (GUM ±19.9 vs MCM ±17.0, recalled from JCGM 101 9.2.4)', () => {
    const r = evaluate(toBudget(referenceCase('JCGM101-9.2.4-additive-rectangular-dominant'), { monteCarlo: { trials: M, seed: 3, interval: 'symmetric' } }));
    expect(r.validation!.passed).toBe(false);
    expect(r.warnings.join(' ')).toMatch(/does not agree with the Monte Carlo/);
  }, 60_000);

  it('JCGM101-9.3 mass calibration: MCM u = 0.0754 mg, shortest interval [1.0842, 1.3834] mg (recalled from JCGM 101 9.3, recomputed independently)', () => {
    const r = evaluate(toBudget(referenceCase('JCGM101-9.3-mass-calibration'), { monteCarlo: { trials: M, seed: 5, interval: 'shortest' } }));
    const mcm = r.mcm!;
    expect(Math.abs(mcm.y - 1.234)).toBeLessThanOrEqual((3 * 0.07548) / Math.sqrt(M));
    expect(Math.abs(mcm.u - 0.07548)).toBeLessThanOrEqual(0.0005);
    expect(Math.abs(mcm.interval[0] - 1.0842)).toBeLessThanOrEqual(0.003);
    expect(Math.abs(mcm.interval[1] - 1.3834)).toBeLessThanOrEqual(0.003);
    expect(r.gum.u.toFixed(4)).toBe('0.0539');
    expect(r.validation!.passed).toBe(false);
  }, 60_000);
});

describe('evaluate: contract', () => {
  const small = { equations: ['y = a + b'], inputs: [{ symbol: 'a', distribution: { type: 'normal', mean: 1, sd: 0.1 } }, { symbol: 'b', distribution: { type: 'rectangular', min: -0.1, max: 0.1 } }] };

  it('reports the seed used and gives the same result for the same seed', () => {
    const r1 = evaluate(small, { trials: 10_000, seed: 42 });
    const r2 = evaluate(small, { trials: 10_000, seed: 42 });
    expect(r1.mcm!.seed).toBe(42);
    expect(r1.mcm).toEqual(r2.mcm);
    expect(r1.engineVersion).toBe(ENGINE_VERSION);
  });

  it('takes the seed from the document, else from the caller’s seed source, else refuses', () => {
    expect(evaluate({ ...small, monteCarlo: { seed: 9, trials: 10_000 } }).mcm!.seed).toBe(9);
    expect(evaluate(small, { trials: 10_000, seedSource: () => 123 }).mcm!.seed).toBe(123);
    expect(() => evaluate(small, { trials: 10_000 })).toThrow(/a Monte Carlo seed is needed/);
  });

  it('mcm: false gives null mcm and validation', () => {
    const r = evaluate(small, { mcm: false });
    expect(r.mcm).toBeNull();
    expect(r.validation).toBeNull();
    expect(r.reported).toEqual({ value: '1.00', U: '0.23', unit: '', k: '2.00' });
  });

  it('refuses an invalid document with INVALID_DOCUMENT listing every issue with its path', () => {
    try {
      evaluate({ equations: [], inputs: [{ symbol: 'a', distribution: { type: 'normal', mean: 1, sd: -1 } }, { symbol: 'b', distribution: { type: 'rectangular', min: 2, max: 1 } }] });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(EngineError);
      const err = e as EngineError;
      expect(err.code).toBe('INVALID_DOCUMENT');
      expect(err.issues!.map((i) => i.path.join('.'))).toEqual(expect.arrayContaining(['equations', 'inputs.0.distribution.sd', 'inputs.1.distribution.max']));
      expect(err.message).toMatch(/inputs\.0\.distribution\.sd: sd must not be negative/);
      expect(err.message).toMatch(/inputs\.1\.distribution\.max: min must be less than max/);
    }
    expect(() => evaluate('not a document')).toThrow(EngineError);
    expect(() => evaluate({ ...small, inputs: [{ symbol: 'a', dof: 0, distribution: { type: 'normal', mean: 1, sd: 1 } }] })).toThrow(/dof must be greater than zero/);
  });

  it('names what is wrong with a distribution: an unknown type, a missing parameter, two parameter sets mixed', () => {
    const issuesOf = (distribution: unknown) => {
      try {
        evaluateGum({ equations: ['y = a'], inputs: [{ symbol: 'a', distribution }] });
      } catch (e) {
        return (e as EngineError).issues!.map((i) => `${i.path.join('.')}: ${i.message}`);
      }
      return [];
    };
    expect(issuesOf({ type: 'lognormal', mean: 1 })).toEqual([expect.stringMatching(/^inputs\.0\.distribution\.type: distribution type must be one of: normal, rectangular, .*constant$/)]);
    expect(issuesOf(3)).toEqual(['inputs.0.distribution: distribution must be an object with a type and its parameters']);
    expect(issuesOf({ type: 'normal', mean: 1 })).toEqual(['inputs.0.distribution: normal needs sd, or expanded and k']);
    expect(issuesOf({ type: 'normal', mean: 1, expanded: 0.2 })).toEqual(['inputs.0.distribution.k: normal given by expanded and k also needs k']);
    expect(issuesOf({ type: 'normal', mean: 1, sd: 0.1, k: 2 })).toEqual(['inputs.0.distribution.k: normal takes either sd, or expanded and k, not both']);
    expect(issuesOf({ type: 'rectangular', min: 0 })).toEqual(['inputs.0.distribution.max: rectangular given by min and max also needs max']);
    expect(issuesOf({ type: 'rectangular', min: 0, halfWidth: 1 })).toEqual(['inputs.0.distribution.halfWidth: rectangular takes either min and max, or mean and halfWidth, not both']);
    expect(issuesOf({ type: 'rectangular', mean: 0, halfWidth: 1 })).toEqual([]);
  });

  it('u_c = 0 (JCGM 101 §9.4 with x₁ = 0): U = 0, validation null with a warning', () => {
    const r = evaluate({ equations: ['y = x^2'], inputs: [{ symbol: 'x', distribution: { type: 'normal', mean: 0, sd: 1 } }] }, { trials: 10_000, seed: 1 });
    expect(r.gum.U).toBe(0);
    expect(r.validation).toBeNull();
    expect(r.warnings.join(' ')).toMatch(/validation is not given because the GUM standard uncertainty is zero/);
  });

  it('flags an overflow at the estimates (exp(1e6)) as NON_FINITE', () => {
    expect(() => evaluateGum({ equations: ['y = exp(x)'], inputs: [{ symbol: 'x', distribution: { type: 'normal', mean: 1e6, sd: 1 } }] })).toThrow(/evaluates to Infinity/);
  });

  it('evaluateGum: EA-4/02 S2 is reported "10000.025" g ± "0.059" g with k = "2.00" (recalled from EA-4/02 S2, recomputed independently)', () => {
    const r = evaluateGum(toBudget(referenceCase('EA-4/02-S2-weight-10kg')));
    expect(r.reported).toEqual({ value: '10000.025', U: '0.059', unit: 'g', k: '2.00' });
    expect(r.mcm).toBeNull();
  });

  it('evaluateGum: GUM H.1 at 99 %: ν_eff 16, k = 2.92, U99 ≈ 93 nm (recalled from GUM H.1.6, recomputed independently)', () => {
    const r = evaluateGum(toBudget(referenceCase('GUM-H.1-end-gauge')));
    expect(Math.trunc(r.gum.nuEff as number)).toBe(16);
    expect(r.reported.k).toBe('2.92');
    expect(Math.abs(r.gum.U - 93)).toBeLessThan(0.6);
    // The GUM multiplies its rounded u_c = 32 nm by 2.92: 93.4 nm → 93 nm. From the unrounded
    // u_c = 31.67 nm the engine gets U = 92.50 nm, which two significant digits make 92 nm.
    expect(roundUncertainty(Number(r.reported.k) * Math.round(r.gum.u)).text).toBe('93');
    expect(['92', '93']).toContain(r.reported.U);
    expect(r.reported.value).toBe('50000838');
  });

  it('evaluateGum: a Type A input from readings gives mean, s/√n and ν = n − 1 in the budget', () => {
    const r = evaluateGum({ equations: ['y = T'], inputs: [{ symbol: 'T', distribution: { type: 'readings', values: [773.4, 773.5, 773.3] } }] });
    expect(r.gum.budget[0]).toMatchObject({ estimate: expect.closeTo(773.4, 10), u: expect.closeTo(0.1 / Math.sqrt(3), 10), dof: 2 });
    expect(r.gum.nuEff).toBeCloseTo(2, 9);
  });
});
