/**
 * Type A evaluation (JCGM 100:2008, GUM 4.2.1–4.2.3). The readings of DESIGN.md's example
 * (773.4, 773.5, 773.3): mean 773.4, s = 0.1, s/√3 = 0.057 735, ν = 2 (computed by hand).
 */
import { describe, expect, it } from 'vitest';
import { typeA } from '../../../../shared/engine/stats/type-a';
import { EngineError } from '../../../../shared/engine/errors';

describe('typeA', () => {
  it('gives the mean, s, s/√n and ν = n − 1', () => {
    const r = typeA([773.4, 773.5, 773.3]);
    expect(r.n).toBe(3);
    expect(r.mean).toBeCloseTo(773.4, 12);
    expect(r.s).toBeCloseTo(0.1, 10);
    expect(r.u).toBeCloseTo(0.1 / Math.sqrt(3), 10);
    expect(r.dof).toBe(2);
  });

  it('is accurate for readings with a large common offset (two-pass algorithm)', () => {
    const r = typeA([1e9 + 4, 1e9 + 7, 1e9 + 13, 1e9 + 16]);
    expect(r.s).toBeCloseTo(Math.sqrt(30), 9); // variance 30 (Welford's 1962 test data, computed by hand)
  });

  it('refuses fewer than two readings with TOO_FEW_READINGS', () => {
    expect(() => typeA([1])).toThrow(EngineError);
    expect(() => typeA([])).toThrow(/at least two readings/);
    try {
      typeA([1]);
    } catch (e) {
      expect((e as EngineError).code).toBe('TOO_FEW_READINGS');
    }
  });
});
