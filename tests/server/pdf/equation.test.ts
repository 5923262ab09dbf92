/**
 * The annex's model equations as a metrologist writes them (server/pdf/equation.ts): identifiers
 * as the budget rows type them (shared/format/symbols.ts), operators and function names upright,
 * numbers through shared/format, line breaks only after an operator.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { formatNumber, subscriptUpright, symbolText } from '../../../shared/format';
import { LIBRARY_CONSTANT_NAMES } from '../../../shared/engine';
import { equationPlain, symbolPiece, typesetEquation, typesetModel, type EquationPiece, type SymbolPiece, type TypesetEquation } from '../../../server/pdf/equation';
import { demoCertificate } from '../../fixtures/certificates/demo-certificate';

const plain = (t: TypesetEquation | null) => (t ? equationPlain([...t.left, ...t.right]) : null);
const texts = (pieces: readonly EquationPiece[]): string[] => pieces.flatMap((p) => (p.kind === 'text' ? [p.text] : p.kind === 'sup' ? texts(p.pieces) : []));
const symbols = (pieces: readonly EquationPiece[]): SymbolPiece[] => pieces.flatMap((p) => (p.kind === 'symbol' ? [p] : p.kind === 'sup' ? symbols(p.pieces) : []));

describe('typesetEquation: identifiers (ISO 80000-1 §7.1, as the budget rows)', () => {
  it('types every identifier of the IR thermometer template as symbolText and subscriptUpright do', () => {
    const template = JSON.parse(readFileSync(new URL('../../../templates/ir-thermometer-blackbody.json', import.meta.url), 'utf8')) as { equations: string[] };
    const model = typesetModel(template.equations);
    model.forEach((eq, i) => {
      expect(eq, template.equations[i]).not.toBeNull();
      for (const s of symbols([...eq!.left, ...eq!.right])) {
        expect(s.upright).toBeFalsy();
        if (s.sub !== null) expect(s.subUpright).toBe(subscriptUpright(s.sub));
      }
    });
    expect(plain(model[1])).toBe('L_seen = ε_bb · planck(λ_eff, T_bb) + (1 − ε_bb) · planck(λ_eff, T_amb)');
    expect(plain(model[4])).toBe('E = T_ind + δT_res + δT_sse − T_exp');
  });

  it('reads the demo certificate’s printed model (U+2212, U+00B7) as its ASCII source', () => {
    const printed = demoCertificate.results[0].annex!.equations;
    const inputs = demoCertificate.results[0].annex!.gum.budget.map((r) => r.symbol);
    expect(typesetModel(printed, inputs).map(plain)).toEqual([
      'T_bb = T_ref + δT_unif + δT_stab − c_ε · deps − δT_amb − δT_sse',
      'E = T_ind + δT_res − T_bb',
    ]);
    expect(typesetModel(['T_bb = T_ref + dT_unif - c_eps * deps'])).toEqual(typesetModel(['T_bb = T_ref + dT_unif − c_eps · deps']));
    for (const symbol of inputs) {
      const { base, sub } = symbolText(symbol);
      expect(symbolPiece(symbol)).toEqual({ kind: 'symbol', base, sub, subUpright: sub === null || subscriptUpright(sub) });
    }
  });

  it('sets a one-letter subscript italic and a descriptive one upright', () => {
    const [x, s] = symbols(typesetEquation('y = x_i + S_c')!.right);
    expect(x).toMatchObject({ base: 'x', sub: 'i', subUpright: false });
    expect(s).toMatchObject({ base: 'S', sub: 'c', subUpright: false });
    expect(symbols(typesetEquation('y = T_ref')!.right)[0]).toMatchObject({ base: 'T', sub: 'ref', subUpright: true });
  });
});

describe('typesetEquation: operators, numbers and functions upright (ISO 80000-2:2019)', () => {
  it('writes the minus sign U+2212 and the multiplication dot U+00B7, a quotient with a solidus', () => {
    expect(plain(typesetEquation('y = -a + b - c * d / e'))).toBe('y = −a + b − c · d/e');
  });

  it('brackets a quotient that a product or another quotient follows (a/b · c would read two ways; common practice, no source)', () => {
    expect(plain(typesetEquation('y = a / b * c'))).toBe('y = (a/b) · c');
    expect(plain(typesetEquation('y = a / b / c'))).toBe('y = (a/b)/c');
    expect(plain(typesetEquation('y = a * b / c'))).toBe('y = a · b/c');
    expect(plain(typesetEquation('y = a / (b * c)'))).toBe('y = a/(b · c)');
  });

  it('raises an exponent without the brackets that grouped it in the text', () => {
    const t = typesetEquation('M = sigma_x * T^4 + x^(a + b) + 2^-2')!;
    expect(equationPlain(t.right)).toBe('σ_x · T^(4) + x^(a + b) + 2^(−2)');
    expect(t.right.filter((p) => p.kind === 'sup')).toHaveLength(3);
  });

  it('prints numbers through shared/format, on one line: × 10ⁿ outside 10⁻³ … 10⁶, digit groups from five digits', () => {
    const right = typesetEquation('y = 1.5e-4 * x + 12000.5 + 0.25')!.right;
    const all = texts(right).join('');
    expect(all).toContain(formatNumber(1.5e-4).replace(/ /g, '\u00A0'));
    expect(all).toContain('1.5\u00A0×\u00A010⁻⁴');
    expect(all).toContain('12\u202F000.5');
    expect(all).toContain('0.25');
  });

  it('writes ln and lg for the natural and decimal logarithms, arcsin…, √ and |…|; a library function as named', () => {
    expect(plain(typesetEquation('y = log(a) + log10(b) + asin(c) + acos(c) + atan(c) + exp(-c)'))).toBe(
      'y = ln(a) + lg(b) + arcsin(c) + arccos(c) + arctan(c) + exp(−c)',
    );
    expect(plain(typesetEquation('y = sqrt(x) + sqrt(a + b) + abs(z)'))).toBe('y = √x + √(a + b) + |z|');
    expect(plain(typesetEquation('T = planck_temperature(lambda_eff, L_obj)'))).toBe('T = planck_temperature(λ_eff, L_obj)');
  });

  it('writes each library constant with its conventional symbol, π upright, unless an input or an intermediate has its name', () => {
    const t = typesetEquation('y = pi * h * c0 / kB + c1L + c2 + c2_its90 + sigma')!;
    expect(equationPlain(t.right)).toBe('π · h · c_0/k_B + c_1L + c_2 + c_2,ITS-90 + σ');
    expect(symbols(t.right).find((s) => s.base === 'π')?.upright).toBe(true);
    expect(symbols(t.right).filter((s) => s.upright)).toHaveLength(1);
    const model = typesetModel(['kB = k0 * 2', 'y = pi * kB'], ['pi']);
    expect(model.map(plain)).toEqual(['kB = k_0 · 2', 'y = pi · kB']);
    // Every library constant of the model language, as the template editor typesets it (src/features/templates/components/symbol-tex.ts).
    const expected: Record<string, string> = { c1L: 'c_1L', c2: 'c_2', c2_its90: 'c_2,ITS-90', sigma: 'σ', h: 'h', c0: 'c_0', kB: 'k_B', pi: 'π' };
    expect(Object.keys(expected).sort()).toEqual([...LIBRARY_CONSTANT_NAMES].sort());
    for (const name of LIBRARY_CONSTANT_NAMES) expect(equationPlain(typesetEquation(`y = ${name}`)!.right), name).toBe(expected[name]);
  });
});

describe('typesetEquation: where a long equation may break', () => {
  it('allows a line break only after =, +, −, · (an ordinary space there, U+00A0 everywhere else)', () => {
    const t = typesetEquation('L = eps_bb * planck(lambda_eff, T_bb) + (1 - eps_bb) * planck(lambda_eff, T_amb) / 2')!;
    const all = [...texts(t.left), ...texts(t.right)].join('');
    for (const m of all.matchAll(/ /g)) expect('=+\u2212\u00B7').toContain(all[m.index - 1]);
    expect(all).not.toMatch(/ [=+\u2212\u00B7]/);
    expect(all).toContain(',\u00A0');
  });
});

describe('typesetEquation: text that is not "symbol = expression" in the model language', () => {
  it('gives null, and the certificate prints the text as written', () => {
    for (const text of ['a + b', 'f(x) = x^2', 'y = a > b ? 1 : 2', 'y = [1, 2]', 'y = "K"', 'y =', 'y = a.b', 'y[1] = 2']) {
      expect(typesetEquation(text), text).toBeNull();
    }
    expect(typesetModel(['y = a +', 'z = y'])).toEqual([null, expect.objectContaining({ right: [symbolPiece('y')] })]);
  });
});
