// How a model identifier reads as a quantity symbol, the one reading shared by the screens, the
// server's check reasons and the certificate PDF: italic base with Greek where the name spells a
// letter, the part after "_" and trailing digits as the subscript, a descriptive subscript upright
// and a one-letter one italic (ISO 80000-1 §7.1), a leading d before a capital as δ (a correction,
// dT_res → δT_res).
import { describe, expect, it } from 'vitest';
import { subscriptUpright, symbolPlain, symbolText } from '../../../shared/format';

describe('symbolText', () => {
  it('splits base and subscript, Greek where the identifier spells a letter', () => {
    expect(symbolText('T_ref')).toEqual({ base: 'T', sub: 'ref' });
    expect(symbolText('eps_bb')).toEqual({ base: 'ε', sub: 'bb' });
    expect(symbolText('lambda_eff')).toEqual({ base: 'λ', sub: 'eff' });
    expect(symbolText('T_lambda')).toEqual({ base: 'T', sub: 'λ' });
    expect(symbolText('E')).toEqual({ base: 'E', sub: null });
  });

  it('reads trailing digits as a subscript, before any named one', () => {
    expect(symbolText('x1')).toEqual({ base: 'x', sub: '1' });
    expect(symbolText('c2_its')).toEqual({ base: 'c', sub: '2,its' });
  });

  it('reads a leading d as δ only before a capital: dT_res is a correction, deps and dose are names', () => {
    expect(symbolText('dT_res')).toEqual({ base: 'δT', sub: 'res' });
    expect(symbolText('deps')).toEqual({ base: 'deps', sub: null });
    expect(symbolText('dose')).toEqual({ base: 'dose', sub: null });
  });

  it('writes the quantity mu with the Greek letter U+03BC, not the micro sign U+00B5 of the unit prefix (SI Brochure §3)', () => {
    expect(symbolText('mu').base).toBe('\u03BC');
    expect(symbolText('mu_a')).toEqual({ base: '\u03BC', sub: 'a' });
    expect(symbolPlain('T_mu')).toBe('T_\u03BC');
  });
});

describe('subscriptUpright and symbolPlain', () => {
  it('sets descriptive subscripts and numbers upright, a one-letter index italic', () => {
    expect(subscriptUpright('ref')).toBe(true);
    expect(subscriptUpright('1')).toBe(true);
    expect(subscriptUpright('i')).toBe(false);
  });

  it('gives one line of plain text where no markup is possible', () => {
    expect(symbolPlain('eps_bb')).toBe('ε_bb');
    expect(symbolPlain('dT_res')).toBe('δT_res');
    expect(symbolPlain('E')).toBe('E');
  });
});
