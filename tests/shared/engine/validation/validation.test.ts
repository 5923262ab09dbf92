import { describe, expect, it } from 'vitest';
import { numericalTolerance, validateGumAgainstMcm } from '../../../../shared/engine/validation';

describe('numericalTolerance (JCGM 101 §7.9.2)', () => {
  it('u = 0.002 8, n_dig = 2 → δ = 0.000 05 (the §7.9.2 example, recalled from JCGM 101:2008, recomputed independently)', () => {
    expect(numericalTolerance(0.0028, 2)).toBeCloseTo(5e-5, 15);
  });
  it('handles decade boundaries and one or two digits', () => {
    expect(numericalTolerance(1, 2)).toBeCloseTo(0.05, 15); // 1.0 = 10 × 10^−1
    expect(numericalTolerance(1000, 2)).toBeCloseTo(50, 12); // 1.0e3 = 10 × 10^2 → δ = ½ × 10^2
    expect(numericalTolerance(0.001, 1)).toBeCloseTo(0.0005, 15);
    expect(numericalTolerance(9.96, 2)).toBeCloseTo(0.5, 15); // rounds to 10 → 1.0 × 10^1
    expect(numericalTolerance(2, 2)).toBeCloseTo(0.05, 15);
    expect(numericalTolerance(10.1, 2)).toBeCloseTo(0.5, 15); // JCGM 101 §9.2.4: u = 10 → δ = 0.5
    expect(numericalTolerance(0, 2)).toBe(0);
    expect(numericalTolerance(-1, 2)).toBeNaN();
    expect(numericalTolerance(Infinity, 2)).toBeNaN();
  });
});

describe('validateGumAgainstMcm (JCGM 101 §8)', () => {
  // JCGM 101:2008 §9.2.3 (additive model, rectangular inputs): GUM y = 0, u = 2.0, ±3.92;
  // MCM [−3.88, 3.88]; n_dig = 2 → δ = 0.05; d = 0.04 → validated.
  // (Values recalled from JCGM 101:2008 §9.2.3 Table 3, recomputed independently: Irwin–Hall 97.5 % point 3.8794.)
  it('§9.2.3: validated (d_low = d_high = 0.04 ≤ δ = 0.05)', () => {
    const v = validateGumAgainstMcm({ y: 0, u: 2, interval: [-3.92, 3.92] }, { interval: [-3.88, 3.88] }, 2);
    expect(v.delta).toBeCloseTo(0.05, 15);
    expect(v.dLow).toBeCloseTo(0.04, 12);
    expect(v.dHigh).toBeCloseTo(0.04, 12);
    expect(v.passed).toBe(true);
  });
  // §9.2.4 (dominant rectangular input): GUM ±19.9 vs MCM ±17.0, u = 10.1 → δ = 0.5 → not validated.
  // (Recalled from JCGM 101:2008 §9.2.4 Table 4, recomputed independently: exact 97.5 % point 17.016.)
  it('§9.2.4: not validated (d = 2.9 > δ = 0.5)', () => {
    const v = validateGumAgainstMcm({ y: 0, u: 10.1, interval: [-19.9, 19.9] }, { interval: [-17.0, 17.0] }, 2);
    expect(v.delta).toBeCloseTo(0.5, 15);
    expect(v.dLow).toBeCloseTo(2.9, 12);
    expect(v.passed).toBe(false);
  });
  it('uses each end separately: an asymmetric miss fails on one side only', () => {
    const v = validateGumAgainstMcm({ y: 1.234, u: 0.0539, interval: [1.1285, 1.3395] }, { interval: [1.0834, 1.3825] }, 2);
    // JCGM 101 §9.3 mass calibration (recalled from JCGM 101:2008 §9.3, recomputed independently): not validated.
    expect(v.delta).toBeCloseTo(0.0005, 15);
    expect(v.dLow).toBeCloseTo(0.0451, 10);
    expect(v.dHigh).toBeCloseTo(0.043, 10);
    expect(v.passed).toBe(false);
    expect(validateGumAgainstMcm({ y: 0, u: 1, interval: [-2, 2] }, { interval: [-2.01, 2.2] }, 2)).toMatchObject({ passed: false });
    expect(validateGumAgainstMcm({ y: 0, u: 1, interval: [-2, 2] }, { interval: [-2.01, 2.02] }, 2)).toMatchObject({ passed: true });
  });
  it('never throws on non-finite input: not passed', () => {
    expect(validateGumAgainstMcm({ y: 0, u: NaN, interval: [-1, 1] }, { interval: [-1, 1] }, 2).passed).toBe(false);
    expect(validateGumAgainstMcm({ y: 0, u: 1, interval: [-1, 1] }, { interval: [NaN, 1] }, 2).passed).toBe(false);
  });
});
