/**
 * Dimensional check of a model (DESIGN.md flow 1, template validation). Dimensions of the
 * radiometric quantities: spectral radiance W m⁻² sr⁻¹ m⁻¹, c2 in m K (SI Brochure 9th ed.;
 * ../shared/reference/README.md §1–2).
 */
import { describe, expect, it } from 'vitest';
import type { BudgetDocument } from '../../../../shared/schemas/budget.schema';
import { checkUnits, parseUnitDimension, formatDimension } from '../../../../shared/engine/model/units';

const doc = (equations: string[], inputs: Array<[string, string | undefined]>, measurandUnit?: string): BudgetDocument => ({
  equations,
  inputs: inputs.map(([symbol, unit]) => ({ symbol, unit, distribution: { type: 'normal', mean: 1, sd: 0.1 } })),
  ...(measurandUnit !== undefined ? { measurand: { symbol: equations[equations.length - 1].split('=')[0].trim(), unit: measurandUnit } } : {}),
}) as BudgetDocument;

describe('parseUnitDimension', () => {
  it('reads the documented syntax', () => {
    expect(formatDimension(parseUnitDimension('W m^-2 sr^-1 m^-1'))).toBe('kg m^-1 s^-3');
    expect(formatDimension(parseUnitDimension('W/(m^2 sr)'))).toBe('kg s^-3');
    expect(formatDimension(parseUnitDimension('K^-1'))).toBe('K^-1');
    expect(formatDimension(parseUnitDimension('µm'))).toBe('m');
    expect(formatDimension(parseUnitDimension('nm'))).toBe('m');
    expect(formatDimension(parseUnitDimension('°C'))).toBe('K');
    expect(formatDimension(parseUnitDimension('1'))).toBe('1');
    expect(formatDimension(parseUnitDimension('m K'))).toBe('m K');
  });
  it('refuses an unknown unit with a message naming it', () => {
    expect(() => parseUnitDimension('furlong')).toThrow(/unit "furlong" is not understood/);
    expect(() => parseUnitDimension('5 m')).toThrow(/must not contain a number/);
  });
});

describe('checkUnits', () => {
  it('derives K for an infrared-thermometer model with Planck radiance', () => {
    const r = checkUnits(doc(['L = eps * planck(lambda, T) + (1 - eps) * planck(lambda, Ta)', 'Tx = planck_temperature(lambda, L)', 'E = Ti - Tx'], [['eps', '1'], ['lambda', 'um'], ['T', 'K'], ['Ta', 'K'], ['Ti', 'K']], 'K'));
    expect(r.errors).toEqual([]);
    expect(r.dimension).toBe('K');
  });

  it('derives spectral radiance for planck and accepts a plain number added to a quantity (JCGM 101 9.3 model)', () => {
    expect(checkUnits(doc(['L = planck(lambda, T)'], [['lambda', 'nm'], ['T', 'K']], 'W m^-2 sr^-1 m^-1')).ok).toBe(true);
    const r = checkUnits(doc(['y = (m_R + dm)*(1 + (rho_a - 1.2)*(1/rho_W - 1/rho_R)) - 100000.0'], [['m_R', 'mg'], ['dm', 'mg'], ['rho_a', 'kg m^-3'], ['rho_W', 'kg m^-3'], ['rho_R', 'kg/m^3']], 'mg'));
    expect(r.errors).toEqual([]);
  });

  it('names the equation, the terms and their units when + mixes dimensions', () => {
    const r = checkUnits(doc(['y = T + lambda'], [['T', 'K'], ['lambda', 'm']]));
    expect(r.ok).toBe(false);
    expect(r.errors[0].equation).toBe(0);
    expect(r.errors[0].message).toMatch(/equation 1: "\+" in "T \+ λ" mixes different dimensions: "T \[K\]" is K but "λ \[m\]" is m/);
  });

  it('refuses a non-dimensionless argument of exp and of min/max mixtures', () => {
    expect(checkUnits(doc(['y = exp(T)'], [['T', 'K']])).errors[0].message).toMatch(/argument of exp, "T \[K\]", must be dimensionless but is K/);
    expect(checkUnits(doc(['y = max(T, lambda)'], [['T', 'K'], ['lambda', 'm']])).errors[0].message).toMatch(/max\(…\) mixes different dimensions/);
  });

  it('refuses a wrong radiometric argument', () => {
    expect(checkUnits(doc(['y = planck(T, lambda)'], [['T', 'K'], ['lambda', 'm']])).errors[0].message).toMatch(/planck: argument 1, "T \[K\]", must be m but is K/);
  });

  it('refuses a derived unit that differs from the measurand unit', () => {
    const r = checkUnits(doc(['y = a * b'], [['a', 'K'], ['b', 'm']], 'K'));
    expect(r.errors[0].message).toMatch(/gives the measurand y in m K, but its unit "K" is K/);
  });

  it('warns instead of failing where a unit is missing', () => {
    const r = checkUnits(doc(['y = a + b'], [['a', 'K'], ['b', undefined]]));
    expect(r.ok).toBe(true);
    expect(r.warnings.join(' ')).toMatch(/input b has no unit/);
  });

  it('names inputs, terms and the measurand by their typeset symbols (shared/format/symbols: dT_drift → δT_drift, lambda_eff → λ_eff)', () => {
    const noUnit = checkUnits(doc(['T_x = T_ind + dT_drift'], [['T_ind', 'K'], ['dT_drift', undefined]]));
    expect(noUnit.warnings).toContain('input δT_drift has no unit: terms involving it are not checked');
    const mixed = checkUnits(doc(['T_x = T_ind + lambda_eff'], [['T_ind', 'K'], ['lambda_eff', 'um']]));
    expect(mixed.errors[0].message).toBe('equation 1: "+" in "T_ind + λ_eff" mixes different dimensions: "T_ind [K]" is K but "λ_eff [um]" is m');
    const exponent = checkUnits(doc(['L_lambda = planck(lambda_eff, T_ind) * eps_bb'], [['lambda_eff', 'nm'], ['T_ind', 'K'], ['eps_bb', '1']], 'K'));
    expect(exponent.errors[0].message).toBe('the model gives the measurand L_λ in kg m^-1 s^-3, but its unit "K" is K');
    expect(checkUnits(doc(['y = eps_bb'], [['eps_bb', 'furlong']])).errors[0].message).toMatch(/^input ε_bb: unit "furlong" is not understood/);
  });

  it('uses constantUnits for constants', () => {
    const d = { ...doc(['y = lambda0 * T'], [['T', 'K']], 'm K'), constants: { lambda0: 1e-5 }, constantUnits: { lambda0: 'm' } } as BudgetDocument;
    expect(checkUnits(d).errors).toEqual([]);
  });
});
