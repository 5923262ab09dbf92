/**
 * GUM law of propagation against the worked examples of ../shared/reference/uncertainty-cases.json
 * (each value recalled from memory, recomputed independently, as that folder's README says).
 * Tolerances (README §6): LPU to the printed digits; ν_eff ±0.2 before truncation.
 */
import { describe, expect, it } from 'vitest';
import { summarizeInput } from '../../../../shared/engine/distributions';
import { propagate, welchSatterthwaite } from '../../../../shared/engine/gum/propagate';
import { compileModel } from '../../../../shared/engine/model';
import type { BudgetDocument } from '../../../../shared/schemas/budget.schema';
import { referenceCase, toBudget } from '../reference-cases';

function gumOf(doc: BudgetDocument) {
  const model = compileModel(doc);
  return propagate(doc, model, doc.inputs.map(summarizeInput), { coverage: doc.coverage ?? 0.9545 });
}

describe('GUM on the reference cases', () => {
  it('JCGM 101 9.2.2 (additive, normal): y = 0, u = 2.0, k = 1.96, U = 3.9 (recalled from memory, recomputed independently)', () => {
    const { gum } = gumOf(toBudget(referenceCase('JCGM101-9.2.2-additive-normal')));
    expect(gum.y).toBe(0);
    expect(gum.u).toBeCloseTo(2.0, 12);
    expect(gum.nuEff).toBe('infinite');
    expect(gum.k).toBeCloseTo(1.96, 2);
    expect(gum.U).toBeCloseTo(3.92, 2);
    expect(gum.interval[1]).toBeCloseTo(3.9, 1);
  });

  it('JCGM 101 9.2.3 (additive, rectangular): u = 2.00, interval ±3.92 (recalled from memory, recomputed independently)', () => {
    const { gum } = gumOf(toBudget(referenceCase('JCGM101-9.2.3-additive-rectangular')));
    expect(gum.u).toBeCloseTo(2.0, 10);
    expect(gum.interval[0]).toBeCloseTo(-3.92, 2);
    expect(gum.interval[1]).toBeCloseTo(3.92, 2);
  });

  it('JCGM 101 9.2.4 (one dominant rectangular): u = 10.1, U = 19.9 (recalled from memory, recomputed independently)', () => {
    const { gum } = gumOf(toBudget(referenceCase('JCGM101-9.2.4-additive-rectangular-dominant')));
    expect(gum.u).toBeCloseTo(10.1489, 3);
    expect(gum.u.toFixed(1)).toBe('10.1');
    expect(gum.U.toFixed(1)).toBe('19.9');
  });

  it('JCGM 101 9.3 (mass calibration): first-order u = 0.0539 mg with zero density sensitivities, second-order u ≈ 0.075 mg (recalled from memory, recomputed independently)', () => {
    const { gum, warnings } = gumOf(toBudget(referenceCase('JCGM101-9.3-mass-calibration')));
    expect(gum.y).toBeCloseTo(1.234, 9);
    expect(gum.u.toFixed(4)).toBe('0.0539');
    gum.budget.forEach((r, i) => expect(Math.abs(r.c - [1, 1, 0, 0, 0][i])).toBeLessThan(1e-9));
    expect(gum.interval[0].toFixed(4)).toBe('1.1285');
    expect(gum.interval[1].toFixed(4)).toBe('1.3395');
    expect(gum.uSecondOrder).toBeDefined();
    expect(Math.abs((gum.uSecondOrder as number) - 0.07496)).toBeLessThan(0.0005);
    expect(gum.uSecondOrder!.toFixed(3)).toBe('0.075');
    expect(warnings.join(' ')).toMatch(/Second-order terms change the standard uncertainty/);
  });

  it('GUM H.1 (end gauge): y = 50 000 838 nm, u ≈ 32 nm, ν_eff 16 (±0.2 before truncation), k99 = 2.92, U99 ≈ 93 nm, second order ≈ 34 nm (recalled from memory, recomputed independently)', () => {
    const c = referenceCase('GUM-H.1-end-gauge');
    const { gum } = gumOf(toBudget(c));
    expect(gum.y).toBeCloseTo(50000838, 6);
    expect(Math.round(gum.u)).toBe(32);
    expect(Math.abs((gum.nuEff as number) - 16.66)).toBeLessThanOrEqual(0.2); // with the rounded table values (computed note)
    expect(Math.trunc(gum.nuEff as number)).toBe(16);
    expect(gum.k.toFixed(2)).toBe('2.92');
    expect(Math.abs(gum.U - 93)).toBeLessThan(0.6);
    const byName = Object.fromEntries(gum.budget.map((r) => [r.symbol, r]));
    expect(byName.ls.c).toBeCloseTo(1, 9);
    expect(byName.d.c).toBe(1);
    expect(byName.alpha_s.c).toBe(0);
    expect(byName.theta.c).toBe(0);
    expect(byName.dalpha.c).toBeCloseTo(5.0000623e6, 0);
    expect(byName.dtheta.c).toBeCloseTo(-575.007, 2);
    expect(byName.dalpha.contribution.toFixed(1)).toBe('2.9');
    expect(byName.dtheta.contribution.toFixed(1)).toBe('16.6'); // 575 × 0.05/√3
    expect(Math.round(gum.uSecondOrder as number)).toBe(34);
    expect(byName.d.cMethod).toBe('symbolic');
  });

  it('EA-4/02 S2 (10 kg weight): y = 10 000.025 g, u = 29.3 mg, k = 2, U = 59 mg (recalled from memory, recomputed independently)', () => {
    const { gum } = gumOf(toBudget(referenceCase('EA-4/02-S2-weight-10kg')));
    expect(gum.y).toBeCloseTo(10000.025, 9);
    expect(Math.abs(gum.u - 0.0293)).toBeLessThanOrEqual(0.00005);
    expect(gum.k.toFixed(3)).toBe('2.000');
    expect(gum.U.toFixed(4)).toBe('0.0585');
    expect(gum.budget.map((r) => +(r.contribution * 1000).toFixed(2))).toEqual([22.5, 8.66, 14.43, 5.77, 5.77]);
    const shares = gum.budget.reduce((s, r) => s + r.share, 0);
    expect(shares).toBeCloseTo(1, 12);
  });
});

describe('GUM with correlations and special cases', () => {
  const base = (r: number): BudgetDocument => ({
    equations: ['y = a + b'],
    inputs: [
      { symbol: 'a', distribution: { type: 'normal', mean: 1, sd: 3 }, dof: 10 },
      { symbol: 'b', distribution: { type: 'normal', mean: 2, sd: 4 } },
    ],
    correlations: [{ between: ['a', 'b'], r }],
  }) as BudgetDocument;

  it('uses the full covariance (GUM 5.2.2): u² = 9 + 16 + 2·0.5·3·4 = 37; ν_eff null with a warning; k normal', () => {
    const { gum, warnings } = gumOf(base(0.5));
    expect(gum.u).toBeCloseTo(Math.sqrt(37), 12);
    expect(gum.nuEff).toBeNull();
    expect(gum.k.toFixed(3)).toBe('2.000');
    expect(gum.uSecondOrder).toBeUndefined();
    expect(warnings.join(' ')).toMatch(/Welch–Satterthwaite formula does not apply/);
  });

  it('r = 0 listed changes nothing: ν_eff by Welch–Satterthwaite (GUM G.2b): 25²/(3⁴/10) = 77.16', () => {
    const { gum } = gumOf(base(0));
    expect(gum.nuEff as number).toBeCloseTo(625 / 8.1, 9);
  });

  it('u_c = 0 (all sensitivities vanish): U = 0, k for ν = ∞, and a warning', () => {
    const doc = { equations: ['y = x^2'], inputs: [{ symbol: 'x', distribution: { type: 'normal', mean: 0, sd: 1 } }] } as BudgetDocument;
    const { gum, warnings, zeroUncertainty } = gumOf(doc);
    expect(zeroUncertainty).toBe(true);
    expect(gum.U).toBe(0);
    expect(gum.nuEff).toBe('infinite');
    expect(gum.k.toFixed(3)).toBe('2.000');
    expect(gum.budget[0].share).toBe(0);
    expect(warnings.join(' ')).toMatch(/first-order law of propagation is not applicable/);
    // GUM 5.1.2 note: u² = ½ (∂²f/∂x²)² u⁴ = ½·4 = 2 (JCGM 101 §9.4.2 gives √2 for this model).
    expect(gum.uSecondOrder as number).toBeCloseTo(Math.SQRT2, 5);
  });

  it('refuses a correlation matrix that is not positive definite, with a message', () => {
    const doc = {
      equations: ['y = a + b + c'],
      inputs: ['a', 'b', 'c'].map((symbol) => ({ symbol, distribution: { type: 'normal', mean: 0, sd: 1 } })),
      correlations: [{ between: ['a', 'b'], r: 0.9 }, { between: ['b', 'c'], r: 0.9 }, { between: ['a', 'c'], r: -0.9 }],
    } as BudgetDocument;
    expect(() => gumOf(doc)).toThrow(/positive definite/);
  });

  it('welchSatterthwaite is "infinite" when every contribution has ν = ∞', () => {
    expect(welchSatterthwaite([1, 2], [Infinity, Infinity], Math.sqrt(5))).toBe('infinite');
  });
});
